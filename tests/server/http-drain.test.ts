/**
 * server/lib/http-drain.ts on a plain Node HTTP server: the cases the process drill cannot time
 * exactly (a request that arrives on an idle keep-alive connection after the drain began, a
 * client that keeps its connection open, an answer whose headers went out before the drain).
 */
import { afterEach, describe, expect, it } from "vitest";
import http from "node:http";
import net from "node:net";
import { httpDrain } from "../../server/lib/http-drain";

const servers: http.Server[] = [];
afterEach(() => {
  for (const s of servers.splice(0)) s.closeAllConnections();
});

async function serve(handler: http.RequestListener, idleGraceMs = 300) {
  const server = http.createServer();
  const drain = httpDrain(server, { idleGraceMs });
  server.on("request", handler);
  servers.push(server);
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  return { server, drain, port: (server.address() as net.AddressInfo).port };
}

/** A raw keep-alive connection: write requests by hand, read what comes back. */
async function rawConnection(port: number) {
  const socket = net.connect(port, "127.0.0.1");
  await new Promise<void>((resolve) => socket.once("connect", () => resolve()));
  let received = "";
  socket.on("data", (d) => (received += String(d)));
  const ended = new Promise<"end" | "reset">((resolve) => {
    socket.once("end", () => resolve("end"));
    socket.once("error", () => resolve("reset"));
  });
  return {
    socket,
    ended,
    received: () => received,
    get: (path: string) => socket.write(`GET ${path} HTTP/1.1\r\nHost: drill\r\nConnection: keep-alive\r\n\r\n`),
  };
}

const ok: http.RequestListener = (req, res) => res.end(`ok ${req.url}`);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("draining an HTTP server", () => {
  it("when a request arrives on an idle keep-alive connection after the drain began, then it is answered with Connection: close and the connection ends cleanly", async () => {
    const { drain, port } = await serve(ok);
    const c = await rawConnection(port);
    c.get("/first");
    await sleep(50);
    expect(c.received()).toMatch(/keep-alive/i);

    const drained = drain.drain();
    await sleep(100);
    c.get("/second");
    expect(await c.ended).toBe("end");
    expect(c.received()).toContain("ok /second");
    expect(c.received().split("HTTP/1.1 200").pop()).toMatch(/connection: close/i);
    await drained;
  });

  it("when the drain begins, then new connections are refused", async () => {
    const { drain, port } = await serve(ok);
    void drain.drain();
    const error = await new Promise<NodeJS.ErrnoException>((resolve) =>
      net.connect(port, "127.0.0.1").once("error", resolve),
    );
    expect(error.code).toBe("ECONNREFUSED");
  });

  it("when a client keeps an idle connection open and sends nothing, then the drain ends it after the grace period", async () => {
    const { drain, port } = await serve(ok, 200);
    const c = await rawConnection(port);
    c.get("/only");
    await sleep(50);
    const t0 = Date.now();
    const drained = drain.drain();
    expect(await c.ended).toBe("end");
    expect(Date.now() - t0).toBeGreaterThanOrEqual(150);
    c.socket.end();
    await drained;
    expect(drain.stats()).toEqual({ connections: 0, requests: 0 });
  });

  it("when a request is being answered as the drain begins, then its answer completes and says Connection: close before the connection ends", async () => {
    let release: () => void = () => undefined;
    const { drain, port } = await serve((req, res) => {
      if (req.url === "/slow") release = () => res.end("slow done");
      else res.end("fast");
    });
    const c = await rawConnection(port);
    c.get("/slow");
    await sleep(50);
    expect(drain.stats()).toEqual({ connections: 1, requests: 1 });
    const drained = drain.drain();
    await sleep(50);
    expect(c.received()).toBe("");
    release();
    expect(await c.ended).toBe("end");
    expect(c.received()).toContain("slow done");
    expect(c.received()).toMatch(/connection: close/i);
    await drained;
  });

  it("when the deadline passes with a request still running, then destroyAll cuts it and counts it", async () => {
    const { drain, port } = await serve(() => undefined);
    const c = await rawConnection(port);
    c.get("/never");
    await sleep(50);
    const drained = drain.drain();
    expect(drain.destroyAll()).toBe(1);
    await drained;
    expect(drain.stats()).toEqual({ connections: 0, requests: 0 });
    expect(c.received()).toBe("");
  });
});
