import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import http from "node:http";
import type { AddressInfo } from "node:net";
import request from "supertest";
import { createApp } from "../../server/app";
import { parseEnv } from "../../server/config/env";
import { securityLogger } from "../../server/lib/security-log";
import {
  ABSOLUTE_TIMEOUT_MS,
  IDLE_TIMEOUT_MS,
  sessionCookieSettings,
  TOUCH_INTERVAL_MS,
} from "../../server/middleware/session";
import { deliverDueEmails } from "../../server/modules/outbox/outbox.service";
import { SIGN_IN_MAX_FAILURES } from "../../server/modules/auth/sign-in-throttle";
import { pruneExpired } from "../../server/modules/auth/housekeeping.service";
import { processResetRequests } from "../../server/modules/auth/auth.service";
import {
  assertOwnHousehold,
  assertOwnRecord,
  assertStewardOf,
  canManageDigester,
} from "../../server/middleware/require-role";
import type { Caller } from "../../server/middleware/handle";
import {
  anonymousClient,
  clientFor,
  createDigester,
  createPerson,
  csrfToken,
  sessionIdFromCookies,
  signIn,
  sql,
  TEST_PASSWORD,
  uniqueEmail,
} from "../helpers/db";
import { ensureMailDev, tokenIn, waitForMails } from "../helpers/mail";

const app = createApp({ requestLogging: false });
let mail: { stop: () => Promise<void> };

beforeAll(async () => {
  mail = await ensureMailDev();
});

afterAll(async () => {
  await mail.stop();
});

afterEach(() => {
  vi.restoreAllMocks();
});

async function sessionRow(sid: string | undefined) {
  return sql<{ sid: string; sess: Record<string, unknown>; expire: Date }>(
    `SELECT sid, sess, expire FROM sessions WHERE sid = $1`,
    [sid],
  );
}

/** Logs in by hand (not through the helper) to see the raw response. */
async function login(agent: ReturnType<typeof request.agent>, email: string, password: string) {
  const token = await csrfToken(agent);
  return agent.post("/api/auth/login").set("x-csrf-token", token).send({ email, password });
}

