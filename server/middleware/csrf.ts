/**
 * CSRF protection with the synchroniser token pattern (csrf-sync): the token lives in the
 * server-side session and must come back in the `x-csrf-token` header on every POST, PUT,
 * PATCH and DELETE. The public calculators under /api/calc/ change nothing and keep no
 * session, so they are exempt.
 */
import type { Request, RequestHandler } from "express";
import { csrfSync } from "csrf-sync";
import { AppError } from "../lib/app-error";

const safeMethods = new Set(["GET", "HEAD", "OPTIONS"]);

const sync = csrfSync({
  getTokenFromRequest: (req) => {
    const header = req.headers["x-csrf-token"];
    return typeof header === "string" ? header : undefined;
  },
});

/** The session's token, created on first use. */
export function csrfTokenFor(req: Request): string {
  return sync.generateToken(req);
}

/** Paths (relative to the /api mount) that need no token: stateless public calculators. */
export function isCsrfExempt(path: string): boolean {
  return path.startsWith("/calc/");
}

export const csrfInvalid = () =>
  new AppError(403, "csrf_invalid", "This page's security token has expired. Reload the page and try again.");

/** Mounted on /api after the session: refuses state-changing requests without the session's token. */
export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (safeMethods.has(req.method) || isCsrfExempt(req.path)) return next();
  if (!req.session || !sync.isRequestValid(req)) return next(csrfInvalid());
  next();
};
