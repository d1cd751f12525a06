/**
 * `npm test`: its own PostgreSQL cluster, databases and maildev (other ports than the demo,
 * so both can run at once), Chromium when missing, then typecheck, lint, format check, client build and
 * every Vitest project including the browser tests. Stops what it started, even on failure.
 */
import { spawn, spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { ensureCluster, stopCluster, connectionUrl, SetupError } from "./lib/postgres";
import { startMailDev, type MailDevHandle } from "./lib/maildev";
import { buildClientIfStale } from "./lib/build-client";
import { log, root } from "./lib/project";

const t0 = Date.now();
const cluster = {
  dataDir: path.join(root, ".data", "pg-test"),
  port: Number(process.env.TEST_PG_PORT ?? 54339),
  user: "hearthloop",
  password: "hearthloop-test",
  database: "hearthloop_test",
};
const smtpPort = Number(process.env.TEST_MAILDEV_SMTP_PORT ?? 1026);
const mailWebPort = Number(process.env.TEST_MAILDEV_WEB_PORT ?? 1081);

let pgBinDir: string | undefined;
let pgStartedHere = false;
let maildev: MailDevHandle | undefined;

function ensureChromium() {
  if (existsSync("/usr/bin/chromium")) return;
  if (process.getuid?.() !== 0)
    throw new SetupError("Chromium is missing: run `sudo apt-get install -y chromium` once.");
  log("Installing Chromium from Debian's packages (apt-get)…");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  spawnSync("apt-get", ["update", "-qq"], { stdio: "inherit", env });
  const r = spawnSync("apt-get", ["install", "-y", "-qq", "chromium"], { stdio: "inherit", env });
  if (r.status !== 0 || !existsSync("/usr/bin/chromium"))
    throw new SetupError("Could not install Chromium with apt-get.");
}

/** Drops and recreates a database so every run starts from migrations on an empty schema. */
async function recreateDatabase(name: string) {
  const admin = new pg.Client({ connectionString: connectionUrl(cluster, "postgres") });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
}

/** Runs one check as a child process; its output is buffered when `quiet` so parallel checks do not interleave. */
function step(name: string, args: string[], env: NodeJS.ProcessEnv = process.env, quiet = false): Promise<boolean> {
  log(`── ${name}`);
  const started = Date.now();
  return new Promise((resolve) => {
    const child = spawn(process.execPath, args, {
      cwd: root,
      stdio: quiet ? ["ignore", "pipe", "pipe"] : "inherit",
      env,
    });
    let output = "";
    child.stdout?.on("data", (d) => (output += String(d)));
    child.stderr?.on("data", (d) => (output += String(d)));
    child.on("close", (code) => {
      const ok = code === 0;
      if (output.trim()) process.stdout.write(output);
      log(`${ok ? "✔" : "✘"} ${name} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
      resolve(ok);
    });
  });
}

async function main(): Promise<number> {
  const pgResult = await ensureCluster(cluster, log);
  pgBinDir = pgResult.binDir;
  pgStartedHere = pgResult.startedHere;
  await recreateDatabase(cluster.database);
  await recreateDatabase("hearthloop_e2e");
  ensureChromium();
  maildev = await startMailDev(smtpPort, mailWebPort, root);

  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "test",
    LOG_LEVEL: process.env.LOG_LEVEL ?? "silent",
    DATABASE_URL: connectionUrl(cluster),
    E2E_DATABASE_URL: connectionUrl(cluster, "hearthloop_e2e"),
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
    MAILDEV_WEB_URL: `http://127.0.0.1:${mailWebPort}`,
    APP_URL: "http://127.0.0.1:3999",
    JOBS_ENABLED: "false",
    VITE_TILE_URL: "",
  };
  process.env.VITE_TILE_URL = "";

  const bin = (pkg: string, file: string) => path.join(root, "node_modules", pkg, file);
  const results: Array<[string, boolean]> = [];
  // Typecheck and lint use one core each; the client build follows (the browser tests need it).
  const [typecheckOk, lintOk, formatOk] = await Promise.all([
    step("typecheck", [bin("typescript", "bin/tsc"), "--noEmit", "-p", "."], env, true),
    step("lint", [bin("eslint", "bin/eslint.js"), "."], env, true),
    step(
      "format (prettier --check)",
      [bin("prettier", "bin/prettier.cjs"), "--check", "--log-level", "warn", "."],
      env,
      true,
    ),
  ]);
  results.push(["typecheck", typecheckOk], ["lint", lintOk], ["format", formatOk]);
  let built = true;
  try {
    buildClientIfStale(log, "dist");
  } catch {
    built = false;
  }
  results.push(["client build", built]);
  results.push([
    "vitest",
    await step("vitest (shared, server, client, e2e)", [bin("vitest", "vitest.mjs"), "run"], env),
  ]);

  const failed = results.filter(([, ok]) => !ok).map(([n]) => n);
  log(
    `Finished in ${((Date.now() - t0) / 1000).toFixed(0)} s: ${failed.length ? `FAILED: ${failed.join(", ")}` : "all checks passed"}.`,
  );
  return failed.length ? 1 : 0;
}

async function cleanup() {
  await maildev?.stop().catch(() => undefined);
  if (pgStartedHere && pgBinDir) stopCluster(pgBinDir, cluster.dataDir);
}

process.on("SIGINT", () => void cleanup().then(() => process.exit(130)));
process.on("SIGTERM", () => void cleanup().then(() => process.exit(143)));
process.on("SIGHUP", () => void cleanup().then(() => process.exit(129)));

main()
  .catch((err) => {
    console.error(`npm test could not set up: ${(err as Error).message}`);
    return 1;
  })
  .then(async (code) => {
    await cleanup();
    process.exit(code);
  });