describe("POST /api/auth/login", () => {
  it("when the e-mail and password are right, then it answers 200 with the person and an HttpOnly, SameSite=Lax session cookie", async () => {
    const digester = await createDigester();
    const person = await createPerson({ roles: ["steward", "resident"], stewardOf: [digester.id] });
    const res = await login(request.agent(app), person.email.toUpperCase(), TEST_PASSWORD);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      id: person.id,
      email: person.email,
      name: person.name,
      roles: ["steward", "resident"],
      stewardOf: [digester.id],
      householdId: null,
    });
    expect(JSON.stringify(res.body)).not.toMatch(/argon2|password/i);
    // The client starts its session-expiry clock from this header.
    expect(Number(res.headers["x-session-expires-in"])).toBeGreaterThan(1730);
    const cookie = String(res.headers["set-cookie"]);
    expect(cookie).toMatch(/^hearthloop\.sid=/);
    expect(cookie).not.toContain("connect.sid");
    expect(cookie).toContain("HttpOnly");
    expect(cookie).toContain("SameSite=Lax");
    // Not in production: browsers would drop a Secure cookie over plain http on loopback.
    expect(cookie).not.toContain("Secure");
  });

  it("when the app runs in production, then the cookie is __Host-hearthloop.sid, Secure, HttpOnly, SameSite=Lax, Path=/", () => {
    const production = parseEnv({ NODE_ENV: "production", SESSION_SECRET: "a-production-secret-of-forty-characters!" });
    const settings = sessionCookieSettings(production);
    expect(settings.name).toBe("__Host-hearthloop.sid");
    expect(settings.cookie).toEqual({ httpOnly: true, sameSite: "lax", secure: true, path: "/" });
  });

  it("when the password is wrong or the account unknown, then both answer 401 with the same body", async () => {
    const person = await createPerson();
    const wrong = await login(request.agent(app), person.email, "not-the-password");
    const unknown = await login(request.agent(app), uniqueEmail("nobody"), "not-the-password");
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe("invalid_credentials");
    // Nobody is signed in, so nothing is stored: no session cookie, no row (issue 10, point 7).
    expect(sessionIdFromCookies(wrong.headers["set-cookie"])).toBeUndefined();
    expect(sessionIdFromCookies(unknown.headers["set-cookie"])).toBeUndefined();
  });

  it("when the password is wrong or the account unknown, then both take a similar time", async () => {
    // QUALITY.md asks for "similar time"; we accept medians within a factor of 2 [judgement].
    const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
    const people = await Promise.all([1, 2, 3, 4, 5].map(() => createPerson()));
    const agent = request.agent(app);
    const token = await csrfToken(agent);
    const time = async (email: string) => {
      const t0 = performance.now();
      const res = await agent
        .post("/api/auth/login")
        .set("x-csrf-token", token)
        .send({ email, password: "not-the-password" });
      expect(res.status).toBe(401);
      return performance.now() - t0;
    };
    const wrong: number[] = [];
    const unknown: number[] = [];
    for (const person of people) {
      wrong.push(await time(person.email));
      unknown.push(await time(uniqueEmail("nobody")));
    }
    const ratio = median(wrong) / median(unknown);
    expect(ratio).toBeGreaterThan(0.5);
    expect(ratio).toBeLessThan(2);
  });

  it("when the account is disabled or only invited, then sign-in answers the same 401", async () => {
    const disabled = await createPerson({ status: "disabled" });
    const invited = await createPerson({ password: null });
    const a = await login(request.agent(app), disabled.email, TEST_PASSWORD);
    const b = await login(request.agent(app), invited.email, TEST_PASSWORD);
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body).toEqual(b.body);
  });

  it.each([
    ["an extra roles key", { email: "someone@example.org", password: "x", roles: ["coordinator"] }, "roles"],
    ["a malformed e-mail", { email: "not-an-email", password: "whatever-password" }, "email"],
    ["an empty password", { email: "someone@example.org", password: "" }, "password"],
    ["a 10,000-character password", { email: "someone@example.org", password: "p".repeat(10_000) }, "password"],
    ["a 312-character e-mail", { email: "x".repeat(300) + "@example.org", password: "whatever-password" }, "email"],
    ["no password", { email: "someone@example.org" }, "password"],
  ])("when the body has %s, then it answers 400 naming the field", async (_label, body, field) => {
    const client = await anonymousClient(app);
    const res = await client.post("/api/auth/login").send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("invalid_input");
    expect(Object.keys(res.body.error.fields)).toContain(field);
  });

  it("when someone signs in, then the session gets a new id: a visitor has no row to reuse, and a session already in the browser is replaced and its row deleted", async () => {
    const person = await createPerson();
    const other = await createPerson();
    const agent = request.agent(app);
    const csrf = await agent.get("/api/auth/csrf");
    // A visitor's token is a signed cookie pair: no session id, no row (issue 10, point 7).
    expect(sessionIdFromCookies(csrf.headers["set-cookie"])).toBeUndefined();
    const res = await agent
      .post("/api/auth/login")
      .set("x-csrf-token", csrf.body.token)
      .send({ email: person.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const firstSid = sessionIdFromCookies(res.headers["set-cookie"]);
    expect(firstSid).toBeDefined();
    const [row] = await sessionRow(firstSid);
    expect((row!.sess.passport as { user: number }).user).toBe(person.id);
    // The visitor's CSRF token belonged to no session and no longer works once someone is signed in.
    const stale = await agent.post("/api/auth/session").set("x-csrf-token", csrf.body.token).send({});
    expect(stale.status).toBe(403);

    // Signing in over an existing session (fixation defence): a new id, the old row gone.
    const firstToken = await csrfToken(agent);
    const again = await agent
      .post("/api/auth/login")
      .set("x-csrf-token", firstToken)
      .send({ email: other.email, password: TEST_PASSWORD });
    expect(again.status).toBe(200);
    const secondSid = sessionIdFromCookies(again.headers["set-cookie"]);
    expect(secondSid).toBeDefined();
    expect(secondSid).not.toBe(firstSid);
    expect(await sessionRow(firstSid)).toHaveLength(0);
    const [second] = await sessionRow(secondSid);
    expect((second!.sess.passport as { user: number }).user).toBe(other.id);
    expect((await agent.post("/api/auth/session").set("x-csrf-token", firstToken).send({})).status).toBe(403);
  });
});

