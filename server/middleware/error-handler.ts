import type { ErrorRequestHandler, Request, RequestHandler } from "express";
import { AppError, type FieldMap } from "../lib/app-error";
import { logger } from "../lib/logger";

export interface ErrorBody {
  error: { code: string; message: string; fields?: FieldMap };
}

/** Encodings the JSON body parser inflates (body-parser 2: gzip, deflate, br, and zstd where Node has it). */
const READABLE_ENCODINGS = "gzip, deflate or br";

/**
 * The body parser's own errors (http-errors with a 4xx status and `expose`). Most carry a
 * `type`; a body whose bytes do not match its Content-Encoding fails inside zlib, and that
 * error reaches us with a status but no `type`.
 */
function bodyParserError(err: unknown, req: Request): AppError | undefined {
  const e = err as { type?: unknown; status?: unknown; expose?: unknown; encoding?: unknown } | null;
  if (!e || typeof e.status !== "number" || e.status >= 500) return undefined;
  if (e.type === "entity.too.large") return new AppError(413, "payload_too_large", "The request body is too large.");
  if (e.type === "entity.parse.failed")
    return new AppError(400, "malformed_json", "The request body is not valid JSON.");
  if (e.type === "encoding.unsupported") {
    return new AppError(
      415,
      "unsupported_content_encoding",
      `The body's Content-Encoding "${String(e.encoding ?? "").slice(0, 40)}" is not one we read: send it uncompressed or with ${READABLE_ENCODINGS}.`,
    );
  }
  if (e.type) return new AppError(e.status, "bad_request", "The request could not be read.");
  if (e.expose !== true) return undefined;
  const encoding = String(req.headers["content-encoding"] ?? "identity")
    .toLowerCase()
    .slice(0, 40);
  if (encoding !== "identity") {
    return new AppError(
      400,
      "invalid_content_encoding",
      `The body is not compressed as its Content-Encoding "${encoding}" says; send it uncompressed, or compress it with ${encoding}.`,
    );
  }
  return new AppError(e.status, e.status === 404 ? "not_found" : "bad_request", "The request could not be read.");
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

/**
 * SQLSTATEs of a connection the database ended or lost (PostgreSQL 15 manual, Appendix A):
 * 57P01 admin shutdown ("terminating connection due to administrator command", sent to every
 * backend by a fast shutdown or pg_terminate_backend), 57P02 crash shutdown, 57P03 cannot
 * connect now, and class 08, connection exception.
 */
const connectionLostStates = new Set(["57P01", "57P02", "57P03", "08000", "08001", "08003", "08004", "08006", "08007"]);

/** pg's own words when the socket closes under a query ("Connection terminated unexpectedly"). */
const connectionLostMessage = /^Connection terminated\b|is not queryable/;

type MaybeDbError = { name?: string; code?: string; message?: string; parent?: MaybeDbError } | null;

/** Whether the error means the database is down or went away, rather than refused this query. */
export function isDatabaseDown(err: MaybeDbError): boolean {
  const cause = err?.parent ?? err;
  if (databaseDown.has(err?.name ?? "") || databaseDown.has(cause?.name ?? "")) return true;
  const code = cause?.code ?? err?.code;
  if (code === "ECONNREFUSED" || code === "ECONNRESET" || (code && connectionLostStates.has(code))) return true;
  return connectionLostMessage.test(cause?.message ?? "");
}

/** Database outages become 503 with Retry-After; anything else unforeseen is logged and a 500. */
function unexpected(err: MaybeDbError, req: Request): AppError {
  if (isDatabaseDown(err)) {
    logger.warn(
      { err: { name: err?.name, code: err?.parent?.code ?? err?.code }, reqId: req.id },
      "database unavailable",
    );
    return new AppError(
      503,
      "database_unavailable",
      "The database is not answering right now; please try again in a moment.",
      undefined,
      { "Retry-After": "5" },
    );
  }
  logger.error({ err, reqId: req.id }, "unexpected error");
  return new AppError(500, "internal", `Something went wrong on our side (request ${String(req.id ?? "")}).`);
}

/** The one error handler: every failure leaves in the shared error shape, without internals. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const appError = err instanceof AppError ? err : (bodyParserError(err, req) ?? unexpected(err, req));
  if (appError.headers) res.set(appError.headers);
  const body: ErrorBody = { error: { code: appError.code, message: appError.message } };
  if (appError.fields) body.error.fields = appError.fields;
  res.status(appError.status).json(body);
};
