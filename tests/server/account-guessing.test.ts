/**
 * Account discovery and guessing (issue 10, point 6; OWASP ASVS 5.0 chapter V6, Authentication:
 * V6.3.1 on brute force and credential stuffing, V6.3.2-style "no account discovery" answers;
 * OWASP Authentication Cheat Sheet on lockout without denial of service). Each client connects
 * from its own loopback address, so per-IP and per-account limits can be told apart.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { hashToken, newOneTimeToken } from "../../server/lib/tokens";
import { processResetRequests } from "../../server/modules/auth/auth.service";
import { LINK_FAILURES_PER_IP, RESET_REQUESTS_PER_IP } from "../../server/modules/auth/request-limits";
import {
  SIGN_IN_ACCOUNT_MAX_FAILURES,
  SIGN_IN_IP_MAX_FAILURES,
  SIGN_IN_MAX_FAILURES,
} from "../../server/modules/auth/sign-in-throttle";
import { deliverDueEmails } from "../../server/modules/outbox/outbox.service";
import { createPerson, sql, TEST_PASSWORD, uniqueEmail } from "../helpers/db";
import { listen, nextLoopbackAddress, type AddressClient, type AddressResponse } from "../helpers/from-address";
import { ensureMailDev, tokenIn, waitForMails } from "../helpers/mail";

const app = createApp({ requestLogging: false });
let server: Awaited<ReturnType<typeof listen>>;
let mail: { stop: () => Promise<void> };

beforeAll(async () => {
  mail = await ensureMailDev();
  server = await listen(app);
});

afterAll(async () => {
  await server.close();
  await mail.stop();
});

const fresh = () => server.clientAt(nextLoopbackAddress());
const login = (client: AddressClient, email: string, password: string) =>
  client.post("/api/auth/login", { email, password });

function expectThrottled(res: AddressResponse, maxSeconds: number) {
  expect(res.status).toBe(429);
  expect(res.body.error.code).toBe("too_many_attempts");
  const retryAfter = Number(res.headers["retry-after"]);
  expect(retryAfter).toBeGreaterThan(0);
  expect(retryAfter).toBeLessThanOrEqual(maxSeconds);
}

/** Fails sign-in `count` times on `email`, spread over new addresses, at most `perAddress` from each. */
async function failFromManyAddresses(email: string, count: number, perAddress = SIGN_IN_MAX_FAILURES - 1) {
  let client = fresh();
  for (let i = 0; i < count; i++) {
    if (i > 0 && i % perAddress === 0) client = fresh();
    expect((await login(client, email, `wrong-guess-${i}`)).status).toBe(401);
  }
}

describe("password spraying (one IP, many accounts)", () => {
  it("when one address fails sign-in on many accounts, then its next sign-in gets 429 with Retry-After whatever the account, and other addresses still sign in", async () => {
    const victim = await createPerson();
    const sprayer = fresh();
    for (let i = 0; i < SIGN_IN_IP_MAX_FAILURES; i++) {
      // Real and unknown accounts alike, each tried once: the per-(account, IP) limit never trips.
      const target = i % 2 === 0 ? (await createPerson()).email : uniqueEmail("sprayed");
      expect((await login(sprayer, target, "Summer2026!")).status).toBe(401);
    }
    const blocked = await login(sprayer, victim.email, TEST_PASSWORD);
    expectThrottled(blocked, 15 * 60);
    expect(blocked.body.error.message).toMatch(/from this network/);
    expect(blocked.headers["set-cookie"] ?? []).not.toContainEqual(expect.stringMatching(/hearthloop\.sid=/));
    const [row] = await sql<{ hits: number }>(`SELECT hits FROM rate_limit_hits WHERE key = $1`, [
      `sign-in-ip:${sprayer.address}`,
    ]);
    expect(row?.hits).toBe(SIGN_IN_IP_MAX_FAILURES);
    expect((await login(fresh(), victim.email, TEST_PASSWORD)).status).toBe(200);
  });
});

