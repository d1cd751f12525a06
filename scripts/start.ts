/**
 * `npm start`: the demo on this machine. PostgreSQL (own cluster under .data/), migrations,
 * the invented demo neighbourhood, maildev, the client build and the server, all on loopback.
 *
 * A small supervisor: the server runs as a child process and is started again (with back-off)
 * when it dies; PostgreSQL and maildev keep running meanwhile. Ctrl-C, SIGTERM or SIGHUP stop
 * all three and remove the lock `.data/start.pid`. A start after a crash of this process (even
 * `kill -9`) takes over what the earlier one left: its stale lock, its PostgreSQL cluster (which
 * this start then stops), and stops its maildev or server still holding their ports.
 */
import { fork } from "node:child_process";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { ensureCluster, stopCluster, connectionUrl, SetupError } from "./lib/postgres";
import { startMailDev, type MailDevHandle } from "./lib/maildev";
import { buildClientIfStale } from "./lib/build-client";
import { demoPassword, demoSignIns, loadDotEnv, log, root } from "./lib/project";
import { acquireLock, releaseLock } from "./lib/start-lock";
import { commandLine, listeningPid, stopProcess, workingDir } from "./lib/processes";
import { ServerSupervisor } from "./lib/supervisor";

// With the terminal gone (SIGHUP) writes to it fail; that must not stop the clean-up.
process.stdout.on("error", () => undefined);
process.stderr.on("error", () => undefined);

loadDotEnv();
const t0 = Date.now();
const pgPort = Number(process.env.PG_PORT ?? 54329);
const smtpPort = Number(process.env.MAILDEV_SMTP_PORT ?? 1025);
const mailWebPort = Number(process.env.MAILDEV_WEB_PORT ?? 1080);
const dataDir = path.resolve(root, process.env.START_DATA_DIR ?? ".data");
const cluster = {
  dataDir: path.join(dataDir, "pg"),
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
const appPort = Number(process.env.PORT);

const lockFile = path.join(dataDir, "start.pid");
let pgBinDir: string | undefined;
let maildev: MailDevHandle | undefined;
let supervisor: ServerSupervisor | undefined;
let stopping = false;

async function stopAll(code: number, reason?: string) {
  if (stopping) return;
  stopping = true;
  if (reason) log(`${reason}: stopping the server, maildev and PostgreSQL…`);
  await supervisor?.stop();
  await maildev?.stop();
  // The cluster is this start's to stop, also when an earlier start left it running.
  if (pgBinDir) stopCluster(pgBinDir, cluster.dataDir);
  releaseLock(lockFile);
  if (code === 0) log("Stopped.");
  process.exit(code);
}

/** A process from this folder still holding one of our ports: the server or maildev of an earlier start. */
async function stopLeftoverOn(port: number, what: string, marker: RegExp) {
  const pid = listeningPid(port);
  if (!pid || pid === process.pid) return;
  const cmd = commandLine(pid) ?? "";
  const cwd = workingDir(pid);
  const fromHere = cmd.includes(root) || (cwd !== undefined && path.resolve(cwd) === root);
  if (!marker.test(cmd) || !fromHere) return;
  log(`Stopping the ${what} an earlier start left running on port ${port} (process ${pid})…`);
  await stopProcess(pid, 12_000);
}

async function main() {
  mkdirSync(dataDir, { recursive: true });
  const lock = acquireLock(lockFile, root);
  if (!lock.acquired) {
    console.error(
      `Hearthloop is already running from this folder (process ${lock.holder.pid}) at ${process.env.APP_URL}. Stop it with Ctrl-C first.`,
    );
    process.exit(1);
  }
  for (const signal of ["SIGINT", "SIGTERM", "SIGHUP"] as const) {
    process.on(signal, () => void stopAll(0, signal));
  }
  if (lock.stale) log(`Taking over from an earlier start (process ${lock.stale.pid}) that did not stop cleanly.`);

  await stopLeftoverOn(appPort, "server", /server[/\\]index\.ts/);
  await stopLeftoverOn(mailWebPort, "maildev", /maildev/);
  await stopLeftoverOn(smtpPort, "maildev", /maildev/);

  const pg = await ensureCluster(cluster, log);
  pgBinDir = pg.binDir;
  if (pg.leftover) {
    log(`PostgreSQL was left running by an earlier start (process ${pg.leftover.pid}); this start takes it over.`);
  }
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

  supervisor = new ServerSupervisor({
    log,
    spawn: () =>
      fork(path.join(root, "server", "index.ts"), [], {
        cwd: root,
        execArgv: ["--import", "tsx"],
        env: { ...process.env, CLIENT_DIST: path.join(root, "dist") },
        stdio: ["ignore", "inherit", "inherit", "ipc"],
      }),
  });
  if (stopping) return;
  await supervisor.start();

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
  if (stopping) return;
  const message = err instanceof SetupError ? err.message : (err as Error).message;
  console.error(`Hearthloop could not start: ${message}`);
  await stopAll(1);
});
