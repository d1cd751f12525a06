/**
 * CSRF protection on every POST, PUT, PATCH and DELETE (the token comes back in the
 * `x-csrf-token` header), in two forms (OWASP CSRF Prevention Cheat Sheet):
 *
 * - a session that holds something (someone signed in, or a token issued to it earlier) uses
 *   the synchroniser token pattern (csrf-sync): the token lives in the session row;
 * - a visitor with no such session gets a signed double-submit token (csrf-csrf): an HMAC of a
 *   random value, kept in an HttpOnly, SameSite=Strict cookie (`__Host-` and Secure in
 *   production) and sent back in the header. Nothing is stored on the server, so visitors
 *   fetching tokens leave no session rows. Once a session holds someone, only its own token
 *   counts; the visitor cookie may stay (it ends with the browser) and is worth nothing then.
 *
 * The public calculators under /api/calc/ change nothing and keep no session, so they are exempt.
 */
import { createHmac } from "node:crypto";
import type { Request, RequestHandler, Response } from "express";
import cookieParser from "cookie-parser";
import { csrfSync } from "csrf-sync";
import { doubleCsrf } from "csrf-csrf";
import { env } from "../config/env";
import { AppError } from "../lib/app-error";

const safeMethods = new Set(["GET", "HEAD", "OPTIONS"]);

const tokenFromHeader = (req: Request) => {
  const header = req.headers["x-csrf-token"];
  return typeof header === "string" ? header : undefined;
};

const sync = csrfSync({ getTokenFromRequest: tokenFromHeader });

/** The visitor cookie's name and flags; production adds Secure and the `__Host-` prefix, as for the session cookie. */
export function visitorCsrfCookieSettings() {
  const production = env().NODE_ENV === "production";
  return {
    name: production ? "__Host-hearthloop.csrf" : "hearthloop.csrf",
    cookie: { httpOnly: true, sameSite: "strict" as const, secure: production, path: "/" },
  };
}

let visitorUtilities: ReturnType<typeof doubleCsrf> | undefined;
function visitor() {
  if (!visitorUtilities) {
    const { name, cookie } = visitorCsrfCookieSettings();
    // A key of its own, derived from the session secret, so one secret never signs two kinds of thing.
    const secret = createHmac("sha256", env().SESSION_SECRET).update("hearthloop visitor csrf").digest("hex");
    visitorUtilities = doubleCsrf({
      getSecret: () => secret,
      // Visitors have no session to bind the token to; the HMAC and the __Host- cookie carry it.
      getSessionIdentifier: () => "visitor",
      cookieName: name,
      cookieOptions: cookie,
      getCsrfTokenFromRequest: tokenFromHeader,
    });
  }
  return visitorUtilities;
}

/** Whether the request's session holds something worth a row: a signed-in person or a token issued to it. */
function sessionHoldsState(req: Request): boolean {
  const s = req.session;
  return Boolean(s && (s.passport?.user !== undefined || typeof s.csrfToken === "string"));
}

/** The token for this request: the session's (created on first use) or, for a visitor, a signed cookie pair. */
export function csrfTokenFor(req: Request, res: Response): string {
  if (sessionHoldsState(req)) return sync.generateToken(req);
  return visitor().generateCsrfToken(req, res);
}

/** Paths (relative to the /api mount) that need no token: stateless public calculators. */
export function isCsrfExempt(path: string): boolean {
  return path.startsWith("/calc/");
}

export const csrfInvalid = () =>
  new AppError(403, "csrf_invalid", "This page's security token has expired. Reload the page and try again.");

const parseCookies = cookieParser();

/**
 * Mounted on /api after the session: reads cookies (the token route needs the visitor's), then
 * refuses state-changing requests without the right token.
 */
export const csrfProtection: RequestHandler = (req, res, next) => {
  parseCookies(req, res, (err?: unknown) => {
    if (err) return next(err);
    if (safeMethods.has(req.method) || isCsrfExempt(req.path)) return next();
    const valid = sessionHoldsState(req) ? sync.isRequestValid(req) : visitor().validateRequest(req);
    next(valid ? undefined : csrfInvalid());
  });
};