describe("GET /api/auth/me and POST /api/auth/logout", () => {
  it("when nobody is signed in, then /me answers 401", async () => {
    const res = await request(app).get("/api/auth/me");
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe("unauthenticated");
  });

  it("when signed in, then /me answers the login shape with Cache-Control no-store", async () => {
    const person = await createPerson({ roles: ["gardener"] });
    const client = await clientFor(app, person);
    const res = await client.get("/api/auth/me");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      id: person.id,
      email: person.email,
      name: person.name,
      roles: ["gardener"],
      stewardOf: [],
      householdId: null,
    });
    expect(res.headers["cache-control"]).toBe("no-store");
  });

  it("when someone signs out, then it answers 204, deletes the session row, and the old cookie is worthless", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const res = await login(agent, person.email, TEST_PASSWORD);
    const sid = sessionIdFromCookies(res.headers["set-cookie"]);
    const cookie = String(res.headers["set-cookie"]).split(";")[0]!;
    const token = await csrfToken(agent);
    expect(await sessionRow(sid)).toHaveLength(1);
    const out = await agent.post("/api/auth/logout").set("x-csrf-token", token);
    expect(out.status).toBe(204);
    expect(await sessionRow(sid)).toHaveLength(0);
    const replay = await request(app).get("/api/auth/me").set("Cookie", cookie);
    expect(replay.status).toBe(401);
  });
});

