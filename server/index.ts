/**
 * Boot: env → database → createApp() → listen → graceful shutdown.
 *
 * Shutdown (SIGTERM, SIGINT, SIGHUP, or the supervisor's IPC channel closing): stop
 * accepting, answer every request already received (with `Connection: close`), close each
 * connection once nothing is in flight on it, then stop the jobs, the solver worker, the
 * database pool and the mailer, and exit 0. Exit 1 only when something hangs past the
 * deadline (requests still running after 8 s are cut; 9.5 s in all).
 */
import { createServer, type Server } from "node:http";
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
  const { httpDrain } = await import("./lib/http-drain");

  const e = env();
  try {
    await sequelize().authenticate();
  } catch (err) {
    logger.fatal({ err: (err as Error).message }, "cannot reach the database at start-up");
    process.exit(1);
  }

  const app = createApp({ clientDist: e.CLIENT_DIST });
  const server: Server = createServer(app);
  const connections = httpDrain(server);
  server.listen(e.PORT, e.HOST);
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

  const DRAIN_DEADLINE_MS = 8_000;
  const EXIT_DEADLINE_MS = 9_500;
  let stopping = false;
  async function shutdown(signal: string) {
    if (stopping) return;
    stopping = true;
    const started = Date.now();
    logger.info({ signal, ...connections.stats() }, "shutting down: answering the requests already received");
    const force = setTimeout(() => {
      logger.error(`shutdown did not finish within ${EXIT_DEADLINE_MS / 1000} s; exiting`);
      process.exit(1);
    }, EXIT_DEADLINE_MS);
    force.unref();

    let deadline: NodeJS.Timeout | undefined;
    const drained = await Promise.race([
      connections.drain().then(() => true),
      new Promise<boolean>((resolve) => (deadline = setTimeout(() => resolve(false), DRAIN_DEADLINE_MS))),
    ]);
    clearTimeout(deadline);
    let cut = 0;
    if (!drained) {
      cut = connections.destroyAll();
      logger.error({ cut }, `requests still running after ${DRAIN_DEADLINE_MS / 1000} s were cut`);
    }
    await stopJobs().catch((err: unknown) => logger.warn({ err: (err as Error).message }, "stopping jobs failed"));
    // Independent of each other once no request or job needs them.
    await Promise.all([stopSolver().catch(() => undefined), closeDatabase().catch(() => undefined)]);
    closeMail();
    clearTimeout(force);
    logger.info({ ms: Date.now() - started }, "stopped");
    process.exit(cut > 0 ? 1 : 0);
  }
  process.on("SIGTERM", () => void shutdown("SIGTERM"));
  process.on("SIGINT", () => void shutdown("SIGINT"));
  // A closed terminal sends SIGHUP, whose default would end the process without draining.
  process.on("SIGHUP", () => void shutdown("SIGHUP"));
  // Under `npm start` the supervisor holds an IPC channel; when it dies (even by SIGKILL) the
  // channel closes and the server stops too, instead of holding the port as an orphan.
  if (process.connected) process.on("disconnect", () => void shutdown("supervisor gone"));
}

void main();
