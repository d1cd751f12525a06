/**
 * A query cut off by the database going away (issue 10, point 2): "terminating connection due
 * to administrator command" (SQLSTATE 57P01, what a `pg_ctl stop -m fast` sends every backend)
 * and a connection lost mid-query (pg's "Connection terminated unexpectedly") are a 503 with
 * Retry-After, like a database that does not answer at all, never a 500.
 *
 * The app's pool reaches PostgreSQL through a TCP relay set up before the pool is made, so a
 * test can drop every connection while a query runs. A second, direct
 * connection holds a table lock so that the request's query is still running when its
 * connection is ended.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import express from "express";
import net from "node:net";
import pg from "pg";
import request from "supertest";
import { ConnectionError, DatabaseError } from "sequelize";
import { createApp } from "../../server/app";
import { env } from "../../server/config/env";
import { errorHandler } from "../../server/middleware/error-handler";

const direct = process.env.DATABASE_URL!;

/** A relay to PostgreSQL that can drop every open connection and goes on accepting new ones. */
async function databaseRelay(target: URL) {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((client) => {
    const upstream = net.connect(Number(target.port), target.hostname);
    sockets.add(client).add(upstream);
    client.pipe(upstream).pipe(client);
    const drop = () => {
      client.destroy();
      upstream.destroy();
      sockets.delete(client);
      sockets.delete(upstream);
    };
    client.on("error", drop).on("close", drop);
    upstream.on("error", drop).on("close", drop);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  return {
    port: (server.address() as net.AddressInfo).port,
    dropAll: () => {
      for (const s of sockets) s.destroy();
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

const relay = await databaseRelay(new URL(direct));
const viaRelay = new URL(direct);
viaRelay.port = String(relay.port);
// The configuration is read once (the logger already has); the pool is made on first use,
// after this file is loaded, so pointing the read configuration at the relay is enough.
env().DATABASE_URL = viaRelay.toString();
const app = createApp({ requestLogging: false });

let admin: pg.Client;
beforeAll(async () => {
  admin = new pg.Client({ connectionString: direct });
  await admin.connect();
});
afterAll(async () => {
  await admin.end();
  await relay.close();
});

/**
 * Starts GET /api/public/digesters while another connection holds the digesters table, and
 * resolves once the app's query waits on that lock (its backend pid). Returns the pending
 * answer and the lock holder, to release afterwards.
 */
async function requestStuckOnLock() {
  const holder = new pg.Client({ connectionString: direct });
  await holder.connect();
  const holderPid = (await holder.query<{ pid: number }>("SELECT pg_backend_pid() AS pid")).rows[0]!.pid;
  await holder.query("BEGIN");
  await holder.query("LOCK TABLE digesters IN ACCESS EXCLUSIVE MODE");
  const answer = request(app)
    .get("/api/public/digesters")
    .then((res) => res);
  const deadline = Date.now() + 15_000;
  let pid: number | undefined;
  while (pid === undefined) {
    if (Date.now() > deadline) throw new Error("the request's query never waited on the lock");
    const { rows } = await admin.query<{ pid: number }>(
      `SELECT pid FROM pg_stat_activity
        WHERE datname = current_database() AND wait_event_type = 'Lock' AND pid <> $1 AND query ILIKE '%digesters%'`,
      [holderPid],
    );
    pid = rows[0]?.pid;
    if (pid === undefined) await new Promise((r) => setTimeout(r, 25));
  }
  return {
    answer,
    pid,
    release: async () => {
      await holder.query("ROLLBACK");
      await holder.end();
    },
  };
}

describe("a query cut off by the database", () => {
  it("when the server terminates the query's connection (57P01, as at a fast shutdown), then it is 503 with Retry-After and the next request works", async () => {
    expect((await request(app).get("/api/public/digesters")).status).toBe(200);
    const stuck = await requestStuckOnLock();
    try {
      await admin.query("SELECT pg_terminate_backend($1)", [stuck.pid]);
      const res = await stuck.answer;
      expect(res.status).toBe(503);
      expect(res.headers["retry-after"]).toBe("5");
      expect(res.body.error.code).toBe("database_unavailable");
    } finally {
      await stuck.release();
    }
    expect((await request(app).get("/api/public/digesters")).status).toBe(200);
  });

  it("when the connection is lost in the middle of a query, then it is 503 with Retry-After and the next request works", async () => {
    const stuck = await requestStuckOnLock();
    try {
      relay.dropAll();
      const res = await stuck.answer;
      expect(res.status).toBe(503);
      expect(res.headers["retry-after"]).toBe("5");
      expect(res.body.error.code).toBe("database_unavailable");
    } finally {
      await stuck.release();
    }
    expect((await request(app).get("/api/public/digesters")).status).toBe(200);
  });
});

describe("which database errors mean 'down'", () => {
  /** An app whose one route fails with `err`, answered by the real error handler. */
  function failingWith(err: Error) {
    const mini = express();
    mini.get("/x", () => {
      throw err;
    });
    mini.use(errorHandler);
    return mini;
  }
  const pgError = (code: string | undefined, message: string) => Object.assign(new Error(message), { code });

  // SQLSTATEs from the PostgreSQL 15 manual, Appendix A (class 57 operator intervention, class 08 connection exception).
  it.each([
    ["57P01", "terminating connection due to administrator command"],
    ["57P02", "terminating connection due to crash of another server process"],
    ["57P03", "the database system is shutting down"],
    ["08006", "connection failure"],
    ["08003", "connection does not exist"],
    [undefined, "Connection terminated unexpectedly"],
    [undefined, "Connection terminated"],
  ])("when a query fails with %s (%s), then it is 503 database_unavailable", async (code, message) => {
    const res = await request(failingWith(new DatabaseError(pgError(code, message) as never))).get("/x");
    expect(res.status).toBe(503);
    expect(res.headers["retry-after"]).toBe("5");
    expect(res.body.error.code).toBe("database_unavailable");
  });

  it("when a query fails for a reason of its own (a constraint, bad SQL), then it stays a 500 without internals", async () => {
    const res = await request(
      failingWith(new DatabaseError(pgError("23514", 'new row violates check constraint "x"') as never)),
    ).get("/x");
    expect(res.status).toBe(500);
    expect(res.text).not.toContain("constraint");
    expect((await request(failingWith(new ConnectionError(new Error("refused")))).get("/x")).status).toBe(503);
  });
});
