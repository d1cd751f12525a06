import type { z } from "zod";

/** Turns zod issues into `{ field: message }`, naming unknown keys one by one. */
export function zodFields(error: z.ZodError, prefix?: string): Record<string, string> {
  const fields: Record<string, string> = {};
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
