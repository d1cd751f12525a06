import { useEffect, useId, useRef, useState, type FormEvent, type ReactNode } from "react";
import type { UseMutationResult } from "@tanstack/react-query";
import type { z } from "zod";
import { Alert, Button, Field, Input } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { readNumbers } from "../utils/numbers";

export type NumberFieldSpec = {
  /** The request field, e.g. "drumDiameterM". */
  name: string;
  /** Label with its unit, e.g. "Drum diameter (m)". */
  label: string;
  hint?: ReactNode;
  required?: boolean;
  defaultValue?: string;
};

export type CalculatorFormProps<Req, Res> = {
  /** Accessible name of the form. */
  label: string;
  fields: NumberFieldSpec[];
  /** The shared request schema: the form checks with the same contract as the server. */
  schema: z.ZodType<Req>;
  mutation: UseMutationResult<Res, Error, Req>;
  submitLabel: string;
  /** Adjusts the body before checking, e.g. an empty temperature sent as null. */
  prepare?: (body: Record<string, number | string>) => Record<string, unknown>;
  /** The result and its one-sentence explanation, given the request it answers. */
  renderResult: (result: Res, request: Req) => ReactNode;
  className?: string;
};

type Errors = { fields: Record<string, string>; form: string | null };

const noErrors: Errors = { fields: {}, form: null };

/** Splits messages into those of this form's fields and the rest (shown above the button). */
function splitMessages(messages: Record<string, string>, names: string[]): Errors {
  const fields: Record<string, string> = {};
  const rest: string[] = [];
  for (const [name, message] of Object.entries(messages)) {
    if (names.includes(name)) fields[name] = message;
    else rest.push(message);
  }
  return { fields, form: rest.length > 0 ? rest.join(" ") : null };
}

function zodMessages(error: z.ZodError): Record<string, string> {
  const messages: Record<string, string> = {};
  for (const issue of error.issues) {
    const name = issue.path.length > 0 ? String(issue.path[0]) : "body";
    messages[name] ??= issue.message;
  }
  return messages;
}

/**
 * A calculator: number fields (decimal keyboard, units in the labels), checked with the shared
 * schema before sending and again by the server, whose per-field messages land under the same
 * fields. After a failed attempt the first field in error takes the focus; the result is
 * announced politely.
 */
export function CalculatorForm<Req, Res>({
  label,
  fields,
  schema,
  mutation,
  submitLabel,
  prepare,
  renderResult,
  className,
}: CalculatorFormProps<Req, Res>) {
  const baseId = useId();
  const names = fields.map((field) => field.name);
  const [values, setValues] = useState<Record<string, string>>(() =>
    Object.fromEntries(fields.map((field) => [field.name, field.defaultValue ?? ""])),
  );
  const [errors, setErrors] = useState<Errors>(noErrors);
  const [focusRequest, setFocusRequest] = useState(0);
  const formErrorRef = useRef<HTMLDivElement>(null);
  const controlId = (name: string) => `${baseId}-${name}`;

  useEffect(() => {
    if (focusRequest === 0) return;
    const first = names.find((name) => errors.fields[name]);
    if (first) document.getElementById(controlId(first))?.focus();
    else formErrorRef.current?.focus();
    // Only a new failed attempt moves the focus, not every render.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [focusRequest]);

  const fail = (next: Errors) => {
    setErrors(next);
    setFocusRequest((count) => count + 1);
  };

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const numbers = readNumbers(values);
    const parsed = schema.safeParse(prepare ? prepare(numbers) : numbers);
    if (!parsed.success) {
      mutation.reset();
      fail(splitMessages(zodMessages(parsed.error), names));
      return;
    }
    setErrors(noErrors);
    mutation.mutate(parsed.data, {
      onError: (error) => {
        if (error instanceof ApiError && Object.keys(error.fields).length > 0) {
          fail(splitMessages(error.fields, names));
        } else {
          fail({ fields: {}, form: error.message });
        }
      },
    });
  };

  const result =
    mutation.isSuccess && mutation.variables !== undefined ? renderResult(mutation.data, mutation.variables) : null;

  return (
    <div className={cn("flex flex-col gap-4", className)}>
      <form noValidate aria-label={label} onSubmit={onSubmit} className="flex flex-col gap-4">
        <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
          {fields.map((field) => (
            <Field
              key={field.name}
              id={controlId(field.name)}
              label={field.label}
              hint={field.hint}
              required={field.required}
              error={errors.fields[field.name]}
            >
              <Input
                name={field.name}
                inputMode="decimal"
                autoComplete="off"
                spellCheck={false}
                value={values[field.name] ?? ""}
                onChange={(event) => {
                  const value = event.target.value;
                  setValues((current) => ({ ...current, [field.name]: value }));
                  if (errors.fields[field.name]) {
                    setErrors((current) => {
                      const { [field.name]: _cleared, ...rest } = current.fields;
                      return { ...current, fields: rest };
                    });
                  }
                }}
              />
            </Field>
          ))}
        </div>
        {errors.form ? (
          <div ref={formErrorRef} tabIndex={-1} className="focus:outline-none">
            <Alert variant="danger" title="This could not be calculated" announce="assertive">
              <p>{errors.form}</p>
            </Alert>
          </div>
        ) : null}
        <div>
          <Button type="submit" loading={mutation.isPending}>
            {submitLabel}
          </Button>
        </div>
      </form>
      {/* Present before any result, so screen readers announce the result when it arrives. */}
      <div aria-live="polite">{result}</div>
    </div>
  );
}
