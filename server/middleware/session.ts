/**
 * Sessions: express-session with rows in PostgreSQL (connect-pg-simple, table `sessions`),
 * sharing the app's Sequelize pool. Idle timeout 30 min (every request moves it), absolute
 * timeout 8 h from sign-in (OWASP Session Management Cheat Sheet; ASVS V7.3).
 *
 * Routes that must start or end a session use {@link handleWithSession}, which hands the
 * handler a narrow {@link SessionControl} instead of `req`/`res`.
 */
import type { NextFunction, Request, RequestHandler, Response } from "express";
import session from "express-session";
import connectPgSimple from "connect-pg-simple";
import { QueryTypes } from "sequelize";
import type { z } from "zod";
import { env, type Env } from "../config/env";
import { sequelize } from "../db/sequelize";
import { logger } from "../lib/logger";
import { passport } from "../modules/auth/passport";
import { logSecurityEvent } from "../lib/security-log";
import type { SessionInfo } from "../../shared/schemas/auth";
import { rememberDevice } from "../modules/auth/known-device";
import { csrfTokenFor } from "./csrf";
import { handle, type Caller, type HandlerInput, type Reply } from "./handle";

export const IDLE_TIMEOUT_MS = 30 * 60_000;
export const ABSOLUTE_TIMEOUT_MS = 8 * 60 * 60_000;
/**
 * A session row's expiry is moved at most once a minute per process (not on every request), to
 * save one UPDATE per request. The server-side idle end is then between 29 and 30 minutes after
 * the last request, so the client is told the shorter figure.
 */
export const TOUCH_INTERVAL_MS = 60_000;
/** Response header on signed-in API answers: seconds until the session ends if nothing else happens. */
export const SESSION_EXPIRES_HEADER = "X-Session-Expires-In";

declare module "express-session" {
  interface SessionData {
    /** Epoch ms of sign-in, for the absolute timeout. */
    signedInAt?: number;
    passport?: { user?: number };
    /** Set by "stay signed in" to force a write of the row (a plain touch may be skipped). */
    keptAliveAt?: number;
  }
}

/**
 * Cookie name and flags: HttpOnly, SameSite=Lax, Path=/, and in production Secure with the
 * `__Host-` prefix (the browser then refuses it without Secure, with a Domain or another Path).
 */
export function sessionCookieSettings(e: Env = env()) {
  const production = e.NODE_ENV === "production";
  return {
    name: production ? "__Host-hearthloop.sid" : "hearthloop.sid",
    cookie: { httpOnly: true, sameSite: "lax" as const, secure: production, path: "/" },
  };
}

/** connect-pg-simple's `pgPromise` hook, answered by Sequelize so sessions use the app's one pool. */
const sequelizeAdapter = {
  any: (query: string, params: unknown[]) => sequelize().query(query, { bind: params, type: QueryTypes.SELECT }),
};

/** express-session for the API; one store per app (it keeps no timers: expired rows are pruned by a job). */
export function sessionMiddleware(): RequestHandler {
  const e = env();
  const { name, cookie } = sessionCookieSettings(e);
  const PgStore = connectPgSimple(session);
  // Skips a touch when this process moved the same row's expiry less than TOUCH_INTERVAL_MS ago.
  class MinuteTouchStore extends PgStore {
    private readonly lastTouch = new Map<string, number>();
    override touch(sid: string, sess: session.SessionData, callback?: () => void) {
      const now = Date.now();
      const last = this.lastTouch.get(sid);
      if (last !== undefined && now - last < TOUCH_INTERVAL_MS) return callback?.();
      // Bounded memory: forgetting only costs one extra UPDATE per session.
      if (this.lastTouch.size >= 50_000) this.lastTouch.clear();
      this.lastTouch.set(sid, now);
      super.touch(sid, sess, callback);
    }
    override set(sid: string, sess: session.SessionData, callback?: (err?: unknown) => void) {
      this.lastTouch.set(sid, Date.now());
      super.set(sid, sess, callback);
    }
    override destroy(sid: string, callback?: (err?: unknown) => void) {
      this.lastTouch.delete(sid);
      super.destroy(sid, callback);
    }
  }
  const store = new MinuteTouchStore({
    pgPromise: sequelizeAdapter,
    tableName: "sessions",
    createTableIfMissing: false,
    pruneSessionInterval: false,
    errorLog: (...args: unknown[]) => logger.warn({ detail: args.map(String).join(" ") }, "session store error"),
  });
  const sessions = session({
    name,
    secret: e.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: e.TRUST_PROXY ? true : undefined,
    cookie: { ...cookie, maxAge: IDLE_TIMEOUT_MS },
  });
  return (req, res, next) => {
    hookLateCookies(res);
    sessions(req, res, next);
  };
}

const lateCookies = new WeakMap<Response, Array<() => void>>();

/**
 * express-session adds its cookie when the headers are written (it wraps `writeHead`). Wrapping
 * it first, here, runs these setters just after it, so the session cookie stays the first
 * Set-Cookie of an answer and the known-device cookie follows it.
 */
function hookLateCookies(res: Response) {
  const writeHead = res.writeHead;
  res.writeHead = function (this: Response, ...args: Parameters<Response["writeHead"]>) {
    for (const set of lateCookies.get(res) ?? []) set();
    lateCookies.delete(res);
    return writeHead.apply(this, args);
  } as Response["writeHead"];
}

