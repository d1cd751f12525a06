/**
 * Process-level reliability (QUALITY.md): graceful shutdown on SIGTERM, and surviving a
 * database outage. The server runs as a real child process; a TCP relay between it and
 * PostgreSQL plays the database going away and coming back.
 */
import { afterEach, describe, expect, it } from "vitest";
import net from "node:net";
import { killServerProcesses, startServerProcess as startServer } from "../helpers/server-process";

const servers: net.Server[] = [];

afterEach(async () => {
  killServerProcesses();
  for (const s of servers.splice(0)) s.close();
});

function listen(server: net.Server, port = 0): Promise<number> {
  return new Promise((resolve) =>
    server.listen(port, "127.0.0.1", () => resolve((server.address() as net.AddressInfo).port)),
  );
}

/** A relay to PostgreSQL that can drop every connection and refuse new ones, then come back. */
async function databaseRelay(target: URL) {
  const sockets = new Set<net.Socket>();
  const make = () =>
    net.createServer((client) => {
      const upstream = net.connect(Number(target.port), target.hostname);
      sockets.add(client).add(upstream);
      client.pipe(upstream).pipe(client);
      const drop = () => {
        client.destroy();
        upstream.destroy();
      };
      client.on("error", drop).on("close", drop);
      upstream.on("error", drop).on("close", drop);
    });
  let server = make();
  servers.push(server);
  const port = await listen(server);
  return {
    port,
    down: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      for (const s of sockets) s.destroy();
      sockets.clear();
    },
    up: async () => {
      server = make();
      servers.push(server);
      await listen(server, port);
    },
  };
}

describe("graceful shutdown", () => {
  it("when SIGTERM arrives during a request, then the request finishes and the process exits 0 within 10 s", async () => {
    // An SMTP peer that accepts and never greets makes the health check wait on mail (about 1.5 s).
    const silentSmtp = net.createServer(() => undefined);
    servers.push(silentSmtp);
    const smtpPort = await listen(silentSmtp);
    const { child, port } = await startServer({ SMTP_URL: `smtp://127.0.0.1:${smtpPort}` });
    const inFlight = fetch(`http://127.0.0.1:${port}/api/health`);
    await new Promise((r) => setTimeout(r, 300));
    const started = Date.now();
    const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
    child.kill("SIGTERM");
    const res = await inFlight;
    expect(res.status).toBe(200);
    expect((await res.json()).mail).toBe("down");
    expect(await exited).toBe(0);
    expect(Date.now() - started).toBeLessThan(10_000);
  });
});

describe("database restart", () => {
  it("when the database goes away, then requests fail fast with 503 and recover within 10 s after it returns", async () => {
    const target = new URL(process.env.DATABASE_URL!);
    const relay = await databaseRelay(target);
    const viaRelay = new URL(target);
    viaRelay.port = String(relay.port);
    const { child, port } = await startServer({ DATABASE_URL: viaRelay.toString() });
    const url = `http://127.0.0.1:${port}/api/public/digesters`;
    expect((await fetch(url)).status).toBe(200);

    await relay.down();
    const t0 = Date.now();
    const during = await fetch(url);
    expect(during.status).toBe(503);
    expect((await during.json()).error.code).toBe("database_unavailable");
    expect(Date.now() - t0).toBeLessThan(5_000);
    expect((await fetch(`http://127.0.0.1:${port}/api/health`)).status).toBe(503);

    await relay.up();
    const back = Date.now();
    let status = 0;
    while (Date.now() - back < 10_000) {
      status = (await fetch(url)).status;
      if (status === 200) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
    expect(child.exitCode).toBeNull();
  });
});
