/**
 * Helpers of the app's forms: number fields read as text until submit, zod issues and server
 * field messages turned into `{ field: message }` with dotted names ("location.lat").
 */
import type { z } from "zod";
import { ApiError } from "@/lib/api-client";

const decimal = /^[-+]?(\d+(\.\d*)?|\.\d+)$/;

/** Field text → number; undefined when empty; the text itself when it is not a number (the schema then names the field). */
export function readNumber(raw: string): number | string | undefined {
  const text = raw.trim().replace(/\s/g, "");
  if (text === "") return undefined;
  const normalised = /^[^,]*,[^,]*$/.test(text) && !text.includes(".") ? text.replace(",", ".") : text;
  return decimal.test(normalised) ? Number(normalised) : raw;
}

export type FieldErrors = Record<string, string>;

export function zodFieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const name = issue.path.map(String).join(".") || "form";
    fields[name] ??= issue.message;
  }
  return fields;
}

/** The server's per-field messages, plus its message under "form" when none of them names a field we show. */
export function serverFieldErrors(error: unknown, shown: readonly string[]): FieldErrors {
  if (!(error instanceof ApiError)) return { form: "Something went wrong. Please try again." };
  const fields: FieldErrors = {};
  for (const [name, message] of Object.entries(error.fields)) if (shown.includes(name)) fields[name] = message;
  // A refusal other than bad input (a resting digester, 409) says what to do instead: keep its message too.
  if (Object.keys(fields).length === 0 || error.status !== 400) fields.form = error.message;
  return fields;
}

/** Moves focus to the first invalid control after React has drawn the errors. */
export function focusFirstInvalid(form: HTMLFormElement | null) {
  requestAnimationFrame(() => {
    const invalid = form?.querySelector<HTMLElement>('[aria-invalid="true"]');
    // A radio group marks its fieldset; focus goes to the control inside it.
    const control = invalid?.matches("input, select, textarea, button")
      ? invalid
      : invalid?.querySelector<HTMLElement>("input, select, textarea, button");
    control?.focus();
  });
}
