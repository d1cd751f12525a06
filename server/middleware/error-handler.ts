import type { ErrorRequestHandler, RequestHandler } from "express";
import { AppError } from "../lib/app-error";
import { logger } from "../lib/logger";

export interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}

const databaseDown = new Set([
  "SequelizeConnectionError",
  "SequelizeConnectionRefusedError",
  "SequelizeConnectionAcquireTimeoutError",
  "SequelizeHostNotReachableError",
  "SequelizeConnectionTimedOutError",
]);

/** JSON 404 for unknown API paths. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, "not_found", `There is no ${req.method} ${req.path}.`));
};

/** The one error handler: every failure leaves in the shared error shape, without internals. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let appError: AppError;
  if (err instanceof AppError) {
    appError = err;
  } else if (err?.type === "entity.too.large") {
    appError = new AppError(413, "payload_too_large", "The request body is too large.");
  } else if (err?.type === "entity.parse.failed") {
    appError = new AppError(400, "malformed_json", "The request body is not valid JSON.");
  } else if (err?.type && typeof err.status === "number" && err.status < 500) {
    appError = new AppError(err.status, "bad_request", "The request could not be read.");
  } else if (databaseDown.has(err?.name) || databaseDown.has(err?.parent?.name) || err?.code === "ECONNREFUSED") {
    appError = new AppError(
      503,
      "database_unavailable",
      "The database is not answering right now; please try again in a moment.",
      undefined,
      { "Retry-After": "5" },
    );
  } else {
    logger.error({ err, reqId: req.id }, "unexpected error");
    appError = new AppError(500, "internal", `Something went wrong on our side (request ${String(req.id ?? "")}).`);
  }
  if (appError.headers) res.set(appError.headers);
  const body: ErrorBody = { error: { code: appError.code, message: appError.message } };
  if (appError.fields) body.error.fields = appError.fields;
  res.status(appError.status).json(body);
};
