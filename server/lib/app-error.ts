/**
 * A field → message map with no prototype: keys come from what people send (a body's unknown
 * keys), and on a plain object a key such as `__proto__` would change the prototype instead of
 * being stored.
 */
export type FieldMap = Record<string, string>;

/** An empty {@link FieldMap} (`Object.create(null)`), optionally filled from `entries`. */
export function fieldMap(entries?: Iterable<readonly [string, string]> | FieldMap): FieldMap {
  const map = Object.create(null) as FieldMap;
  if (!entries) return map;
  const pairs = Symbol.iterator in entries ? entries : Object.entries(entries);
  for (const [key, message] of pairs as Iterable<readonly [string, string]>) map[key] = message;
  return map;
}

/** The one error type of the server: every expected failure is thrown as an AppError. */
export class AppError extends Error {
  readonly fields?: FieldMap;

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    fields?: FieldMap,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = "AppError";
    // Copied into a map without a prototype, whoever built the original.
    if (fields) this.fields = fieldMap(fields);
  }
}

export const notFound = (what: string) => new AppError(404, "not_found", `${what} was not found.`);
export const forbidden = (message = "You do not have permission to do this.") =>
  new AppError(403, "forbidden", message);
export const conflict = (message: string, fields?: FieldMap) => new AppError(409, "conflict", message, fields);
export const badRequest = (message: string, fields?: FieldMap) => new AppError(400, "invalid_input", message, fields);

/** 400 `invalid_input` naming each field: "Please check these fields: name, roles." */
export function invalidFields(fields: FieldMap): AppError {
  const names = Object.keys(fields);
  return badRequest(`Please check ${names.length === 1 ? "this field" : "these fields"}: ${names.join(", ")}.`, fields);
}
