/**
 * One-line fields refuse control characters (issue 10, point 8): a name such as
 * "Ada\r\nBcc: eve@example.org" forged a header-looking line in the text part of e-mails, and a
 * NUL reached PostgreSQL (which refuses it in text, so a 500). Every field that is not a note
 * now refuses C0 controls (with TAB, LF and CR), DEL, C1 controls and the Unicode line and
 * paragraph separators with a 400 naming the field, and changes nothing; notes and reasons
 * typed in a text area keep their line breaks and tabs.
 */
import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { newOneTimeToken } from "../../server/lib/tokens";
import { createDigester, createHousehold, createPerson, signedInClient, sql, uniqueEmail } from "../helpers/db";
import request from "supertest";

const app = createApp({ requestLogging: false });

/** A forged header line, then each kind of control character on its own. */
const hostile = [
  "Ada Quell\r\nBcc: eve@example.org",
  "Ada\nQuell",
  "Ada\tQuell",
  "Ada\u0000Quell",
  "Ada\u001bQuell",
  "Ada\u007fQuell",
  "Ada\u0085Quell",
  "Ada\u009bQuell",
  "Ada\u2028Quell",
];

/** Sends each hostile value in `field` and expects 400 naming it (the route's field name). */
async function expectRefused(send: (value: string) => Promise<request.Response>, field: string) {
  for (const value of hostile) {
    const res = await send(value);
    expect(res.status, JSON.stringify(value)).toBe(400);
    expect(res.body.error.code).toBe("invalid_input");
    expect(res.body.error.fields[field], JSON.stringify(value)).toMatch(/one line|control characters/);
  }
}

describe("names of people", () => {
  it("when a person renames themselves with a control character, then it is 400 naming name and the name stays", async () => {
    const resident = await signedInClient(app, { roles: ["resident"] });
    await expectRefused((name) => resident.patch("/api/account").send({ name }), "name");
    const [row] = await sql<{ name: string }>(`SELECT name FROM people WHERE id = $1`, [resident.person.id]);
    expect(row!.name).toBe(resident.person.name);
  });

  it("when a coordinator invites or renames someone with a control character in the name, then it is 400 and no e-mail is queued", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const email = uniqueEmail("forged");
    await expectRefused(
      (name) => coordinator.post("/api/people/invitations").send({ email, name, roles: ["resident"] }),
      "name",
    );
    expect(await sql(`SELECT id FROM people WHERE email = $1`, [email])).toHaveLength(0);
    expect(await sql(`SELECT id FROM outbox_emails WHERE to_address = $1`, [email])).toHaveLength(0);

    const person = await createPerson({ roles: ["gardener"] });
    await expectRefused((name) => coordinator.patch(`/api/people/${person.id}`).send({ name }), "name");
    const [row] = await sql<{ name: string }>(`SELECT name FROM people WHERE id = $1`, [person.id]);
    expect(row!.name).toBe(person.name);
  });

  it("when an invited person accepts with a control character in their name, then it is 400 and they stay invited", async () => {
    const invited = await createPerson({ password: null, roles: ["resident"] });
    const { token, hash } = newOneTimeToken();
    await sql(
      `INSERT INTO invitations (token_hash, email, name, roles, expires_at, person_id)
       VALUES ($1, $2, '', '{resident}', now() + interval '1 day', $3) RETURNING id`,
      [hash, invited.email, invited.id],
    );
    await expectRefused(async (name) => {
      const visitor = request.agent(app);
      const csrf = (await visitor.get("/api/auth/csrf")).body.token as string;
      return visitor
        .post(`/api/invitations/${token}/accept`)
        .set("x-csrf-token", csrf)
        .send({ name, password: "lantern-orchard-4471" });
    }, "name");
    const [row] = await sql<{ status: string }>(`SELECT status FROM people WHERE id = $1`, [invited.id]);
    expect(row!.status).toBe("invited");
  });
});

