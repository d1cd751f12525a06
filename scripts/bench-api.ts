/**
 * `npm run bench:api`: API throughput and latency on loopback (QUALITY.md, Performance).
 * Its own database (hearthloop_bench on the test cluster) seeded with the demo; a bare
 * Express route measured in the same run for the ratio; SQL statements per request counted.
 * Prints figures; passes or fails nothing.
 */
import autocannon from "autocannon";
import express from "express";
import type { Server } from "node:http";
import path from "node:path";
import pg from "pg";
import { ensureCluster, stopCluster, connectionUrl } from "./lib/postgres";
import { log, root } from "./lib/project";

const seconds = Number(process.env.BENCH_SECONDS ?? 8);
const cluster = {
  dataDir: path.join(root, ".data", "pg-test"),
  port: Number(process.env.TEST_PG_PORT ?? 54339),
  user: "hearthloop",
  password: "hearthloop-test",
  database: "hearthloop_bench",
};

const pgState = await ensureCluster(cluster, log);
const admin = new pg.Client({ connectionString: connectionUrl(cluster, "postgres") });
await admin.connect();
await admin.query(`DROP DATABASE IF EXISTS "${cluster.database}" WITH (FORCE)`);
await admin.query(`CREATE DATABASE "${cluster.database}"`);
await admin.end();

Object.assign(process.env, {
  DATABASE_URL: connectionUrl(cluster),
  NODE_ENV: "test",
  LOG_LEVEL: "silent",
  JOBS_ENABLED: "false",
  SMTP_URL: "smtp://127.0.0.1:1",
  DATABASE_POOL_MAX: "10",
});
const { migrateUp } = await import("../server/db/migrator");
const { seedDemoIfEmpty } = await import("../server/db/seeders/demo");
const { sequelize, closeDatabase } = await import("../server/db/sequelize");
const { createApp } = await import("../server/app");
await migrateUp();
await seedDemoIfEmpty(new Date());

function listen(app: express.Express): Promise<{ server: Server; url: string }> {
  return new Promise((resolve) => {
    const server = app.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as { port: number };
      resolve({ server, url: `http://127.0.0.1:${port}` });
    });
  });
}

const bare = express();
bare.get("/ping", (_req, res) => {
  res.json({ ok: true });
});
const bareServer = await listen(bare);
const app = await listen(createApp({ requestLogging: false }));

