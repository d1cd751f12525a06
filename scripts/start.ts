/**
 * `npm start`: the demo on this machine. PostgreSQL (own cluster under .data/), migrations,
 * the invented demo neighbourhood, maildev, the client build and the server, all on loopback.
 * Ctrl-C stops everything this command started.
 */
import { fork, type ChildProcess } from "node:child_process";
import { mkdirSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { ensureCluster, stopCluster, connectionUrl, readPid, SetupError } from "./lib/postgres";
import { startMailDev, type MailDevHandle } from "./lib/maildev";
import { buildClientIfStale } from "./lib/build-client";
import { demoPassword, demoSignIns, loadDotEnv, log, root } from "./lib/project";

loadDotEnv();
const t0 = Date.now();
const pgPort = Number(process.env.PG_PORT ?? 54329);
const smtpPort = Number(process.env.MAILDEV_SMTP_PORT ?? 1025);
const mailWebPort = Number(process.env.MAILDEV_WEB_PORT ?? 1080);
const cluster = {
  dataDir: path.join(root, ".data", "pg"),
  port: pgPort,
  user: "hearthloop",
  password: process.env.PG_PASSWORD ?? "hearthloop-local",
  database: "hearthloop",
};
process.env.NODE_ENV ??= "development";
process.env.DEMO_MODE ??= "true";
process.env.HOST ??= "127.0.0.1";
process.env.PORT ??= "3000";
process.env.DATABASE_URL ??= connectionUrl(cluster);
process.env.SMTP_URL ??= `smtp://127.0.0.1:${smtpPort}`;
process.env.APP_URL ??= `http://${process.env.HOST}:${process.env.PORT}`;

const lockFile = path.join(root, ".data", "start.pid");
let pgBinDir: string | undefined;
let pgStartedHere = false;
let maildev: MailDevHandle | undefined;
let server: ChildProcess | undefined;
let stopping = false;

async function stopAll(code: number) {
  if (stopping) return;
  stopping = true;
  if (server && server.exitCode === null) {
    await new Promise<void>((resolve) => {
      server!.once("exit", () => resolve());
      server!.kill("SIGTERM");
      setTimeout(() => server!.kill("SIGKILL"), 10_000).unref();
    });
  }
  await maildev?.stop();
  if (pgStartedHere && pgBinDir) stopCluster(pgBinDir, cluster.dataDir);
  rmSync(lockFile, { force: true });
  if (code === 0) log("Stopped.");
  process.exit(code);
}

function alive(pid: number) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

async function main() {
  mkdirSync(path.dirname(lockFile), { recursive: true });
  const other = readPid(lockFile);
  if (other && other !== process.pid && alive(other)) {
    console.error(
      `Hearthloop is already running from this folder (process ${other}) at ${process.env.APP_URL}. Stop it with Ctrl-C first.`,
    );
    process.exit(1);
  }
  writeFileSync(lockFile, String(process.pid));
  process.on("SIGINT", () => void stopAll(0));
  process.on("SIGTERM", () => void stopAll(0));

  const pg = await ensureCluster(cluster, log);
  pgBinDir = pg.binDir;
  pgStartedHere = pg.startedHere;
  log(`PostgreSQL ready on 127.0.0.1:${pgPort}.`);

  // Migrate and seed in this process; the server child gets the same environment.
  const { migrateUp } = await import("../server/db/migrator");
  const { seedDemoIfEmpty } = await import("../server/db/seeders/demo");
  const { closeDatabase } = await import("../server/db/sequelize");
  const applied = await migrateUp();
  if (applied.length) log(`Applied ${applied.length} migration(s).`);
  if (process.env.DEMO_MODE === "true") {
    const seeded = await seedDemoIfEmpty(new Date());
    if (seeded) log("Seeded the Larkmoor demo neighbourhood.");
  }
  await closeDatabase();

  maildev = await startMailDev(smtpPort, mailWebPort, root);
  log(maildev ? `maildev started (SMTP ${smtpPort}).` : `maildev already running on ${mailWebPort}; reusing it.`);

  buildClientIfStale(log);

  server = fork(path.join(root, "server", "index.ts"), [], {
    cwd: root,
    execArgv: ["--import", "tsx"],
    env: { ...process.env, CLIENT_DIST: path.join(root, "dist") },
    stdio: ["ignore", "inherit", "inherit", "ipc"],
  });
  await new Promise<void>((resolve, reject) => {
    server!.on("message", (m: { type?: string }) => m?.type === "listening" && resolve());
    server!.once("exit", (code) => reject(new Error(`the server exited with code ${code} before listening`)));
  });
  server.on("exit", (code) => {
    if (!stopping) {
      console.error(`The server stopped unexpectedly (exit code ${code}).`);
      void stopAll(1);
    }
  });

  const seconds = ((Date.now() - t0) / 1000).toFixed(1);
  console.log(`
  Hearthloop is ready (${seconds} s)

    App:          ${process.env.APP_URL}
    Mail inbox:   http://127.0.0.1:${mailWebPort}

    Demo sign-ins (password "${demoPassword}"):
${demoSignIns.map((d) => `      ${d.role.padEnd(12)} ${d.email}`).join("\n")}

  Press Ctrl-C to stop the app, maildev and PostgreSQL.
`);
}

main().catch(async (err) => {
  const message = err instanceof SetupError ? err.message : (err as Error).message;
  console.error(`Hearthloop could not start: ${message}`);
  await stopAll(1);
});
