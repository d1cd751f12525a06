/**
 * createApp(): the Express application without `listen`, so tests drive it with supertest
 * and server/index.ts owns the process.
 */
import express, { type Express } from "express";
import helmet from "helmet";
import { pinoHttp } from "pino-http";
import { randomUUID } from "node:crypto";
import { existsSync } from "node:fs";
import path from "node:path";
import { env, tileOrigin } from "./config/env";
import { logger } from "./lib/logger";
import { apiNotFound, errorHandler } from "./middleware/error-handler";
import { apiRouter } from "./routes";
import { redactUrl, securityErrorLogger } from "./lib/security-log";
import { csrfProtection } from "./middleware/csrf";
import { inputGuard } from "./middleware/input-guard";
import { permissionsPolicy } from "./middleware/permissions-policy";
import { passportMiddleware, sessionLifetime, sessionMiddleware } from "./middleware/session";

export interface AppOptions {
  /** Serve the built client from this folder (absent in API tests). */
  clientDist?: string;
  /** Log each request (off in tests to keep output readable). */
  requestLogging?: boolean;
}

export function createApp(options: AppOptions = {}): Express {
  const e = env();
  const app = express();
  app.disable("x-powered-by");
  if (e.TRUST_PROXY) app.set("trust proxy", 1);

  const tiles = tileOrigin(e);
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          "default-src": ["'self'"],
          "script-src": ["'self'"],
          // React and Leaflet set style properties; no inline <style> from users.
          "style-src": ["'self'", "'unsafe-inline'"],
          "img-src": ["'self'", "data:", ...(tiles ? [tiles] : [])],
          "font-src": ["'self'"],
          "connect-src": ["'self'"],
          "object-src": ["'none'"],
          "base-uri": ["'none'"],
          "form-action": ["'self'"],
          "frame-ancestors": ["'none'"],
          ...(e.NODE_ENV === "production" ? { "upgrade-insecure-requests": [] } : {}),
        },
      },
      strictTransportSecurity: e.NODE_ENV === "production",
    }),
  );
  app.use(permissionsPolicy);

  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const id = randomUUID();
        res.setHeader("X-Request-Id", id);
        return id;
      },
      autoLogging: options.requestLogging ?? true,
      customLogLevel: (_req, res, err) =>
        err || res.statusCode >= 500 ? "error" : res.statusCode >= 400 ? "info" : "debug",
      serializers: {
        // One-time tokens in invitation and reset URLs never reach the log.
        req: (req) => ({ id: req.id, method: req.method, url: redactUrl(String(req.url)) }),
        res: (res) => ({ statusCode: res.statusCode }),
      },
    }),
  );

  app.use("/api", (_req, res, next) => {
    // Signed-in answers must never sit in a shared or browser cache.
    res.set("Cache-Control", "no-store");
    next();
  });
  // strict: false so that a body of null, a number or a string reaches inputGuard, which names the problem.
  app.use("/api", express.json({ limit: "100kb", strict: false }), inputGuard);
  // Sessions (PostgreSQL), then who is signed in, then the absolute timeout, then CSRF.
  app.use("/api", sessionMiddleware(), ...passportMiddleware(), sessionLifetime, csrfProtection);
  app.use("/api", apiRouter());
  app.use("/api", apiNotFound);

  const dist = options.clientDist ? path.resolve(options.clientDist) : undefined;
  if (dist && existsSync(path.join(dist, "index.html"))) {
    app.use(
      "/assets",
      express.static(path.join(dist, "assets"), { immutable: true, maxAge: "365d", fallthrough: false }),
    );
    app.use(express.static(dist, { index: false, maxAge: "1h" }));
    // Client-side routes: every other GET gets the app shell.
    app.use((req, res, next) => {
      if (req.method !== "GET" && req.method !== "HEAD") return next();
      res.set("Cache-Control", "no-cache");
      res.sendFile(path.join(dist, "index.html"));
    });
  }

  app.use(securityErrorLogger);
  app.use(errorHandler);
  return app;
}