describe("session lifetime", () => {
  it("when signed in, then the session row expires 30 minutes ahead and /api/auth/session reports the time left", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const res = await login(agent, person.email, TEST_PASSWORD);
    const sid = sessionIdFromCookies(res.headers["set-cookie"]);
    const [row] = await sessionRow(sid);
    const leftMs = new Date(row!.expire).getTime() - Date.now();
    expect(leftMs).toBeGreaterThan(IDLE_TIMEOUT_MS - 60_000);
    expect(leftMs).toBeLessThanOrEqual(IDLE_TIMEOUT_MS + 1_000);
    const info = await agent.get("/api/auth/session");
    expect(info.status).toBe(200);
    // 30 minutes, less the minute by which the row's expiry may lag (TOUCH_INTERVAL_MS).
    expect(info.body.idleTimeoutSeconds).toBe(1740);
    expect(info.body.expiresInSeconds).toBeGreaterThan(1730);
    expect(Number(info.headers["x-session-expires-in"])).toBeGreaterThan(1730);
    expect(new Date(info.body.absoluteExpiresAt).getTime() - Date.now()).toBeGreaterThan(ABSOLUTE_TIMEOUT_MS - 60_000);
  });

  it("when the session has been idle past its expiry, then the person is signed out", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const res = await login(agent, person.email, TEST_PASSWORD);
    const sid = sessionIdFromCookies(res.headers["set-cookie"]);
    await sql(`UPDATE sessions SET expire = now() - interval '1 second' WHERE sid = $1 RETURNING sid`, [sid]);
    expect((await agent.get("/api/auth/me")).status).toBe(401);
  });

  it("when requests follow each other within a minute, then the row's expiry is not rewritten each time", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const res = await login(agent, person.email, TEST_PASSWORD);
    const sid = sessionIdFromCookies(res.headers["set-cookie"]);
    await sql(`UPDATE sessions SET expire = now() + interval '20 minutes' WHERE sid = $1 RETURNING sid`, [sid]);
    expect((await agent.get("/api/auth/me")).status).toBe(200);
    const [row] = await sessionRow(sid);
    const leftMs = new Date(row!.expire).getTime() - Date.now();
    // A touch would have moved it to ~30 minutes; the row keeps its 20 for up to TOUCH_INTERVAL_MS.
    expect(leftMs).toBeLessThan(20 * 60_000 + 1_000);
    expect(leftMs).toBeLessThan(IDLE_TIMEOUT_MS - TOUCH_INTERVAL_MS);
  });

  it("when the person presses 'stay signed in', then the idle expiry moves forward", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const res = await login(agent, person.email, TEST_PASSWORD);
    const sid = sessionIdFromCookies(res.headers["set-cookie"]);
    const token = await csrfToken(agent);
    await sql(`UPDATE sessions SET expire = now() + interval '90 seconds' WHERE sid = $1 RETURNING sid`, [sid]);
    const stay = await agent.post("/api/auth/session").set("x-csrf-token", token).send({});
    expect(stay.status).toBe(200);
    const [row] = await sessionRow(sid);
    expect(new Date(row!.expire).getTime() - Date.now()).toBeGreaterThan(IDLE_TIMEOUT_MS - 60_000);
  });

  it("when eight hours have passed since sign-in, then the session ends even though it was used recently", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const res = await login(agent, person.email, TEST_PASSWORD);
    const sid = sessionIdFromCookies(res.headers["set-cookie"]);
    const longAgo = Date.now() - ABSOLUTE_TIMEOUT_MS - 1_000;
    await sql(
      `UPDATE sessions SET sess = jsonb_set(sess::jsonb, '{signedInAt}', to_jsonb($2::bigint))::json WHERE sid = $1 RETURNING sid`,
      [sid, longAgo],
    );
    const spy = vi.spyOn(securityLogger, "info");
    expect((await agent.get("/api/auth/me")).status).toBe(401);
    expect(await sessionRow(sid)).toHaveLength(0);
    expect(spy.mock.calls.some(([line]) => (line as { event?: string }).event === "session_expired")).toBe(true);
  });
});