describe("households", () => {
  it("when a resident registers a household with a control character in its name or street, then it is 400 naming the field and nothing is written", async () => {
    const resident = await signedInClient(app, { roles: ["resident"] });
    const location = { lat: -41.2, lng: 174.7 };
    await expectRefused((name) => resident.post("/api/households").send({ name, location }), "name");
    await expectRefused(
      (addressText) => resident.post("/api/households").send({ name: "The Quells", addressText, location }),
      "addressText",
    );
    expect(
      await sql(`SELECT household_id FROM people WHERE id = $1 AND household_id IS NOT NULL`, [resident.person.id]),
    ).toHaveLength(0);
  });

  it("when a member renames the household, changes its street or invites a member with a control character, then it is 400 and nothing changes", async () => {
    const household = await createHousehold({ name: "Tansy House" });
    const resident = await signedInClient(app, { roles: ["resident"], householdId: household.id });
    await expectRefused((name) => resident.patch("/api/households/mine").send({ name }), "name");
    await expectRefused((addressText) => resident.patch("/api/households/mine").send({ addressText }), "addressText");
    const email = uniqueEmail("member");
    await expectRefused((name) => resident.post("/api/households/mine/members").send({ email, name }), "name");
    const [row] = await sql<{ name: string; address_text: string }>(
      `SELECT name, address_text FROM households WHERE id = $1`,
      [household.id],
    );
    expect(row).toEqual({ name: "Tansy House", address_text: "" });
    expect(await sql(`SELECT id FROM people WHERE email = $1`, [email])).toHaveLength(0);
  });
});

describe("digesters and assignments", () => {
  it("when a steward renames a digester with a control character, then it is 400 naming name and the name stays", async () => {
    const digester = await createDigester();
    const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
    await expectRefused((name) => steward.patch(`/api/digesters/${digester.id}`).send({ name }), "name");
    const [row] = await sql<{ name: string }>(`SELECT name FROM digesters WHERE id = $1`, [digester.id]);
    expect(row!.name).toBe(digester.name);
  });

  it("when a coordinator applies assignments with a control character in the reason, then it is 400 naming reason", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    await expectRefused(
      (reason) => coordinator.post("/api/assignments/apply").send({ version: "v", changes: [], reason }),
      "reason",
    );
  });
});

describe("notes keep their line breaks", () => {
  it("when a resident's drop-off note has lines and a tab, then it is stored as written; with a NUL or an escape, then it is 400 naming note", async () => {
    const digester = await createDigester();
    const household = await createHousehold({ assignedDigesterId: digester.id });
    const resident = await signedInClient(app, { roles: ["resident"], householdId: household.id });
    const note = "Two buckets:\r\n- peelings\n-\tbread";
    const ok = await resident
      .post("/api/drop-offs")
      .send({ digesterId: digester.id, weightKg: 2, note, noRefuseConfirmed: true });
    expect(ok.status).toBe(201);
    const [row] = await sql<{ note: string }>(`SELECT note FROM drop_offs WHERE id = $1`, [ok.body.id]);
    expect(row!.note).toBe(note);

    for (const bad of ["peel\u0000ings", "peel\u001b[31mings", "peel\u0085ings"]) {
      const res = await resident
        .post("/api/drop-offs")
        .send({ digesterId: digester.id, weightKg: 2, note: bad, noRefuseConfirmed: true });
      expect(res.status, JSON.stringify(bad)).toBe(400);
      expect(res.body.error.fields.note).toMatch(/control characters/);
    }
    expect(await sql(`SELECT id FROM drop_offs WHERE household_id = $1`, [household.id])).toHaveLength(1);
  });

  it("when a steward writes a reading note, a site description and a resting reason over several lines, then they are kept; a NUL in them is 400", async () => {
    const digester = await createDigester();
    const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
    const lines = "Behind the hall.\nGate code at the café.";
    expect((await steward.patch(`/api/digesters/${digester.id}`).send({ siteDescription: lines })).status).toBe(200);
    expect(
      (await steward.put(`/api/digesters/${digester.id}/status`).send({ status: "resting", reason: lines })).status,
    ).toBe(200);
    const reading = await steward
      .post(`/api/digesters/${digester.id}/readings`)
      .send({ takenAt: new Date(Date.now() - 60_000).toISOString(), temperatureC: 30, note: lines });
    expect(reading.status).toBe(201);
    const [row] = await sql<{ site_description: string; status_reason: string }>(
      `SELECT site_description, status_reason FROM digesters WHERE id = $1`,
      [digester.id],
    );
    expect(row).toEqual({ site_description: lines, status_reason: lines });

    const bad = await steward.patch(`/api/digesters/${digester.id}`).send({ siteDescription: "a\u0000b" });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.siteDescription).toMatch(/control characters/);
    const badNote = await steward
      .post(`/api/digesters/${digester.id}/readings`)
      .send({ takenAt: new Date(Date.now() - 60_000).toISOString(), temperatureC: 30, note: "a\u0000b" });
    expect(badNote.status).toBe(400);
    expect(badNote.body.error.fields.note).toMatch(/control characters/);
  });
});
