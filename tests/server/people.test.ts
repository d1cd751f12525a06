import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../server/app";
import { deliverDueEmails } from "../../server/modules/outbox/outbox.service";
import {
  anonymousClient,
  clientFor,
  createDigester,
  createHousehold,
  createPerson,
  signedInClient,
  sql,
  TEST_PASSWORD,
  uniqueEmail,
} from "../helpers/db";
import { ensureMailDev, linkIn, tokenIn, waitForMails } from "../helpers/mail";

const app = createApp({ requestLogging: false });
let mail: { stop: () => Promise<void> };

beforeAll(async () => {
  mail = await ensureMailDev();
});

afterAll(async () => {
  await mail.stop();
});

async function invite(email: string, roles = ["resident"], extra: Record<string, unknown> = {}) {
  const coordinator = await signedInClient(app, { roles: ["coordinator"] });
  const res = await coordinator
    .post("/api/people/invitations")
    .send({ email, name: "Invited Person", roles, ...extra });
  return { coordinator, res };
}

describe("GET /api/people", () => {
  it("when a coordinator asks, then every person is listed with roles, status and e-mail but never a password hash", async () => {
    const digester = await createDigester();
    const household = await createHousehold();
    const steward = await createPerson({ roles: ["steward"], stewardOf: [digester.id], householdId: household.id });
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.get("/api/people");
    expect(res.status).toBe(200);
    const row = (res.body as Array<Record<string, unknown>>).find((p) => p.id === steward.id);
    expect(row).toMatchObject({
      email: steward.email,
      roles: ["steward"],
      status: "active",
      stewardOf: [digester.id],
      householdId: household.id,
      householdName: household.name,
    });
    expect(JSON.stringify(res.body)).not.toMatch(/argon2|password/i);
  });

  it.each(["resident", "steward", "gardener"] as const)(
    "when a %s asks, then it is 403 and no addresses leak",
    async (role) => {
      const other = await createPerson();
      const client = await signedInClient(app, { roles: [role] });
      const res = await client.get("/api/people");
      expect(res.status).toBe(403);
      expect(JSON.stringify(res.body)).not.toContain(other.email);
    },
  );
});

