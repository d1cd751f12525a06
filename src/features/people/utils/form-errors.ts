import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError } from "@/lib/api-client";

/**
 * Puts the server's per-field messages under their fields and returns the message for the form
 * as a whole (or null when every message found its field).
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): string | null {
  if (!(error instanceof ApiError)) return "Something went wrong. Please try again.";
  let placed = false;
  for (const [name, message] of Object.entries(error.fields)) {
    if ((fields as readonly string[]).includes(name)) {
      setError(name as Path<T>, { type: "server", message }, { shouldFocus: !placed });
      placed = true;
    }
  }
  return placed ? null : error.message;
}
