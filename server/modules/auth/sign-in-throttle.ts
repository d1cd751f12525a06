/**
 * Sign-in throttling (OWASP Authentication Cheat Sheet, "account lockout"; ASVS 5.0 V6.3.1).
 * Only failed sign-ins (answers 401) count, each against three limits at once:
 *
 * - per (account, IP): 5 in 15 minutes — one address guessing one account;
 * - per IP: {@link SIGN_IN_IP_MAX_FAILURES} in 15 minutes over all accounts — password spraying;
 * - per account: {@link SIGN_IN_ACCOUNT_MAX_FAILURES} in an hour from all addresses —
 *   distributed guessing. A browser that has signed in to the account before (a known-device
 *   cookie, see known-device.ts) counts in a bucket of its own, so a stranger's guesses lock out
 *   new browsers but never the owner's; and a completed password reset forgets the account's
 *   failures, so the owner can always reset and then sign in anywhere.
 *
 * Over any limit → 429 `too_many_attempts` with Retry-After, whatever the password. Accounts are
 * keyed by the e-mail typed, known or not, so the answer never tells whether an account exists.
 *
 * Every attempt is counted before the password is checked (one statement for the three keys),
 * so parallel guesses cannot slip past; an attempt that turns out not to be a failed sign-in
 * (any answer but 401, including the 429 itself) is taken back after the answer. Counts live in
 * PostgreSQL (`rate_limit_hits`), so they hold across app processes and restarts; keys hold a
 * hash of the e-mail, not the address.
 */
import type { Request, RequestHandler } from "express";
import cookieParser from "cookie-parser";
import { ipKeyGenerator, type IncrementResponse, type Options, type Store } from "express-rate-limit";
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { AppError } from "../../lib/app-error";
import { logger } from "../../lib/logger";
import { logSecurityEvent } from "../../lib/security-log";
import { accountFingerprint, knownDeviceId } from "./known-device";

export const SIGN_IN_WINDOW_MS = 15 * 60_000;
/** Per (account, IP) in {@link SIGN_IN_WINDOW_MS}. */
export const SIGN_IN_MAX_FAILURES = 5;
/** Per IP over all accounts in {@link SIGN_IN_WINDOW_MS} [judgement: a household or a shared café network mistypes far less]. */
export const SIGN_IN_IP_MAX_FAILURES = 20;
export const SIGN_IN_ACCOUNT_WINDOW_MS = 60 * 60_000;
/** Per account from all addresses (known devices apart) in {@link SIGN_IN_ACCOUNT_WINDOW_MS} [judgement]. */
export const SIGN_IN_ACCOUNT_MAX_FAILURES = 10;

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

/** The (account, IP) key: a hash of the typed e-mail plus the client IP (IPv6 grouped per /56). */
export function signInKey(req: Request): string {
  return `${accountFingerprint(typedEmail(req))}:${ipKeyGenerator(req.ip ?? "")}`;
}

type LimitName = "account_ip" | "ip" | "account";
interface Limit {
  name: LimitName;
  key: string;
  max: number;
  windowMs: number;
}

function limitsFor(req: Request): Limit[] {
  const account = accountFingerprint(typedEmail(req));
  const ip = ipKeyGenerator(req.ip ?? "");
  const device = knownDeviceId(req, account);
  return [
    { name: "account_ip", key: `sign-in:${account}:${ip}`, max: SIGN_IN_MAX_FAILURES, windowMs: SIGN_IN_WINDOW_MS },
    { name: "ip", key: `sign-in-ip:${ip}`, max: SIGN_IN_IP_MAX_FAILURES, windowMs: SIGN_IN_WINDOW_MS },
    {
      name: "account",
      key: device ? `sign-in-account:${account}:device:${device}` : `sign-in-account:${account}`,
      max: SIGN_IN_ACCOUNT_MAX_FAILURES,
      windowMs: SIGN_IN_ACCOUNT_WINDOW_MS,
    },
  ];
}