describe("invitations", () => {
  it("when a coordinator invites someone, then a person, a hashed one-time link and an e-mail are written together and the link lets them in", async () => {
    const email = uniqueEmail("invitee");
    const household = await createHousehold();
    const { res } = await invite(email, ["resident", "gardener"], { householdId: household.id });
    expect(res.status).toBe(201);
    expect(res.body.email).toBe(email);
    const ttlMs = new Date(res.body.expiresAt).getTime() - Date.now();
    expect(ttlMs).toBeGreaterThan(7 * 24 * 3600_000 - 60_000);
    expect(ttlMs).toBeLessThanOrEqual(7 * 24 * 3600_000);

    const [person] = await sql<{ status: string; roles: string[]; password_hash: string | null; household_id: number }>(
      `SELECT status, roles, password_hash, household_id FROM people WHERE id = $1`,
      [res.body.personId],
    );
    expect(person).toEqual({
      status: "invited",
      roles: ["resident", "gardener"],
      password_hash: null,
      household_id: household.id,
    });
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [email])).toHaveLength(1);

    await deliverDueEmails();
    const [message] = await waitForMails(email);
    expect(message!.subject).toBe("You are invited to Hearthloop");
    const link = linkIn(message!, "/invitation/");
    const token = tokenIn(message!, "/invitation/");
    expect(link.pathname).toBe(`/invitation/${token}`);
    expect(await sql(`SELECT 1 FROM invitations WHERE token_hash = $1`, [token])).toHaveLength(0);

    const visitor = await anonymousClient(app);
    const info = await visitor.get(`/api/invitations/${token}`);
    expect(info.status).toBe(200);
    expect(info.body).toMatchObject({ email, name: "Invited Person", roles: ["resident", "gardener"] });

    const common = await visitor
      .post(`/api/invitations/${token}/accept`)
      .send({ name: "Iris Invited", password: "iloveyou" });
    expect(common.status).toBe(400);
    expect(common.body.error.fields.password).toMatch(/common/);
    const short = await visitor
      .post(`/api/invitations/${token}/accept`)
      .send({ name: "Iris Invited", password: "short" });
    expect(short.status).toBe(400);

    const accepted = await visitor
      .post(`/api/invitations/${token}/accept`)
      .send({ name: "Iris Invited", password: "my own long passphrase" });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({
      id: res.body.personId,
      email,
      name: "Iris Invited",
      roles: ["resident", "gardener"],
    });
    // Accepting signs them in on the spot.
    expect((await visitor.get("/api/auth/me")).body.id).toBe(res.body.personId);

    const reused = await (
      await anonymousClient(app)
    )
      .post(`/api/invitations/${token}/accept`)
      .send({ name: "X", password: "another long passphrase" });
    expect(reused.status).toBe(410);
    expect((await request(app).get(`/api/invitations/${token}`)).status).toBe(410);
  });

  it("when an invitation is over 7 days old, then it is refused with a clear message and nothing changes", async () => {
    const email = uniqueEmail("late");
    const { res } = await invite(email);
    await sql(`UPDATE invitations SET expires_at = now() - interval '1 second' WHERE person_id = $1 RETURNING id`, [
      res.body.personId,
    ]);
    await deliverDueEmails();
    const token = tokenIn((await waitForMails(email))[0]!, "/invitation/");
    const visitor = await anonymousClient(app);
    const accept = await visitor
      .post(`/api/invitations/${token}/accept`)
      .send({ name: "Late Person", password: "my own long passphrase" });
    expect(accept.status).toBe(410);
    expect(accept.body.error.message).toMatch(/expired/);
    const [person] = await sql<{ status: string }>(`SELECT status FROM people WHERE id = $1`, [res.body.personId]);
    expect(person!.status).toBe("invited");
  });

  it("when the same person is invited again, then the first link stops working and the new one works", async () => {
    const email = uniqueEmail("twice");
    const first = await invite(email);
    await deliverDueEmails();
    const firstToken = tokenIn((await waitForMails(email, 1))[0]!, "/invitation/");
    const second = await first.coordinator.post("/api/people/invitations").send({ email, roles: ["steward"] });
    expect(second.status).toBe(201);
    expect(second.body.personId).toBe(first.res.body.personId);
    await deliverDueEmails();
    const mails = await waitForMails(email, 2);
    const tokens = mails.map((m) => tokenIn(m, "/invitation/"));
    const secondToken = tokens.find((t) => t !== firstToken)!;
    expect((await request(app).get(`/api/invitations/${firstToken}`)).status).toBe(410);
    const info = await request(app).get(`/api/invitations/${secondToken}`);
    expect(info.status).toBe(200);
    expect(info.body.roles).toEqual(["steward"]);
  });

  it("when the address already has an account, then inviting it is 409 and writes nothing", async () => {
    const existing = await createPerson();
    const { res } = await invite(existing.email.toUpperCase());
    expect(res.status).toBe(409);
    expect(await sql(`SELECT 1 FROM invitations WHERE email = $1`, [existing.email])).toHaveLength(0);
  });

  it("when the household does not exist, then inviting is 400 and no person or e-mail is written (all or nothing)", async () => {
    const email = uniqueEmail("nohouse");
    const { res } = await invite(email, ["resident"], { householdId: 2_000_000_000 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.householdId).toBeDefined();
    expect(await sql(`SELECT 1 FROM people WHERE email = $1`, [email])).toHaveLength(0);
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [email])).toHaveLength(0);
  });

  it.each([
    ["no roles", { email: "a@example.org", roles: [] }, "roles"],
    ["an unknown role", { email: "a@example.org", roles: ["admin"] }, "roles.0"],
    ["a status", { email: "a@example.org", roles: ["resident"], status: "active" }, "status"],
    ["a malformed e-mail", { email: "a@", roles: ["resident"] }, "email"],
  ])("when the invitation has %s, then it is 400 naming the field", async (_label, body, field) => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.post("/api/people/invitations").send(body);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain(field);
  });

  it("when the invitation token is unknown or malformed, then it is 404 or 400", async () => {
    expect((await request(app).get(`/api/invitations/${"b".repeat(43)}`)).status).toBe(404);
    expect((await request(app).get(`/api/invitations/not-a-token`)).status).toBe(400);
  });
});