function setAfterSessionCookie(res: Response, set: () => void) {
  const pending = lateCookies.get(res);
  if (pending) pending.push(set);
  else lateCookies.set(res, [set]);
}

/** passport.initialize() + passport.session(): sets req.user from the session's person id. */
export function passportMiddleware(): RequestHandler[] {
  return [passport.initialize(), passport.session()];
}

function info(signedInAt: number, now = Date.now()): SessionInfo {
  const absoluteEnd = signedInAt + ABSOLUTE_TIMEOUT_MS;
  const end = Math.min(now + IDLE_TIMEOUT_MS - TOUCH_INTERVAL_MS, absoluteEnd);
  return {
    expiresAt: new Date(end).toISOString(),
    expiresInSeconds: Math.max(0, Math.floor((end - now) / 1000)),
    absoluteExpiresAt: new Date(absoluteEnd).toISOString(),
    idleTimeoutSeconds: (IDLE_TIMEOUT_MS - TOUCH_INTERVAL_MS) / 1000,
  };
}

/**
 * After passport: ends a session past its absolute limit or whose person can no longer sign
 * in (disabled, deleted), and tells signed-in clients how long they have left.
 */
export const sessionLifetime: RequestHandler = (req, res, next) => {
  const s = req.session;
  if (!s?.signedInAt) return next();
  const caller = req.user as Caller | undefined;
  const now = Date.now();
  if (!caller || now - s.signedInAt >= ABSOLUTE_TIMEOUT_MS) {
    logSecurityEvent("session_expired", {
      requestId: String(req.id ?? ""),
      ip: req.ip ?? "",
      userId: caller?.id ?? s.passport?.user,
      reason: caller ? "absolute_timeout" : "account_not_active",
    });
    req.user = undefined;
    // A fresh, empty session: the old row is deleted and the request goes on as a visitor.
    s.regenerate((err) => next(err));
    return;
  }
  res.setHeader(SESSION_EXPIRES_HEADER, String(info(s.signedInAt, now).expiresInSeconds));
  next();
};

/** The expiry header for an answer that has just started a session (the middleware set none: nobody was signed in yet). */
export function sessionHeaders(current: SessionInfo | undefined): Record<string, string> {
  return current ? { [SESSION_EXPIRES_HEADER]: String(current.expiresInSeconds) } : {};
}

/** What a route may do with the session, without touching `req` or `res`. */
export interface SessionControl {
  /** Runs passport-local on the request body: the person, or false for a wrong e-mail or password. */
  authenticate(): Promise<Caller | false>;
  /**
   * A new session id (fixation defence), the person in it, and the sign-in time; this browser
   * becomes a known device for the account (its failed sign-ins count apart from strangers').
   */
  signIn(caller: Caller): Promise<void>;
  /** Makes this browser a known device for the account with this e-mail (after a password reset from it). */
  rememberDevice(email: string): void;
  /** Deletes the session row and clears the cookie. */
  signOut(): Promise<void>;
  /** Time left; undefined when nobody is signed in. */
  info(): SessionInfo | undefined;
  /** The session id, to spare the current session when ending a person's others. Never log it. */
  id(): string | undefined;
  /** The CSRF token: the session's (created on first use), or a visitor's signed cookie pair that stores nothing. */
  csrfToken(): string;
  /** Writes the session row now, moving its idle end ("stay signed in"). */
  keepAlive(): void;
}

function control(req: Request, res: Response, next: NextFunction): SessionControl {
  return {
    authenticate: () =>
      new Promise((resolve, reject) => {
        passport.authenticate("local", { session: false }, (err: unknown, user: Caller | false) => {
          if (err) reject(err);
          else resolve(user || false);
        })(req, res, next);
      }),
    signIn: (caller) =>
      new Promise((resolve, reject) => {
        req.login(caller, (err) => {
          if (err) return reject(err);
          req.session.signedInAt = Date.now();
          setAfterSessionCookie(res, () => rememberDevice(res, caller.email));
          resolve();
        });
      }),
    signOut: () =>
      new Promise((resolve, reject) => {
        req.user = undefined;
        if (!req.session) return resolve();
        req.session.destroy((err) => {
          if (err) return reject(err);
          const { name, cookie } = sessionCookieSettings();
          res.clearCookie(name, cookie);
          resolve();
        });
      }),
    rememberDevice: (email) => setAfterSessionCookie(res, () => rememberDevice(res, email)),
    info: () => (req.user && req.session?.signedInAt ? info(req.session.signedInAt) : undefined),
    id: () => (req.session ? req.sessionID : undefined),
    csrfToken: () => csrfTokenFor(req, res),
    keepAlive: () => {
      if (req.session) req.session.keptAliveAt = Date.now();
    },
  };
}

type Schemas = { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType };

/** `handle()` plus a {@link SessionControl} for the few routes that start, end or inspect a session. */
export function handleWithSession<S extends Schemas>(
  schemas: S,
  handler: (input: HandlerInput<S> & { session: SessionControl }) => Promise<Reply | void> | Reply | void,
): RequestHandler {
  return (req, res, next) =>
    handle(schemas, (input) => handler({ ...input, session: control(req, res, next) }))(req, res, next);
}
