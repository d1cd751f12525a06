/**
 * Every date and date-time a request carries is bounded to 2000-01-01 … 2100-12-31 by the shared
 * schemas (issue 10, point 2), so a day such as 0001-01-01 is a 400 naming the field and never
 * reaches PostgreSQL (where `0001-01-01` minus 60 days is a "date/time field value out of
 * range" error, and so a 500). The bounds themselves are days the app takes.
 */
import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { createDigester, createHousehold, signedInClient, sql } from "../helpers/db";

const app = createApp({ requestLogging: false });

const tooEarly = ["0001-01-01", "1999-12-31"];
const tooLate = ["2101-01-01", "9999-12-31"];

async function steward() {
  const digester = await createDigester();
  const client = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
  return { digester, client };
}

describe("dates in a query", () => {
  it.each([...tooEarly, ...tooLate])(
    "when a feedings or readings range has %s, then it is 400 naming the query field",
    async (day) => {
      const { digester, client } = await steward();
      for (const path of [
        `/api/digesters/${digester.id}/feedings?to=${day}`,
        `/api/digesters/${digester.id}/feedings.csv?from=${day}`,
        `/api/digesters/${digester.id}/readings?to=${day}`,
        `/api/digesters/${digester.id}/readings?from=${day}T00:00:00Z`,
        `/api/digesters/${digester.id}/readings.csv?to=${day}T12:00:00%2B01:00`,
      ]) {
        const res = await client.get(path);
        expect(res.status, path).toBe(400);
        expect(res.body.error.code, path).toBe("invalid_input");
        const field = path.includes("?to=") ? "query.to" : "query.from";
        expect(res.body.error.fields[field], path).toMatch(/2000-01-01.*2100-12-31/);
      }
    },
  );

  it("when a range spans the bounds exactly, then it is answered", async () => {
    const { digester, client } = await steward();
    expect((await client.get(`/api/digesters/${digester.id}/feedings?from=2100-01-01&to=2100-12-31`)).status).toBe(200);
    expect((await client.get(`/api/digesters/${digester.id}/feedings?from=2000-01-01&to=2000-03-01`)).status).toBe(200);
    expect(
      (await client.get(`/api/digesters/${digester.id}/readings?from=2000-01-01T00:00:00Z&to=2000-02-01`)).status,
    ).toBe(200);
  });

  it("when a coordinator lists collection requests or rounds for 0001-01-01, then it is 400 naming the date", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    for (const path of ["/api/collection-requests?date=0001-01-01", "/api/collection-rounds?date=2101-01-01"]) {
      const res = await coordinator.get(path);
      expect(res.status, path).toBe(400);
      expect(res.body.error.fields["query.date"], path).toMatch(/2000-01-01/);
    }
  });
});

describe("dates in a body", () => {
  it("when a steward sets a start or first-gas day outside the bounds, then it is 400 naming it and the profile stays", async () => {
    const { digester, client } = await steward();
    for (const [body, field] of [
      [{ startedOn: "1999-12-31" }, "startedOn"],
      [{ gasFirstBurnedOn: "2101-01-01" }, "gasFirstBurnedOn"],
    ] as const) {
      const res = await client.patch(`/api/digesters/${digester.id}`).send(body);
      expect(res.status, field).toBe(400);
      expect(res.body.error.fields[field], field).toMatch(/2000-01-01.*2100-12-31/);
    }
    const [row] = await sql<{ started_on: string; gas_first_burned_on: string | null }>(
      `SELECT to_char(started_on, 'YYYY-MM-DD') AS started_on, gas_first_burned_on FROM digesters WHERE id = $1`,
      [digester.id],
    );
    expect(row).toEqual({ started_on: "2026-01-05", gas_first_burned_on: null });
  });

  it("when a hand feeding or a reading is dated 0001-01-01, then it is 400 naming the field and nothing is written", async () => {
    const { digester, client } = await steward();
    const feeding = await client
      .post(`/api/digesters/${digester.id}/feedings`)
      .send({ freshKg: 1, fedOn: "0001-01-01" });
    expect(feeding.status).toBe(400);
    expect(feeding.body.error.fields.fedOn).toMatch(/2000-01-01/);
    const reading = await client
      .post(`/api/digesters/${digester.id}/readings`)
      .send({ takenAt: "0001-01-01T08:00:00Z", temperatureC: 30 });
    expect(reading.status).toBe(400);
    expect(reading.body.error.fields.takenAt).toMatch(/2000-01-01/);
    expect(await sql(`SELECT id FROM feedings WHERE digester_id = $1`, [digester.id])).toHaveLength(0);
    expect(await sql(`SELECT id FROM readings WHERE digester_id = $1`, [digester.id])).toHaveLength(0);
  });

  it("when a resident asks for a drop-off or a collection on a day outside the bounds, then it is 400 naming forDate and nothing is written", async () => {
    const digester = await createDigester();
    const household = await createHousehold({ assignedDigesterId: digester.id });
    const resident = await signedInClient(app, { roles: ["resident"], householdId: household.id });
    const dropOff = await resident
      .post("/api/drop-offs")
      .send({ digesterId: digester.id, weightKg: 2, forDate: "9999-12-31", noRefuseConfirmed: true });
    expect(dropOff.status).toBe(400);
    expect(dropOff.body.error.fields.forDate).toMatch(/2100-12-31/);
    const collection = await resident.post("/api/collection-requests").send({ forDate: "0001-01-01", bucketCount: 1 });
    expect(collection.status).toBe(400);
    expect(collection.body.error.fields.forDate).toMatch(/2000-01-01/);
    expect(await sql(`SELECT id FROM drop_offs WHERE household_id = $1`, [household.id])).toHaveLength(0);
    expect(await sql(`SELECT id FROM collection_requests WHERE household_id = $1`, [household.id])).toHaveLength(0);
  });

  it("when a coordinator plans rounds for 2101-01-01, then it is 400 naming forDate", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.post("/api/collection-rounds/plan").send({ forDate: "2101-01-01" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.forDate).toMatch(/2100-12-31/);
  });
});
