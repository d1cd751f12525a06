import type { z } from "zod";
import { fieldMap, type FieldMap } from "./app-error";

/**
 * Turns zod issues into `{ field: message }`, naming unknown keys one by one. The map has no
 * prototype, so an unknown key named `__proto__` is listed like any other.
 */
export function zodFields(error: z.ZodError, prefix?: string): FieldMap {
  const fields = fieldMap();
  for (const issue of error.issues) {
    if (issue.code === "unrecognized_keys") {
      for (const key of issue.keys) {
        const name = [prefix, ...issue.path.map(String), key].filter(Boolean).join(".");
        fields[name] = "is not an allowed field";
      }
      continue;
    }
    const name = [prefix, ...issue.path.map(String)].filter(Boolean).join(".") || prefix || "body";
    fields[name] ??= issue.message;
  }
  return fields;
}
