import { describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../server/app";
import { clientFor, createPerson, signedInClient, sql, TEST_PASSWORD } from "../helpers/db";

const app = createApp({ requestLogging: false });

describe("PATCH /api/account", () => {
  it("when a person changes their name, then it is stored and returned in the /me shape", async () => {
    const client = await signedInClient(app);
    const res = await client.patch("/api/account").send({ name: "  Rowan Ashdown  " });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: client.person.id, name: "Rowan Ashdown" });
    const [row] = await sql<{ name: string }>(`SELECT name FROM people WHERE id = $1`, [client.person.id]);
    expect(row!.name).toBe("Rowan Ashdown");
  });

  it("when a resident adds roles or status to the body, then it is 400 naming them and nothing changes (no mass assignment)", async () => {
    const client = await signedInClient(app, { roles: ["resident"] });
    const res = await client.patch("/api/account").send({ name: "Sneaky", roles: ["coordinator"], status: "active" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ roles: expect.any(String), status: expect.any(String) });
    const [row] = await sql<{ name: string; roles: string[] }>(`SELECT name, roles FROM people WHERE id = $1`, [
      client.person.id,
    ]);
    expect(row).toEqual({ name: client.person.name, roles: ["resident"] });
  });

  it("when the name is empty or over 120 characters, then it is 400", async () => {
    const client = await signedInClient(app);
    expect((await client.patch("/api/account").send({ name: "   " })).status).toBe(400);
    expect((await client.patch("/api/account").send({ name: "n".repeat(121) })).status).toBe(400);
  });
});

describe("POST /api/account/password", () => {
  it("when the current password is right, then the password changes, other sessions end, this one stays, and an e-mail is queued", async () => {
    const person = await createPerson();
    const here = await clientFor(app, person);
    const elsewhere = await clientFor(app, person);
    const res = await here
      .post("/api/account/password")
      .send({ currentPassword: TEST_PASSWORD, newPassword: "a fresh long passphrase" });
    expect(res.status).toBe(204);
    expect((await elsewhere.get("/api/auth/me")).status).toBe(401);
    expect((await here.get("/api/auth/me")).status).toBe(200);
    expect(
      await sql(`SELECT 1 FROM sessions WHERE (sess -> 'passport' ->> 'user') = $1`, [String(person.id)]),
    ).toHaveLength(1);
    expect(
      await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1 AND subject LIKE '%password was changed%'`, [
        person.email,
      ]),
    ).toHaveLength(1);
    const agent = request.agent(app);
    const token = (await agent.get("/api/auth/csrf")).body.token;
    expect(
      (
        await agent
          .post("/api/auth/login")
          .set("x-csrf-token", token)
          .send({ email: person.email, password: "a fresh long passphrase" })
      ).status,
    ).toBe(200);
  });

  it("when the current password is wrong, then it is 400 on that field and nothing changes", async () => {
    const person = await createPerson();
    const client = await clientFor(app, person);
    const [before] = await sql<{ password_hash: string }>(`SELECT password_hash FROM people WHERE id = $1`, [
      person.id,
    ]);
    const res = await client
      .post("/api/account/password")
      .send({ currentPassword: "not-my-password", newPassword: "a fresh long passphrase" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("currentPassword");
    const [after] = await sql<{ password_hash: string }>(`SELECT password_hash FROM people WHERE id = $1`, [person.id]);
    expect(after!.password_hash).toBe(before!.password_hash);
  });

  it.each([
    ["7 characters", "seven77", "newPassword"],
    ["129 characters", "x".repeat(129), "newPassword"],
    ["a common password", "qwerty123", "newPassword"],
    ["the current password again", TEST_PASSWORD, "newPassword"],
  ])("when the new password is %s, then it is 400", async (_label, newPassword, field) => {
    const client = await signedInClient(app);
    const res = await client.post("/api/account/password").send({ currentPassword: TEST_PASSWORD, newPassword });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(field);
  });

  it("when the new password is 128 characters of anything, including spaces and emoji, then it is accepted (no composition rules)", async () => {
    const client = await signedInClient(app);
    const long = "correct horse 🐎 battery staple ".repeat(10).slice(0, 128);
    const res = await client.post("/api/account/password").send({ currentPassword: TEST_PASSWORD, newPassword: long });
    expect(res.status).toBe(204);
  });
});

describe("POST /api/account/email", () => {
  it("when the password is right, then the address changes, sign-in uses it, and the old address is told", async () => {
    const person = await createPerson();
    const client = await clientFor(app, person);
    const newEmail = person.email.replace("@", "-new@");
    const res = await client.post("/api/account/email").send({ password: TEST_PASSWORD, newEmail });
    expect(res.status).toBe(200);
    expect(res.body.email).toBe(newEmail);
    expect(
      await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1 AND text_body LIKE $2`, [
        person.email,
        `%${newEmail}%`,
      ]),
    ).toHaveLength(1);
    const agent = request.agent(app);
    const token = (await agent.get("/api/auth/csrf")).body.token;
    expect(
      (
        await agent
          .post("/api/auth/login")
          .set("x-csrf-token", token)
          .send({ email: newEmail, password: TEST_PASSWORD })
      ).status,
    ).toBe(200);
  });

  it("when the password is wrong, then it is 400 and the address stays", async () => {
    const person = await createPerson();
    const client = await clientFor(app, person);
    const res = await client
      .post("/api/account/email")
      .send({ password: "not-my-password", newEmail: "elsewhere@example.org" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("password");
    const [row] = await sql<{ email: string }>(`SELECT email FROM people WHERE id = $1`, [person.id]);
    expect(row!.email).toBe(person.email);
  });

  it("when another account has the address, then it is 409", async () => {
    const other = await createPerson();
    const client = await signedInClient(app);
    const res = await client
      .post("/api/account/email")
      .send({ password: TEST_PASSWORD, newEmail: other.email.toUpperCase() });
    expect(res.status).toBe(409);
  });
});
