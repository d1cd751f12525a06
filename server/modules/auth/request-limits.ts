/**
 * Per-IP limits on the other doors that need no sign-in (ASVS 5.0 V6.3.1; OWASP Forgot Password
 * Cheat Sheet): asking for reset e-mails, and using a link that sets a password (completing a
 * reset, accepting an invitation). Over the limit → 429 `rate_limited` in the error shape with
 * Retry-After. Counts live in PostgreSQL like the sign-in counts, so they hold across app
 * processes. IPv6 addresses are grouped per /56.
 */
import type { RequestHandler } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { AppError } from "../../lib/app-error";
import { logSecurityEvent } from "../../lib/security-log";
import { PgRateLimitStore } from "./sign-in-throttle";

export const RESET_REQUESTS_WINDOW_MS = 15 * 60_000;
/** Reset requests per IP in 15 minutes, counted whatever the answer [judgement: a household asks once or twice]. */
export const RESET_REQUESTS_PER_IP = 10;
export const LINK_FAILURES_WINDOW_MS = 15 * 60_000;
/** Failed uses of password-setting links per IP in 15 minutes (unknown, used or expired links, refused passwords) [judgement]. */
export const LINK_FAILURES_PER_IP = 10;

function limited(message: string): RequestHandler {
  // express-rate-limit has set Retry-After by now; the error handler keeps it.
  return (req, _res, next) => {
    logSecurityEvent("rate_limited", {
      requestId: String(req.id ?? ""),
      ip: req.ip ?? "",
      method: req.method,
      path: req.originalUrl,
    });
    next(new AppError(429, "rate_limited", message));
  };
}

/** POST /auth/password-reset: every request counts, since each may send an e-mail. */
export function resetRequestLimit(): RequestHandler {
  return rateLimit({
    windowMs: RESET_REQUESTS_WINDOW_MS,
    limit: RESET_REQUESTS_PER_IP,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ""),
    standardHeaders: "draft-8",
    legacyHeaders: false,
    store: new PgRateLimitStore("reset-ip:"),
    handler: limited("Too many reset requests from this network. Wait 15 minutes and try again."),
  });
}

/**
 * POST /auth/password-reset/:token and POST /invitations/:token/accept: only failures count
 * (any answer of 400 or more), so a group signing up together on one network is not held up.
 * Both routes count under one key per address, so the two doors share the limit.
 */
export function linkUseLimit(): RequestHandler {
  return rateLimit({
    windowMs: LINK_FAILURES_WINDOW_MS,
    limit: LINK_FAILURES_PER_IP,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ""),
    skipSuccessfulRequests: true,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    store: new PgRateLimitStore("link-ip:"),
    handler: limited("Too many attempts with links from this network. Wait 15 minutes and try again."),
  });
}