// Sign in as the demo resident through the real API.
let cookie = "";
async function call(method: string, url: string, body?: unknown, headers: Record<string, string> = {}) {
  const res = await fetch(app.url + url, {
    method,
    headers: { "content-type": "application/json", cookie, ...headers },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const set = res.headers.getSetCookie();
  if (set.length) cookie = set.map((c) => c.split(";")[0]).join("; ");
  return res;
}
let csrf = ((await (await call("GET", "/api/auth/csrf")).json()) as { token: string }).token;
const login = await call(
  "POST",
  "/api/auth/login",
  { email: "resident@example.org", password: "hearthloop-demo" },
  { "x-csrf-token": csrf },
);
if (login.status !== 200) throw new Error(`sign-in failed: ${login.status}`);
csrf = ((await (await call("GET", "/api/auth/csrf")).json()) as { token: string }).token;
const residentCookie = cookie;
const residentCsrf = csrf;
// A second session, the demo steward's, for the steward's day.
cookie = "";
const stewardCsrf0 = ((await (await call("GET", "/api/auth/csrf")).json()) as { token: string }).token;
const stewardLogin = await call(
  "POST",
  "/api/auth/login",
  { email: "steward@example.org", password: "hearthloop-demo" },
  { "x-csrf-token": stewardCsrf0 },
);
if (stewardLogin.status !== 200) throw new Error(`steward sign-in failed: ${stewardLogin.status}`);
const stewardCookie = cookie;
const stewardCsrf = ((await (await call("GET", "/api/auth/csrf")).json()) as { token: string }).token;
cookie = residentCookie;
csrf = residentCsrf;
const digesters = (await (await call("GET", "/api/digesters")).json()) as { id: number; status: string }[];
const open = digesters.find((d) => d.status === "active")!;
const dropOffBody = JSON.stringify({ digesterId: open.id, bucketCount: 1, bucketLitres: 5, mix: "fruitVeg" });

// SQL statements per request: count what goes through Sequelize (sessions use the same pool).
let statements = 0;
const traceSql = process.env.BENCH_TRACE_SQL === "true";
let counting = false;
(sequelize() as unknown as { options: { logging: unknown } }).options.logging = (sql: string) => {
  if (!counting) return;
  statements += 1;
  if (traceSql) console.log(`  sql: ${sql.slice(0, 200)}`);
};
async function statementsFor(method: string, url: string, body?: string, as = { cookie, csrf }) {
  // Let the previous load run drain (session touches finish after the responses).
  await new Promise((r) => setTimeout(r, 1_500));
  statements = 0;
  counting = true;
  if (traceSql) console.log(`${method} ${url}`);
  const res = await fetch(app.url + url, {
    method,
    headers: { cookie: as.cookie, "x-csrf-token": as.csrf, "content-type": "application/json" },
    body,
  });
  await res.text();
  // Session touches are written just after the response.
  await new Promise((r) => setTimeout(r, 200));
  counting = false;
  return { status: res.status, statements };
}

interface Case {
  name: string;
  url: string;
  method?: "GET" | "POST";
  body?: string;
  target: string;
  /** Signed in as the demo steward instead of the resident. */
  steward?: boolean;
}
const cases: Case[] = [
  { name: "bare Express route (reference)", url: bareServer.url + "/ping", target: "—" },
  { name: "GET /api/auth/me (session + person)", url: app.url + "/api/auth/me", target: "≥ 1000 req/s, p99 ≤ 50 ms" },
  {
    name: "GET /api/drop-offs?mine=true",
    url: app.url + "/api/drop-offs?mine=true",
    target: "≥ 1000 req/s, p99 ≤ 50 ms",
  },
  {
    name: "GET /api/digesters (today's budgets)",
    url: app.url + "/api/digesters",
    target: "≥ 1000 req/s, p99 ≤ 50 ms",
  },
  {
    name: "GET /api/steward/today (steward)",
    url: app.url + "/api/steward/today",
    target: "≥ 1000 req/s, p99 ≤ 50 ms",
    steward: true,
  },
  {
    name: "POST /api/drop-offs (write)",
    url: app.url + "/api/drop-offs",
    method: "POST",
    body: dropOffBody,
    target: "≥ 300 req/s, p99 ≤ 100 ms",
  },
];

const rows: string[][] = [];
let bareRps = 0;
for (const c of cases) {
  const as = c.steward ? { cookie: stewardCookie, csrf: stewardCsrf } : { cookie, csrf };
  const counted = c.url.startsWith(app.url)
    ? await statementsFor(c.method ?? "GET", c.url.slice(app.url.length), c.body, as)
    : undefined;
  const result = await autocannon({
    url: c.url,
    method: c.method ?? "GET",
    connections: 10,
    duration: seconds,
    headers: { cookie: as.cookie, "x-csrf-token": as.csrf, "content-type": "application/json" },
    body: c.body,
  });
  const rps = result.requests.average;
  if (!counted) bareRps = rps;
  const non2xx = result.non2xx + result.errors;
  rows.push([
    c.name,
    rps.toFixed(0),
    String(result.latency.p50),
    String(result.latency.p99),
    bareRps ? `${((rps / bareRps) * 100).toFixed(0)} %` : "",
    counted ? `${counted.statements} (HTTP ${counted.status})` : "—",
    String(non2xx),
    c.target,
  ]);
}

const header = ["case", "req/s", "p50 ms", "p99 ms", "of bare", "SQL/request", "non-2xx", "target"];
const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i]!)).join("  ");
console.log(`\nAPI benchmark: 10 connections, ${seconds} s each, loopback, ${new Date().toISOString()}\n`);
console.log(line(header));
console.log(widths.map((w) => "-".repeat(w)).join("  "));
for (const r of rows) console.log(line(r));
console.log();

app.server.close();
bareServer.server.close();
await closeDatabase();
if (pgState.startedHere) stopCluster(pgState.binDir, cluster.dataDir);
process.exit(0);