describe("CSRF protection", () => {
  it("when a state-changing request has no token, a wrong token or another session's token, then it answers 403 in the error shape", async () => {
    const person = await createPerson();
    const client = await clientFor(app, person);
    const other = await anonymousClient(app);
    const spy = vi.spyOn(securityLogger, "info");
    const none = await client.agent.patch("/api/account").send({ name: "Changed" });
    const wrong = await client.agent
      .patch("/api/account")
      .set("x-csrf-token", "0".repeat(64))
      .send({ name: "Changed" });
    const foreign = await client.agent.patch("/api/account").set("x-csrf-token", other.csrf).send({ name: "Changed" });
    for (const res of [none, wrong, foreign]) {
      expect(res.status).toBe(403);
      expect(res.body).toEqual({ error: { code: "csrf_invalid", message: expect.any(String) } });
    }
    const [row] = await sql<{ name: string }>(`SELECT name FROM people WHERE id = $1`, [person.id]);
    expect(row!.name).toBe(person.name);
    const events = spy.mock.calls.map(([line]) => (line as { event?: string }).event);
    expect(events.filter((e) => e === "csrf_rejected")).toHaveLength(3);
  });

  it("when a visitor signs in without a token, then it is refused before any password check", async () => {
    const person = await createPerson();
    const res = await request(app).post("/api/auth/login").send({ email: person.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf_invalid");
  });

  it("when a request goes to the public calculators under /api/calc/, then no token is needed", async () => {
    // No calculator route may exist yet; either way the answer must not be the CSRF refusal.
    const res = await request(app).post("/api/calc/anything").send({});
    expect(res.status).not.toBe(403);
  });
});

describe("anonymous visitors", () => {
  const sessionCount = async () => Number((await sql<{ n: string }>(`SELECT count(*) AS n FROM sessions`))[0]!.n);

  it("when 1,000 visitors without a cookie fetch a CSRF token, then no session row is stored and no session cookie set", async () => {
    const server = app.listen(0, "127.0.0.1");
    await new Promise((r) => server.once("listening", r));
    try {
      const before = await sessionCount();
      let sessionCookies = 0;
      const tokens = new Set<string>();
      for (let i = 0; i < 1_000; i++) {
        const res = await request(server).get("/api/auth/csrf");
        expect(res.status).toBe(200);
        tokens.add(res.body.token);
        if (sessionIdFromCookies(res.headers["set-cookie"])) sessionCookies += 1;
      }
      const after = await sessionCount();
      // Server tests run one file at a time, so nothing else adds sessions meanwhile.
      console.info(`anonymous sessions: ${after - before} rows after 1,000 GET /api/auth/csrf`);
      expect(after - before).toBeLessThanOrEqual(5);
      expect(sessionCookies).toBe(0);
      expect(tokens.size).toBe(1_000);
    } finally {
      await new Promise((r) => server.close(r));
    }
  });

  it("when a visitor's token is sent without the cookie it came with, or with another visitor's cookie, then it is refused", async () => {
    const person = await createPerson();
    const a = await anonymousClient(app);
    const b = await anonymousClient(app);
    const bare = await request(app)
      .post("/api/auth/login")
      .set("x-csrf-token", a.csrf)
      .send({ email: person.email, password: TEST_PASSWORD });
    const crossed = await b.agent
      .post("/api/auth/login")
      .set("x-csrf-token", a.csrf)
      .send({ email: person.email, password: TEST_PASSWORD });
    for (const res of [bare, crossed]) {
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe("csrf_invalid");
    }
    expect(
      await sql(`SELECT 1 FROM sessions WHERE (sess -> 'passport' ->> 'user') = $1`, [String(person.id)]),
    ).toHaveLength(0);
    expect((await a.post("/api/auth/login").send({ email: person.email, password: TEST_PASSWORD })).status).toBe(200);
  });
});

/** A client that connects from another loopback address (127.0.0.2), to be "another IP". */
async function fromAddress(localAddress: string) {
  const server = app.listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  const port = (server.address() as AddressInfo).port;
  let cookie = "";
  const send = (method: string, path: string, body?: unknown, token?: string) =>
    new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: unknown }>((resolve, reject) => {
      const payload = body === undefined ? undefined : JSON.stringify(body);
      const req = http.request(
        {
          host: "127.0.0.1",
          port,
          path,
          method,
          localAddress,
          headers: {
            ...(cookie ? { Cookie: cookie } : {}),
            ...(token ? { "x-csrf-token": token } : {}),
            ...(payload ? { "Content-Type": "application/json", "Content-Length": Buffer.byteLength(payload) } : {}),
          },
        },
        (res) => {
          let text = "";
          res.on("data", (d) => (text += String(d)));
          res.on("end", () => {
            const set = res.headers["set-cookie"]?.[0];
            if (set) cookie = set.split(";")[0]!;
            resolve({ status: res.statusCode ?? 0, headers: res.headers, body: text ? JSON.parse(text) : undefined });
          });
        },
      );
      req.on("error", reject);
      req.end(payload);
    });
  return {
    login: async (email: string, password: string) => {
      const csrf = (await send("GET", "/api/auth/csrf")).body as { token: string };
      return send("POST", "/api/auth/login", { email, password }, csrf.token);
    },
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

describe("sign-in throttling", () => {
  it("when an account fails 5 times from one IP, then the next attempt gets 429 with Retry-After, even with the right password", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const token = await csrfToken(agent);
    for (let i = 0; i < SIGN_IN_MAX_FAILURES; i++) {
      const res = await agent
        .post("/api/auth/login")
        .set("x-csrf-token", token)
        .send({ email: person.email, password: `wrong-${i}-password` });
      expect(res.status).toBe(401);
    }
    const spy = vi.spyOn(securityLogger, "info");
    const blocked = await agent
      .post("/api/auth/login")
      .set("x-csrf-token", token)
      .send({ email: person.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe("too_many_attempts");
    const retryAfter = Number(blocked.headers["retry-after"]);
    expect(retryAfter).toBeGreaterThan(14 * 60);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    expect(spy.mock.calls.some(([line]) => (line as { event?: string }).event === "sign_in_throttled")).toBe(true);
  });

  it("when one account is locked for an IP, then another account from that IP and the same account from another IP still sign in", async () => {
    const locked = await createPerson();
    const neighbour = await createPerson();
    const agent = request.agent(app);
    const token = await csrfToken(agent);
    for (let i = 0; i <= SIGN_IN_MAX_FAILURES; i++) {
      await agent
        .post("/api/auth/login")
        .set("x-csrf-token", token)
        .send({ email: locked.email, password: `wrong-${i}-password` });
    }
    expect((await login(request.agent(app), locked.email, TEST_PASSWORD)).status).toBe(429);
    expect((await login(request.agent(app), neighbour.email, TEST_PASSWORD)).status).toBe(200);
    const elsewhere = await fromAddress("127.0.0.2");
    try {
      const res = await elsewhere.login(locked.email, TEST_PASSWORD);
      expect(res.status).toBe(200);
    } finally {
      await elsewhere.close();
    }
  });

  it("when requests are refused for a missing field or CSRF, then they do not count as failed sign-ins", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const token = await csrfToken(agent);
    for (let i = 0; i < SIGN_IN_MAX_FAILURES + 2; i++) {
      expect(
        (await agent.post("/api/auth/login").set("x-csrf-token", token).send({ email: person.email })).status,
      ).toBe(400);
    }
    // The limiter takes back non-failures after the response; give that write a moment.
    await new Promise((r) => setTimeout(r, 100));
    expect((await login(agent, person.email, TEST_PASSWORD)).status).toBe(200);
  });
});

describe("security log", () => {
  it("when people sign in and fail, then one line each names the event, request id, IP and e-mail, and never the password, cookie or token", async () => {
    const person = await createPerson();
    const spy = vi.spyOn(securityLogger, "info");
    const agent = request.agent(app);
    const token = await csrfToken(agent);
    await agent
      .post("/api/auth/login")
      .set("x-csrf-token", token)
      .send({ email: person.email, password: "a-wrong-password" });
    const ok = await agent
      .post("/api/auth/login")
      .set("x-csrf-token", token)
      .send({ email: person.email, password: TEST_PASSWORD });
    const lines = spy.mock.calls.map(([line]) => line as Record<string, unknown>);
    const failed = lines.filter((l) => l.event === "sign_in_failed");
    const succeeded = lines.filter((l) => l.event === "sign_in_succeeded");
    expect(failed).toHaveLength(1);
    expect(succeeded).toHaveLength(1);
    expect(failed[0]).toMatchObject({
      email: person.email,
      reason: "wrong_password",
      ip: expect.stringContaining("127.0.0.1"),
    });
    expect(succeeded[0]).toMatchObject({ userId: person.id, reqId: expect.stringMatching(/^[0-9a-f-]{36}$/) });
    const sid = sessionIdFromCookies(ok.headers["set-cookie"])!;
    const written = JSON.stringify(spy.mock.calls);
    for (const secret of [TEST_PASSWORD, "a-wrong-password", token, sid, String(ok.headers["set-cookie"])]) {
      expect(written).not.toContain(secret);
    }
  });

  it("when a resident asks for a coordinator route, then a 'forbidden' line names the user, method and path", async () => {
    const resident = await createPerson({ roles: ["resident"] });
    const client = await clientFor(app, resident);
    const spy = vi.spyOn(securityLogger, "info");
    expect((await client.get("/api/people")).status).toBe(403);
    const lines = spy.mock.calls.map(([line]) => line as Record<string, unknown>);
    expect(lines).toEqual([
      expect.objectContaining({ event: "forbidden", userId: resident.id, method: "GET", path: "/api/people" }),
    ]);
  });
});

describe("password reset", () => {
  it("when a reset is asked for, then it is 202 either way and only a real account gets an e-mail, through the outbox", async () => {
    const person = await createPerson();
    const nobody = uniqueEmail("nobody");
    const client = await anonymousClient(app);
    const a = await client.post("/api/auth/password-reset").send({ email: person.email });
    const b = await client.post("/api/auth/password-reset").send({ email: nobody });
    expect(a.status).toBe(202);
    expect(b.status).toBe(202);
    expect(a.body).toEqual(b.body);
    // The answer only stores the request; the link and e-mail come after it (issue 10, point 6).
    await processResetRequests();
    expect(
      await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1 AND status = 'pending'`, [person.email]),
    ).toHaveLength(1);
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [nobody])).toHaveLength(0);
    const [reset] = await sql<{ token_hash: string; expires_at: Date }>(
      `SELECT token_hash, expires_at FROM password_resets WHERE person_id = $1`,
      [person.id],
    );
    expect(reset!.token_hash).toMatch(/^[0-9a-f]{64}$/);
    const ttlMs = new Date(reset!.expires_at).getTime() - Date.now();
    expect(ttlMs).toBeGreaterThan(59 * 60_000);
    expect(ttlMs).toBeLessThanOrEqual(60 * 60_000);
  });

  it("when the link from the e-mail is used, then the new password works, the old one and all sessions end, and the link works once", async () => {
    const person = await createPerson();
    const before = await clientFor(app, person);
    const client = await anonymousClient(app);
    await client.post("/api/auth/password-reset").send({ email: person.email });
    await processResetRequests();
    await deliverDueEmails();
    const [message] = await waitForMails(person.email);
    expect(message!.subject).toBe("Reset your Hearthloop password");
    const token = tokenIn(message!, "/reset-password/");
    expect(message!.text).not.toContain(TEST_PASSWORD);
    // Only a hash is stored: the token itself is nowhere in the database.
    expect(await sql(`SELECT 1 FROM password_resets WHERE token_hash = $1`, [token])).toHaveLength(0);

    expect((await client.get(`/api/auth/password-reset/${token}`)).status).toBe(204);
    const common = await client.post(`/api/auth/password-reset/${token}`).send({ password: "password123" });
    expect(common.status).toBe(400);
    expect(common.body.error.fields.password).toMatch(/common/);
    const done = await client.post(`/api/auth/password-reset/${token}`).send({ password: "a-brand-new-passphrase" });
    expect(done.status).toBe(204);

    expect((await before.get("/api/auth/me")).status).toBe(401);
    expect((await login(request.agent(app), person.email, TEST_PASSWORD)).status).toBe(401);
    expect((await login(request.agent(app), person.email, "a-brand-new-passphrase")).status).toBe(200);
    const again = await client.post(`/api/auth/password-reset/${token}`).send({ password: "another-new-passphrase" });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe("link_expired");
  });

  it("when a reset link is over an hour old or unknown, then it is refused and nothing changes", async () => {
    const person = await createPerson();
    const client = await anonymousClient(app);
    await client.post("/api/auth/password-reset").send({ email: person.email });
    await processResetRequests();
    await sql(`UPDATE password_resets SET expires_at = now() - interval '1 second' WHERE person_id = $1 RETURNING id`, [
      person.id,
    ]);
    await deliverDueEmails();
    const [message] = await waitForMails(person.email);
    const token = tokenIn(message!, "/reset-password/");
    const expired = await client.post(`/api/auth/password-reset/${token}`).send({ password: "a-brand-new-passphrase" });
    expect(expired.status).toBe(410);
    expect(expired.body.error.message).toMatch(/expired/);
    const unknown = await client
      .post(`/api/auth/password-reset/${"A".repeat(43)}`)
      .send({ password: "a-brand-new-passphrase" });
    expect(unknown.status).toBe(404);
    const malformed = await client.post(`/api/auth/password-reset/short`).send({ password: "a-brand-new-passphrase" });
    expect(malformed.status).toBe(400);
    expect((await login(request.agent(app), person.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("when someone asks again and again, then at most three reset e-mails per hour are queued", async () => {
    const person = await createPerson();
    const client = await anonymousClient(app);
    for (let i = 0; i < 5; i++)
      expect((await client.post("/api/auth/password-reset").send({ email: person.email })).status).toBe(202);
    await processResetRequests();
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [person.email])).toHaveLength(3);
  });
});

describe("object-level guards for services", () => {
  const caller = (roles: string[], extra: Partial<Caller> = {}): Caller => ({
    id: 7,
    email: "x@example.org",
    name: "X",
    roles,
    stewardOf: [],
    householdId: null,
    ...extra,
  });

  it("when a steward acts on a digester, then only their own pass; coordinators pass unless excluded", () => {
    const steward = caller(["steward"], { stewardOf: [3] });
    expect(() => assertStewardOf(steward, 3)).not.toThrow();
    expect(() => assertStewardOf(steward, 4)).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => assertStewardOf(caller(["resident"], { stewardOf: [3] }), 3)).toThrow(
      expect.objectContaining({ status: 403 }),
    );
    expect(canManageDigester(caller(["coordinator"]), 4)).toBe(true);
    expect(() => assertStewardOf(caller(["coordinator"]), 4, { coordinatorToo: false })).toThrow(
      expect.objectContaining({ status: 403 }),
    );
    expect(() => assertStewardOf(undefined, 3)).toThrow(expect.objectContaining({ status: 401 }));
  });

  it("when someone reads a household's or a person's records, then only their own pass (and coordinators')", () => {
    const resident = caller(["resident"], { householdId: 12 });
    expect(() => assertOwnHousehold(resident, 12)).not.toThrow();
    expect(() => assertOwnHousehold(resident, 13)).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => assertOwnHousehold(caller(["resident"]), 12)).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => assertOwnHousehold(caller(["coordinator"]), 13)).not.toThrow();
    expect(() => assertOwnRecord(caller(["gardener"]), 7)).not.toThrow();
    expect(() => assertOwnRecord(caller(["gardener"]), 8)).toThrow(expect.objectContaining({ status: 403 }));
  });
});

describe("housekeeping", () => {
  it("when sessions and throttle counters have run out, then the hourly job deletes them and keeps live ones", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const live = sessionIdFromCookies((await login(agent, person.email, TEST_PASSWORD)).headers["set-cookie"]);
    const deadSid = `dead-${uniqueEmail("sid")}`;
    await sql(`INSERT INTO sessions (sid, sess, expire) VALUES ($1, '{}', now() - interval '1 minute') RETURNING sid`, [
      deadSid,
    ]);
    const deadKey = `test:${uniqueEmail("key")}`;
    await sql(
      `INSERT INTO rate_limit_hits (key, hits, reset_at) VALUES ($1, 3, now() - interval '1 minute') RETURNING key`,
      [deadKey],
    );
    const result = await pruneExpired();
    expect(result.skipped).toBe(false);
    expect(result.sessions).toBeGreaterThanOrEqual(1);
    expect(await sessionRow(deadSid)).toHaveLength(0);
    expect(await sessionRow(live)).toHaveLength(1);
    expect(await sql(`SELECT 1 FROM rate_limit_hits WHERE key = $1`, [deadKey])).toHaveLength(0);
  });
});

describe("helpers other tests rely on", () => {
  it("when signIn() is used, then the returned CSRF token works for a state change", async () => {
    const person = await createPerson();
    const agent = request.agent(app);
    const { csrf, user } = await signIn(agent, person.email, TEST_PASSWORD);
    expect(user.id).toBe(person.id);
    expect((await agent.patch("/api/account").set("x-csrf-token", csrf).send({ name: "Renamed" })).status).toBe(200);
  });
});
