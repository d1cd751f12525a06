import type { z } from "zod";
import { ApiError } from "@/lib/api-client";

/** zod issues as `{ field: message }` (first message per field; form-level issues under "form"). */
export function issuesToFields(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const name = issue.path.map(String).join(".") || "form";
    fields[name] ??= issue.message;
  }
  return fields;
}

/**
 * Splits a failed request into messages for the form's own fields and one for the form as a
 * whole (null when every message found its field).
 */
export function serverErrors(
  error: unknown,
  known: readonly string[],
): { fields: Record<string, string>; form: string | null } {
  if (!(error instanceof ApiError)) return { fields: {}, form: "Something went wrong. Please try again." };
  const fields: Record<string, string> = {};
  for (const [name, message] of Object.entries(error.fields)) if (known.includes(name)) fields[name] = message;
  return { fields, form: Object.keys(fields).length > 0 ? null : error.message };
}

/** Moves focus to the first invalid control of a form, so keyboard and screen-reader users land on the problem. */
export function focusFirstInvalid(form: HTMLFormElement | null) {
  requestAnimationFrame(() => form?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus());
}

/** "" → undefined, otherwise the number the text holds (NaN stays NaN for the schema to name). */
export function numberOrUndefined(text: string): number | undefined {
  const trimmed = text.trim().replace(",", ".");
  return trimmed === "" ? undefined : Number(trimmed);
}
