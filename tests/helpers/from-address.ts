/**
 * Clients that connect from their own loopback address (anything in 127.0.0.0/8 reaches the
 * app on Linux), to be "another IP" for per-IP and per-account limits, with a cookie jar of
 * their own (session, visitor CSRF and known-device cookies).
 *
 * ```ts
 * const server = await listen(app);
 * const phone = server.clientAt(nextLoopbackAddress());
 * const res = await phone.post("/api/auth/login", { email, password }); // fetches a CSRF token first
 * await server.close();
 * ```
 */
import http from "node:http";
import type { AddressInfo } from "node:net";
import type { Express } from "express";

export interface AddressResponse {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: any; // eslint-disable-line @typescript-eslint/no-explicit-any -- JSON from the app, checked by each test
  /** Milliseconds from sending to the end of the answer. */
  ms: number;
}

export interface AddressClient {
  readonly address: string;
  get(path: string): Promise<AddressResponse>;
  /** A state-changing request with the CSRF token of this client's current session or visitor cookie. */
  post(path: string, body?: unknown): Promise<AddressResponse>;
  /** The value of a cookie this client holds, if any. */
  cookie(name: string): string | undefined;
  /** Forgets every cookie (a fresh browser on the same address). */
  clearCookies(): void;
}

let next = 0;
/** A loopback address no other call in this process has handed out (127.1.0.1, 127.1.0.2, …). */
export function nextLoopbackAddress(): string {
  next += 1;
  return `127.${1 + Math.floor(next / 62_500)}.${Math.floor((next % 62_500) / 250)}.${1 + (next % 250)}`;
}

export async function listen(app: Express) {
  const server = app.listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  const port = (server.address() as AddressInfo).port;
  return {
    clientAt: (address: string) => clientAt(port, address),
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

function clientAt(port: number, localAddress: string): AddressClient {
  const jar = new Map<string, string>();
  const send = (method: string, path: string, body?: unknown, token?: string) =>
    new Promise<AddressResponse>((resolve, reject) => {
      const payload = body === undefined ? undefined : JSON.stringify(body);
      const cookie = [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
      const t0 = performance.now();
      const req = http.request(
        {
          host: "127.0.0.1",
          port,
          path,
          method,
          localAddress,
          agent: false,
          headers: {
            Accept: "application/json",
            ...(cookie ? { Cookie: cookie } : {}),
            ...(token ? { "x-csrf-token": token } : {}),
            ...(payload ? { "Content-Type": "application/json", "Content-Length": Buffer.byteLength(payload) } : {}),
          },
        },
        (res) => {
          let text = "";
          res.on("data", (d) => (text += String(d)));
          res.on("end", () => {
            const ms = performance.now() - t0;
            for (const set of res.headers["set-cookie"] ?? []) {
              const [pair, ...attributes] = set.split(";");
              const eq = pair!.indexOf("=");
              const name = pair!.slice(0, eq).trim();
              const value = pair!.slice(eq + 1).trim();
              const expired = attributes.some((a) => /^\s*expires=thu, 01 jan 1970/i.test(a));
              if (expired || value === "") jar.delete(name);
              else jar.set(name, value);
            }
            resolve({
              status: res.statusCode ?? 0,
              headers: res.headers,
              body: text ? JSON.parse(text) : undefined,
              ms,
            });
          });
        },
      );
      req.on("error", reject);
      req.end(payload);
    });
  return {
    address: localAddress,
    get: (path) => send("GET", path),
    post: async (path, body) => {
      const csrf = await send("GET", "/api/auth/csrf");
      return send("POST", path, body, (csrf.body as { token: string }).token);
    },
    cookie: (name) => jar.get(name),
    clearCookies: () => jar.clear(),
  };
}