describe("distributed guessing (many IPs, one account)", () => {
  it("when many addresses fail on one account, then a new address gets 429 for it, and an unknown address gets the very same answer", async () => {
    const person = await createPerson();
    const unknown = uniqueEmail("nobody");
    await failFromManyAddresses(person.email, SIGN_IN_ACCOUNT_MAX_FAILURES);
    await failFromManyAddresses(unknown, SIGN_IN_ACCOUNT_MAX_FAILURES);
    const known = await login(fresh(), person.email, TEST_PASSWORD);
    const nobody = await login(fresh(), unknown, TEST_PASSWORD);
    expectThrottled(known, 60 * 60);
    expectThrottled(nobody, 60 * 60);
    // No account discovery: the refusal does not depend on whether the account exists.
    expect(known.body).toEqual(nobody.body);
    expect(
      await sql(`SELECT 1 FROM sessions WHERE (sess -> 'passport' ->> 'user') = $1`, [String(person.id)]),
    ).toHaveLength(0);
    // Other accounts are not affected.
    const neighbour = await createPerson();
    expect((await login(fresh(), neighbour.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("when a stranger has locked an account, then the owner's own browser still signs in, and after a reset the owner signs in anywhere", async () => {
    const owner = await createPerson();
    const laptop = fresh();
    expect((await login(laptop, owner.email, TEST_PASSWORD)).status).toBe(200);
    expect((await laptop.post("/api/auth/logout", {})).status).toBe(204);

    await failFromManyAddresses(owner.email, SIGN_IN_ACCOUNT_MAX_FAILURES);
    const phone = fresh();
    expectThrottled(await login(phone, owner.email, TEST_PASSWORD), 60 * 60);
    // The browser the owner signed in with before counts its own failures, not the stranger's.
    expect((await login(laptop, owner.email, TEST_PASSWORD)).status).toBe(200);

    // The phone has never signed in: the owner resets the password from it.
    expect((await phone.post("/api/auth/password-reset", { email: owner.email })).status).toBe(202);
    await processResetRequests();
    await deliverDueEmails();
    const token = tokenIn((await waitForMails(owner.email))[0]!, "/reset-password/");
    expect((await phone.post(`/api/auth/password-reset/${token}`, { password: "a-fresh-passphrase-77" })).status).toBe(
      204,
    );
    expect((await login(phone, owner.email, "a-fresh-passphrase-77")).status).toBe(200);
    expect((await login(fresh(), owner.email, "a-fresh-passphrase-77")).status).toBe(200);

    // The stranger goes on: new browsers are locked out again, the owner's phone is not.
    await failFromManyAddresses(owner.email, SIGN_IN_ACCOUNT_MAX_FAILURES);
    expectThrottled(await login(fresh(), owner.email, "a-fresh-passphrase-77"), 60 * 60);
    expect((await phone.post("/api/auth/logout", {})).status).toBe(204);
    expect((await login(phone, owner.email, "a-fresh-passphrase-77")).status).toBe(200);
  });
});

describe("password reset requests", () => {
  it("when a reset is asked for, then the answer only stores the request; processing writes the link and e-mail for a real account and nothing for an unknown one", async () => {
    const person = await createPerson();
    const nobody = uniqueEmail("nobody");
    const client = fresh();
    const a = await client.post("/api/auth/password-reset", { email: person.email });
    const b = await client.post("/api/auth/password-reset", { email: nobody });
    expect([a.status, b.status]).toEqual([202, 202]);
    expect(a.body).toEqual(b.body);
    // Before processing both look the same in the database: one request row each, no link, no e-mail.
    for (const email of [person.email, nobody]) {
      expect(await sql(`SELECT 1 FROM password_reset_requests WHERE email = $1`, [email])).toHaveLength(1);
      expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [email])).toHaveLength(0);
    }
    expect(await sql(`SELECT 1 FROM password_resets WHERE person_id = $1`, [person.id])).toHaveLength(0);

    await processResetRequests();
    expect(await sql(`SELECT 1 FROM password_reset_requests WHERE email = ANY($1)`, [[person.email, nobody]])).toEqual(
      [],
    );
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [person.email])).toHaveLength(1);
    expect(await sql(`SELECT 1 FROM password_resets WHERE person_id = $1`, [person.id])).toHaveLength(1);
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [nobody])).toHaveLength(0);
  });

  it("when resets are asked for known and unknown addresses, then the answers take the same time (medians over 50 each)", async () => {
    const people = [];
    for (let i = 0; i < 50; i++) people.push(await createPerson());
    const known: number[] = [];
    const unknown: number[] = [];
    let client = fresh();
    for (let i = 0; i < 50; i++) {
      // Interleaved, so both kinds see the same machine load; a new address before the per-IP limit.
      if ((2 * i) % RESET_REQUESTS_PER_IP === 0) client = fresh();
      // Each kind goes first in every other pair, so neither always meets the new address's first count.
      const ask = (email: string) => client.post("/api/auth/password-reset", { email });
      const [k, u] =
        i % 2 === 0
          ? [await ask(people[i]!.email), await ask(uniqueEmail("nobody"))]
          : [await ask(uniqueEmail("nobody")), await ask(people[i]!.email)].reverse();
      expect([k!.status, u!.status]).toEqual([202, 202]);
      known.push(k!.ms);
      unknown.push(u!.ms);
    }
    const median = (xs: number[]) => {
      const s = [...xs].sort((x, y) => x - y);
      return (s[24]! + s[25]!) / 2;
    };
    const [mk, mu] = [median(known), median(unknown)];
    console.info(
      `password reset timing: known ${mk.toFixed(2)} ms, unknown ${mu.toFixed(2)} ms (medians of 50 each, ratio ${(mk / mu).toFixed(2)})`,
    );
    // "Same path and time": the bound of the sign-in timing test, medians within a factor of 2
    // [judgement; the 2-core machine is often shared]. Before the fix: known 19.7 ms, unknown 7.4 ms (2.67).
    expect(mk / mu).toBeGreaterThan(0.5);
    expect(mk / mu).toBeLessThan(2);
    // Leave no 50 e-mails queued for the tests after this one.
    await sql(`DELETE FROM password_reset_requests WHERE email = ANY($1) RETURNING id`, [people.map((p) => p.email)]);
    await processResetRequests();
  });

  it("when one address asks for resets again and again, then it gets 429 with Retry-After and the request is not stored; another address still can", async () => {
    const client = fresh();
    for (let i = 0; i < RESET_REQUESTS_PER_IP; i++) {
      expect((await client.post("/api/auth/password-reset", { email: uniqueEmail("flood") })).status).toBe(202);
    }
    const last = uniqueEmail("flood");
    const refused = await client.post("/api/auth/password-reset", { email: last });
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe("rate_limited");
    expect(Number(refused.headers["retry-after"])).toBeGreaterThan(0);
    expect(Number(refused.headers["retry-after"])).toBeLessThanOrEqual(15 * 60);
    expect(await sql(`SELECT 1 FROM password_reset_requests WHERE email = $1`, [last])).toHaveLength(0);
    expect((await fresh().post("/api/auth/password-reset", { email: last })).status).toBe(202);
    await processResetRequests();
  });
});

