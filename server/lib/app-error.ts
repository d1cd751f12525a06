/** The one error type of the server: every expected failure is thrown as an AppError. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const notFound = (what: string) => new AppError(404, "not_found", `${what} was not found.`);
export const forbidden = (message = "You do not have permission to do this.") =>
  new AppError(403, "forbidden", message);
export const conflict = (message: string, fields?: Record<string, string>) =>
  new AppError(409, "conflict", message, fields);
export const badRequest = (message: string, fields?: Record<string, string>) =>
  new AppError(400, "invalid_input", message, fields);
