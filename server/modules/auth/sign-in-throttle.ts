/**
 * Sign-in throttling: 5 failed sign-ins per (account, IP) within 15 minutes → 429 with
 * Retry-After (OWASP Authentication Cheat Sheet, "account lockout"; ASVS V6.3.1). Keyed by the
 * pair, so an attacker elsewhere cannot lock a person out, and one address trying many
 * accounts is limited per account.
 *
 * express-rate-limit counts every request and takes back the ones that were not a failed
 * sign-in (any answer but 401). Counts live in PostgreSQL (`rate_limit_hits`), so they survive a
 * restart and hold across app processes; keys hold a hash of the e-mail, not the address.
 */
import type { Request, RequestHandler } from "express";
import { ipKeyGenerator, rateLimit, type IncrementResponse, type Options, type Store } from "express-rate-limit";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { AppError } from "../../lib/app-error";
import { logSecurityEvent } from "../../lib/security-log";
import { fingerprint } from "../../lib/tokens";

export const SIGN_IN_WINDOW_MS = 15 * 60_000;
export const SIGN_IN_MAX_FAILURES = 5;

/** An express-rate-limit store on the `rate_limit_hits` table (one row per key and window). */
export class PgRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = SIGN_IN_WINDOW_MS;

  constructor(readonly prefix: string) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  async get(key: string) {
    const rows = await sequelize().query<{ hits: number; reset_at: Date }>(
      `SELECT hits, reset_at FROM rate_limit_hits WHERE key = $1 AND reset_at > now()`,
      { bind: [this.prefix + key], type: QueryTypes.SELECT },
    );
    const row = rows[0];
    return row ? { totalHits: row.hits, resetTime: new Date(row.reset_at) } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    // One statement: a window that has run out starts again at 1.
    const rows = await sequelize().query<{ hits: number; reset_at: Date }>(
      `INSERT INTO rate_limit_hits AS r (key, hits, reset_at)
       VALUES ($1, 1, now() + make_interval(secs => $2))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN r.reset_at <= now() THEN 1 ELSE r.hits + 1 END,
         reset_at = CASE WHEN r.reset_at <= now() THEN EXCLUDED.reset_at ELSE r.reset_at END
       RETURNING hits, reset_at`,
      { bind: [this.prefix + key, this.windowMs / 1000], type: QueryTypes.SELECT },
    );
    const row = rows[0]!;
    return { totalHits: row.hits, resetTime: new Date(row.reset_at) };
  }

  async decrement(key: string) {
    await sequelize().query(
      `UPDATE rate_limit_hits SET hits = greatest(hits - 1, 0) WHERE key = $1 AND reset_at > now()`,
      {
        bind: [this.prefix + key],
      },
    );
  }

  async resetKey(key: string) {
    await sequelize().query(`DELETE FROM rate_limit_hits WHERE key = $1`, { bind: [this.prefix + key] });
  }
}

function typedEmail(req: Request): string {
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return typeof email === "string" ? email.trim().toLowerCase().slice(0, 254) : "";
}

/** The key: a hash of the typed e-mail plus the client IP (IPv6 grouped per /56). */
export function signInKey(req: Request): string {
  return `${fingerprint(typedEmail(req))}:${ipKeyGenerator(req.ip ?? "")}`;
}

/** Middleware for POST /auth/login; one per app so tests get independent instances. */
export function signInThrottle(): RequestHandler {
  return rateLimit({
    windowMs: SIGN_IN_WINDOW_MS,
    limit: SIGN_IN_MAX_FAILURES,
    keyGenerator: signInKey,
    skipSuccessfulRequests: true,
    // Only a wrong e-mail or password counts; validation errors or CSRF refusals do not.
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    store: new PgRateLimitStore("sign-in:"),
    handler: (req, _res, next) => {
      logSecurityEvent("sign_in_throttled", {
        requestId: String(req.id ?? ""),
        ip: req.ip ?? "",
        email: typedEmail(req),
      });
      next(
        new AppError(
          429,
          "too_many_attempts",
          "Too many failed sign-ins for this account from here. Wait 15 minutes, or reset your password.",
        ),
      );
    },
  });
}