describe("links that set a password", () => {
  async function invitedPerson() {
    const person = await createPerson({ password: null });
    const { token, hash } = newOneTimeToken();
    await sql(
      `INSERT INTO invitations (token_hash, email, name, roles, expires_at, person_id)
       VALUES ($1, $2, $3, $4, now() + interval '7 days', $5) RETURNING id`,
      [hash, person.email, person.name, person.roles, person.id],
    );
    return { person, token };
  }

  it("when one address fails to accept invitations again and again, then even a valid link gets 429 from it and changes nothing; another address accepts", async () => {
    const { person, token } = await invitedPerson();
    const guesser = fresh();
    for (let i = 0; i < LINK_FAILURES_PER_IP; i++) {
      const wrong = newOneTimeToken().token;
      const res = await guesser.post(`/api/invitations/${wrong}/accept`, {
        name: "Guess",
        password: "a-long-guess-passphrase",
      });
      expect(res.status).toBe(404);
    }
    const blocked = await guesser.post(`/api/invitations/${token}/accept`, {
      name: "Real Name",
      password: "my own long passphrase",
    });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe("rate_limited");
    expect(Number(blocked.headers["retry-after"])).toBeGreaterThan(0);
    const [before] = await sql<{ status: string; password_hash: string | null }>(
      `SELECT status, password_hash FROM people WHERE id = $1`,
      [person.id],
    );
    expect(before).toEqual({ status: "invited", password_hash: null });
    expect(
      await sql(`SELECT 1 FROM invitations WHERE token_hash = $1 AND used_at IS NULL`, [hashToken(token)]),
    ).toHaveLength(1);

    const accepted = await fresh().post(`/api/invitations/${token}/accept`, {
      name: "Real Name",
      password: "my own long passphrase",
    });
    expect(accepted.status).toBe(200);
    expect((await sql<{ status: string }>(`SELECT status FROM people WHERE id = $1`, [person.id]))[0]!.status).toBe(
      "active",
    );
  });

  it("when one address tries reset links again and again, then it gets 429 too (the same limit as invitations)", async () => {
    const guesser = fresh();
    for (let i = 0; i < LINK_FAILURES_PER_IP; i++) {
      const res = await guesser.post(`/api/auth/password-reset/${newOneTimeToken().token}`, {
        password: "a-long-guess-passphrase",
      });
      expect(res.status).toBe(404);
    }
    const blocked = await guesser.post(`/api/auth/password-reset/${newOneTimeToken().token}`, {
      password: "a-long-guess-passphrase",
    });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe("rate_limited");
  });
});
