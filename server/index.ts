/**
 * Boot: env → database → createApp() → listen → graceful shutdown.
 */
import type { Server } from "node:http";
import { env, EnvError, parseEnv } from "./config/env";

async function main() {
  try {
    parseEnv();
  } catch (err) {
    if (err instanceof EnvError) {
      console.error(err.message);
      process.exit(1);
    }
    throw err;
  }
  const { logger } = await import("./lib/logger");
  const { sequelize, closeDatabase } = await import("./db/sequelize");
  const { createApp } = await import("./app");
  const { closeMail } = await import("./lib/mailer");
  const { startJobs, stopJobs } = await import("./jobs");
  const { warmUpSolver, stopSolver } = await import("./modules/assignments/solver-pool");

  const e = env();
  try {
    await sequelize().authenticate();
  } catch (err) {
    logger.fatal({ err: (err as Error).message }, "cannot reach the database at start-up");
    process.exit(1);
  }

  const app = createApp({ clientDist: e.CLIENT_DIST });
  const server: Server = app.listen(e.PORT, e.HOST);
  server.on("error", (err: NodeJS.ErrnoException) => {
    logger.fatal({ err: err.message }, err.code === "EADDRINUSE" ? `port ${e.PORT} is already in use` : "server error");
    process.exit(1);
  });
  server.on("listening", () => {
    const address = server.address();
    const port = typeof address === "object" && address ? address.port : e.PORT;
    logger.info(`Hearthloop listening on http://${e.HOST}:${port}`);
    process.send?.({ type: "listening", port });
  });
  if (e.JOBS_ENABLED) startJobs();
  warmUpSolver().then(
    (ms) => logger.info({ ms: Math.round(ms) }, "scheduler warmed up"),
    (err: unknown) =>
      logger.warn({ err: (err as Error).message }, "scheduler warm-up failed; the first proposal will be slower"),
  );

  let stopping = false;
  async function shutdown(signal: string) {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, "shutting down: finishing in-flight requests");
    const force = setTimeout(() => {
      logger.error("in-flight requests did not finish within 9 s; exiting");
      process.exit(1);
    }, 9_000);
    force.unref();
    await stopJobs();
    server.close(async () => {
      await stopSolver().catch(() => undefined);
      await closeDatabase().catch(() => undefined);
      closeMail();
      clearTimeout(force);
      process.exit(0);
    });
    server.closeIdleConnections();
  }
  process.on("SIGTERM", () => void shutdown("SIGTERM"));
  process.on("SIGINT", () => void shutdown("SIGINT"));
}

void main();