/** Counts one attempt on each key in one statement; a key whose window has run out starts again at 1. */
async function countAttempt(limits: Limit[]): Promise<Map<string, { hits: number; resetAt: Date }>> {
  const rows = await sequelize().query<{ key: string; hits: number; reset_at: Date }>(
    `INSERT INTO rate_limit_hits AS r (key, hits, reset_at)
     SELECT k, 1, now() + make_interval(secs => w) FROM unnest($1::text[], $2::float8[]) AS i(k, w) ORDER BY k
     ON CONFLICT (key) DO UPDATE SET
       hits = CASE WHEN r.reset_at <= now() THEN 1 ELSE r.hits + 1 END,
       reset_at = CASE WHEN r.reset_at <= now() THEN EXCLUDED.reset_at ELSE r.reset_at END
     RETURNING key, hits, reset_at`,
    {
      bind: [limits.map((l) => l.key), limits.map((l) => l.windowMs / 1000)],
      type: QueryTypes.SELECT,
    },
  );
  return new Map(rows.map((r) => [r.key, { hits: r.hits, resetAt: new Date(r.reset_at) }]));
}

async function takeBack(keys: string[]): Promise<void> {
  await sequelize().query(
    `UPDATE rate_limit_hits SET hits = greatest(hits - 1, 0) WHERE key = ANY($1::text[]) AND reset_at > now()`,
    { bind: [keys] },
  );
}

/**
 * Forgets the failed sign-ins of the account with this e-mail (its per-account and per-(account,
 * IP) counts, not the addresses' own), after its owner proved control of the mailbox.
 */
export async function clearSignInFailures(email: string, transaction?: Transaction): Promise<void> {
  const account = accountFingerprint(email);
  await sequelize().query(`DELETE FROM rate_limit_hits WHERE starts_with(key, $1) OR starts_with(key, $2)`, {
    bind: [`sign-in:${account}:`, `sign-in-account:${account}`],
    transaction,
  });
}

const minutes = (seconds: number) => {
  const m = Math.max(1, Math.ceil(seconds / 60));
  return `${m} minute${m === 1 ? "" : "s"}`;
};

const messages: Record<LimitName, (wait: string) => string> = {
  account_ip: () => "Too many failed sign-ins for this account from here. Wait 15 minutes, or reset your password.",
  ip: (wait) => `Too many failed sign-ins from this network. Wait ${wait} and try again.`,
  account: (wait) =>
    `Too many failed sign-ins for this account. Wait ${wait}, or reset your password: after a reset you can sign in at once.`,
};

const parseCookies = cookieParser();

/** Middleware for POST /auth/login (before the body is validated or the password checked). */
export function signInThrottle(): RequestHandler {
  return (req, res, next) => {
    parseCookies(req, res, () => {
      const limits = limitsFor(req);
      countAttempt(limits)
        .then((counts) => {
          res.once("finish", () => {
            if (res.statusCode === 401) return;
            takeBack(limits.map((l) => l.key)).catch((err: unknown) =>
              logger.warn({ err: (err as Error).message }, "sign-in throttle: could not take an attempt back"),
            );
          });
          const now = Date.now();
          const over = limits
            .map((limit) => ({ limit, count: counts.get(limit.key) }))
            .filter(({ limit, count }) => count && count.hits > limit.max)
            .map(({ limit, count }) => ({
              limit,
              retryAfterS: Math.max(1, Math.ceil((count!.resetAt.getTime() - now) / 1000)),
            }))
            .sort((a, b) => b.retryAfterS - a.retryAfterS);
          const worst = over[0];
          if (!worst) return next();
          res.setHeader("Retry-After", String(worst.retryAfterS));
          logSecurityEvent("sign_in_throttled", {
            requestId: String(req.id ?? ""),
            ip: req.ip ?? "",
            email: typedEmail(req),
            reason: over.map((o) => o.limit.name).join(","),
          });
          next(new AppError(429, "too_many_attempts", messages[worst.limit.name](minutes(worst.retryAfterS))));
        })
        .catch(next);
    });
  };
}
