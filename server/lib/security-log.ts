/**
 * The security log: one pino line per sign-in success or failure, 403, CSRF rejection and
 * rate-limit hit (and a few account events), each with time, request id, user or e-mail and
 * IP. Only the fields named in {@link SecurityFields} are ever written, so a password, cookie,
 * session id or token cannot reach it by accident.
 */
import type { ErrorRequestHandler } from "express";
import { AppError } from "./app-error";
import { logger } from "./logger";

export type SecurityEvent =
  | "sign_in_succeeded"
  | "sign_in_failed"
  | "sign_in_throttled"
  | "rate_limited"
  | "signed_out"
  | "session_expired"
  | "forbidden"
  | "csrf_rejected"
  | "password_changed"
  | "password_reset_requested"
  | "password_reset_completed"
  | "email_changed"
  | "invitation_accepted"
  | "person_disabled"
  | "roles_changed";

export interface SecurityFields {
  requestId: string;
  ip: string;
  /** The person acting, when known. */
  userId?: number;
  /** The e-mail typed at sign-in or reset (there may be no account for it). */
  email?: string;
  /** The person acted upon, when it is someone else. */
  targetId?: number;
  method?: string;
  path?: string;
  /** A short machine word such as "unknown_account" or "wrong_password". */
  reason?: string;
}

/** The security channel; tests spy on its `info` to check what is written. */
export const securityLogger = logger.child({ channel: "security" });

export function logSecurityEvent(event: SecurityEvent, fields: SecurityFields) {
  const line: Record<string, unknown> = { event, reqId: fields.requestId, ip: fields.ip };
  if (fields.userId !== undefined) line.userId = fields.userId;
  if (fields.email !== undefined) line.email = fields.email.slice(0, 254);
  if (fields.targetId !== undefined) line.targetId = fields.targetId;
  if (fields.method !== undefined) line.method = fields.method;
  if (fields.path !== undefined) line.path = redactUrl(fields.path);
  if (fields.reason !== undefined) line.reason = fields.reason;
  securityLogger.info(line, `security: ${event}`);
}

// One-time tokens travel in these paths; request logs must not carry them.
const tokenInPath = /\/(invitations?|password-reset|reset-password)\/[A-Za-z0-9_-]{16,}/g;

/** The URL with any one-time token replaced, for request and security logs. */
export function redactUrl(url: string): string {
  return url.replace(tokenInPath, "/$1/[redacted]");
}

/**
 * Error middleware placed before the error handler: writes one security line for every 403
 * (CSRF rejections get their own event name) and passes the error on unchanged.
 */
export const securityErrorLogger: ErrorRequestHandler = (err, req, _res, next) => {
  if (err instanceof AppError && err.status === 403) {
    const user = req.user as { id?: number } | undefined;
    logSecurityEvent(err.code === "csrf_invalid" ? "csrf_rejected" : "forbidden", {
      requestId: String(req.id ?? ""),
      ip: req.ip ?? "",
      userId: user?.id,
      method: req.method,
      path: req.originalUrl,
      reason: err.code,
    });
  }
  next(err);
};
