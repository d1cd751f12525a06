/**
 * Phones retry: `POST /api/drop-offs` with an `Idempotency-Key` (IETF draft "The
 * Idempotency-Key HTTP Header Field"; QUALITY.md Reliability). Same key and body → one row and
 * the same answer; same key, other body → 422; concurrent duplicates → one row.
 */
import { describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { createApp } from "../../server/app";
import { createDigester, createHousehold, signedInClient, sql } from "../helpers/db";

const app = createApp({ requestLogging: false });

const count = async (query: string, bind: unknown[] = []) =>
  Number((await sql<{ count: string }>(query, bind))[0]!.count);

async function residentWithDigester(status: "active" | "resting" = "active") {
  const digester = await createDigester({ status });
  const home = await createHousehold();
  const client = await signedInClient(app, { roles: ["resident"], householdId: home.id });
  return { digester, home, client };
}

describe("Idempotency-Key on POST /api/drop-offs", () => {
  it("when the same key and body are sent twice, then there is one drop-off and the second answer is the first, byte for byte", async () => {
    const { digester, home, client } = await residentWithDigester();
    const key = randomUUID();
    const body = { digesterId: digester.id, bucketCount: 1, bucketLitres: 10, mix: "cooked", noRefuseConfirmed: true };
    const first = await client.post("/api/drop-offs").set("Idempotency-Key", key).send(body);
    const second = await client.post("/api/drop-offs").set("Idempotency-Key", key).send(body);
    expect(first.status).toBe(201);
    expect(second.status).toBe(201);
    expect(second.text).toBe(first.text);
    expect(second.headers["idempotent-replayed"]).toBe("true");
    expect(first.headers["idempotent-replayed"]).toBeUndefined();
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(1);
    const [stored] = await sql<{ status_code: number; route: string }>(
      `SELECT status_code, route FROM idempotency_keys WHERE person_id = $1 AND key = $2`,
      [client.person.id, key],
    );
    expect(stored).toEqual({ status_code: 201, route: "POST /api/drop-offs" });
  });

  it("when the same body comes with its keys in another order, then it counts as the same request", async () => {
    const { digester, home, client } = await residentWithDigester();
    const key = randomUUID();
    const first = await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: digester.id, weightKg: 2, mix: "mixed" });
    const second = await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ mix: "mixed", weightKg: 2, digesterId: digester.id });
    expect(second.status).toBe(201);
    expect(second.body.id).toBe(first.body.id);
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(1);
  });

  it("when the same key comes with another body, then it is a 422 and nothing more is written", async () => {
    const { digester, home, client } = await residentWithDigester();
    const key = randomUUID();
    await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: digester.id, bucketCount: 1, bucketLitres: 10 });
    const other = await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: digester.id, bucketCount: 2, bucketLitres: 10 });
    expect(other.status).toBe(422);
    expect(other.body.error.code).toBe("idempotency_key_reused");
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(1);
  });

  it("when identical requests with one key arrive at once, then exactly one drop-off is written and all get the same answer", async () => {
    const { digester, home, client } = await residentWithDigester();
    const key = randomUUID();
    const body = { digesterId: digester.id, bucketCount: 1, bucketLitres: 12 };
    const answers = await Promise.all(
      Array.from({ length: 8 }, () => client.post("/api/drop-offs").set("Idempotency-Key", key).send(body)),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(8).fill(201));
    expect(new Set(answers.map((a) => a.text)).size).toBe(1);
    expect(answers.filter((a) => a.headers["idempotent-replayed"] === "true")).toHaveLength(7);
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(1);
  });

  it("when no key is sent, then each request is a new drop-off", async () => {
    const { digester, home, client } = await residentWithDigester();
    const body = { digesterId: digester.id, weightKg: 1 };
    await client.post("/api/drop-offs").send(body);
    await client.post("/api/drop-offs").send(body);
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(2);
  });

  it("when two people use the same key, then each gets their own drop-off", async () => {
    const a = await residentWithDigester();
    const b = await residentWithDigester();
    const key = randomUUID();
    const ra = await a.client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: a.digester.id, weightKg: 1 });
    const rb = await b.client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: a.digester.id, weightKg: 1 });
    expect([ra.status, rb.status]).toEqual([201, 201]);
    expect(rb.body.id).not.toBe(ra.body.id);
    expect(rb.body.householdId).toBe(b.home.id);
  });

  it("when a keyed request is refused (resting digester), then the key is not used up and a corrected retry succeeds", async () => {
    const { digester: resting, home, client } = await residentWithDigester("resting");
    const open = await createDigester();
    const key = randomUUID();
    const refused = await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: resting.id, weightKg: 1 });
    expect(refused.status).toBe(409);
    expect(
      await count(`SELECT count(*) FROM idempotency_keys WHERE person_id = $1 AND key = $2`, [client.person.id, key]),
    ).toBe(0);
    const retried = await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: open.id, weightKg: 1 });
    expect(retried.status).toBe(201);
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(1);
  });

  it.each([
    ["over 200 characters", "k".repeat(201)],
    ["with a space", "two words"],
  ])("when the key is %s, then it is a 400 naming the header and nothing is written", async (_what, key) => {
    const { digester, home, client } = await residentWithDigester();
    const res = await client
      .post("/api/drop-offs")
      .set("Idempotency-Key", key)
      .send({ digesterId: digester.id, weightKg: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("Idempotency-Key");
    expect(await count(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [home.id])).toBe(0);
  });
});