describe("PATCH /api/people/:id", () => {
  it("when a coordinator disables a person, then their sessions end at once and they cannot sign in", async () => {
    const person = await createPerson({ roles: ["resident"] });
    const theirs = await clientFor(app, person);
    const theirOther = await clientFor(app, person);
    expect((await theirs.get("/api/auth/me")).status).toBe(200);
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.patch(`/api/people/${person.id}`).send({ status: "disabled" });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe("disabled");
    expect(
      await sql(`SELECT 1 FROM sessions WHERE (sess -> 'passport' ->> 'user') = $1`, [String(person.id)]),
    ).toHaveLength(0);
    expect((await theirs.get("/api/auth/me")).status).toBe(401);
    expect((await theirOther.get("/api/auth/me")).status).toBe(401);
    await expect(clientFor(app, person)).rejects.toThrow(/401/);
    expect((await coordinator.get("/api/auth/me")).status).toBe(200);
  });

  it("when a coordinator changes roles, then the person's next request sees them and losing 'steward' ends their stewardships", async () => {
    const digester = await createDigester();
    const person = await createPerson({ roles: ["steward"], stewardOf: [digester.id] });
    const theirs = await clientFor(app, person);
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.patch(`/api/people/${person.id}`).send({ roles: ["resident", "gardener"] });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ roles: ["resident", "gardener"], stewardOf: [] });
    const me = await theirs.get("/api/auth/me");
    expect(me.body).toMatchObject({ roles: ["resident", "gardener"], stewardOf: [] });
  });

  it("when volunteer fields are set, then they are stored", async () => {
    const person = await createPerson();
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator
      .patch(`/api/people/${person.id}`)
      .send({ isVolunteer: true, bikeLoadKg: 40, startLat: 51.51, startLng: -0.12 });
    expect(res.status).toBe(200);
    const [row] = await sql<{ is_volunteer: boolean; bike_load_kg: number; start_lat: number }>(
      `SELECT is_volunteer, bike_load_kg, start_lat FROM people WHERE id = $1`,
      [person.id],
    );
    expect({ ...row, bike_load_kg: Number(row!.bike_load_kg) }).toEqual({
      is_volunteer: true,
      bike_load_kg: 40,
      start_lat: 51.51,
    });
  });

  it("when a coordinator tries to disable themselves or drop their own coordinator role, then it is 400", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    expect((await coordinator.patch(`/api/people/${coordinator.person.id}`).send({ status: "disabled" })).status).toBe(
      400,
    );
    expect((await coordinator.patch(`/api/people/${coordinator.person.id}`).send({ roles: ["resident"] })).status).toBe(
      400,
    );
  });

  it("when an invited person is set active, then it is 409: only accepting the invitation activates them", async () => {
    const invited = await createPerson({ password: null });
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.patch(`/api/people/${invited.id}`).send({ status: "active" });
    expect(res.status).toBe(409);
  });

  it("when the body has unknown keys or nothing to change, then it is 400", async () => {
    const person = await createPerson();
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const extra = await coordinator.patch(`/api/people/${person.id}`).send({ roles: ["resident"], passwordHash: "x" });
    expect(extra.status).toBe(400);
    expect(extra.body.error.fields).toHaveProperty("passwordHash");
    expect((await coordinator.patch(`/api/people/${person.id}`).send({})).status).toBe(400);
    expect((await coordinator.patch(`/api/people/2000000000`).send({ name: "Nobody" })).status).toBe(404);
  });
});

describe("PUT /api/digesters/:id/stewards", () => {
  it("when a coordinator assigns stewards, then the set is replaced and each steward's /me lists the digester", async () => {
    const digester = await createDigester();
    const old = await createPerson({ roles: ["steward"], stewardOf: [digester.id] });
    const a = await createPerson({ roles: ["steward"] });
    const b = await createPerson({ roles: ["steward", "resident"] });
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.put(`/api/digesters/${digester.id}/stewards`).send({ personIds: [a.id, b.id] });
    expect(res.status).toBe(200);
    expect(res.body.digesterId).toBe(digester.id);
    expect(res.body.stewards.map((s: { id: number }) => s.id).sort()).toEqual([a.id, b.id].sort());
    // Only ids and names: a steward list never carries e-mail addresses.
    expect(Object.keys(res.body.stewards[0]).sort()).toEqual(["id", "name"]);
    const rows = await sql<{ person_id: number }>(`SELECT person_id FROM digester_stewards WHERE digester_id = $1`, [
      digester.id,
    ]);
    expect(rows.map((r) => r.person_id).sort()).toEqual([a.id, b.id].sort());
    expect((await (await clientFor(app, a)).get("/api/auth/me")).body.stewardOf).toEqual([digester.id]);
    expect((await (await clientFor(app, old)).get("/api/auth/me")).body.stewardOf).toEqual([]);
  });

  it("when someone without the steward role is named, then it is 400 and nothing changes", async () => {
    const digester = await createDigester();
    const steward = await createPerson({ roles: ["steward"], stewardOf: [digester.id] });
    const resident = await createPerson({ roles: ["resident"] });
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.put(`/api/digesters/${digester.id}/stewards`).send({ personIds: [resident.id] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.personIds).toContain("steward role");
    const rows = await sql<{ person_id: number }>(`SELECT person_id FROM digester_stewards WHERE digester_id = $1`, [
      digester.id,
    ]);
    expect(rows).toEqual([{ person_id: steward.id }]);
  });

  it("when the digester does not exist, then it is 404", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    expect((await coordinator.put(`/api/digesters/2000000000/stewards`).send({ personIds: [] })).status).toBe(404);
  });

  it("when a steward tries to assign stewards, even to their own digester, then it is 403", async () => {
    const digester = await createDigester();
    const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
    expect(
      (await steward.put(`/api/digesters/${digester.id}/stewards`).send({ personIds: [steward.person.id] })).status,
    ).toBe(403);
  });
});

describe("the demo-style sign-in of a freshly accepted invitation", () => {
  it("when the invited person later signs in with their chosen password, then it works", async () => {
    const email = uniqueEmail("later");
    await invite(email);
    await deliverDueEmails();
    const token = tokenIn((await waitForMails(email))[0]!, "/invitation/");
    const visitor = await anonymousClient(app);
    expect(
      (await visitor.post(`/api/invitations/${token}/accept`).send({ name: "Later", password: TEST_PASSWORD })).status,
    ).toBe(200);
    const again = await anonymousClient(app);
    const res = await again.post("/api/auth/login").send({ email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
  });
});
