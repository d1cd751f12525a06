import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { signedInClient, sql } from "../helpers/db";
import { warmDigester } from "../helpers/steward-fixtures";

const app = createApp({ requestLogging: false });
const stewardOf = (digesterId: number) => signedInClient(app, { roles: ["steward"], stewardOf: [digesterId] });
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();

const readingsOf = (digesterId: number) =>
  sql<{ source: string; person_id: number; temperature_c: string | null; vfa_ta_ratio: string | null }>(
    `SELECT source, person_id, temperature_c, vfa_ta_ratio FROM readings WHERE digester_id = $1 ORDER BY taken_at`,
    [digesterId],
  );

describe("logging a reading", () => {
  it("when a steward logs temperature, pH, gas level, drum rise and minutes of gas, then it is stored as a manual reading and answered 201", async () => {
    const { digester } = await warmDigester({ temperatureC: null, ph: null });
    const steward = await stewardOf(digester.id);
    const takenAt = minutesAgo(10);
    const res = await steward.post(`/api/digesters/${digester.id}/readings`).send({
      takenAt,
      temperatureC: 31.5,
      ph: 7.05,
      gasLevelPercent: 60,
      drumRiseM: 0.35,
      gasUsedMinutes: 45,
      note: "Drum rising nicely",
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      digesterId: digester.id,
      takenAt,
      temperatureC: 31.5,
      ph: 7.05,
      gasLevelPercent: 60,
      drumRiseM: 0.35,
      gasUsedMinutes: 45,
      note: "Drum rising nicely",
      source: "manual",
      enteredBy: steward.person.name,
      vfaTaRatio: null,
    });
    const rows = await readingsOf(digester.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ source: "manual", person_id: steward.person.id });
  });

  it("when titration volumes A and B are given without a ratio, then the ratio is computed by Nordmann's method", async () => {
    const { digester } = await warmDigester();
    const steward = await stewardOf(digester.id);
    // ManTech Method Abstract #127 [read]: A 8.97 mL, B 0.84 mL → FOS 622, TAC 2,245, ratio 0.28 (DOMAIN.md §5).
    const res = await steward
      .post(`/api/digesters/${digester.id}/readings`)
      .send({ takenAt: minutesAgo(5), titrationAMl: 8.97, titrationBMl: 0.84 });
    expect(res.status).toBe(201);
    expect(res.body.vfaTaRatio).toBeCloseTo(0.28, 2);
    expect(res.body).toMatchObject({ titrationAMl: 8.97, titrationBMl: 0.84 });
    // A ratio given by the steward wins over the volumes.
    const given = await steward
      .post(`/api/digesters/${digester.id}/readings`)
      .send({ takenAt: minutesAgo(4), titrationAMl: 8.97, titrationBMl: 0.84, vfaTaRatio: 0.31 });
    expect(given.body.vfaTaRatio).toBe(0.31);
  });

  it("when a reading is logged, then today's budget uses it", async () => {
    const { digester } = await warmDigester({ temperatureC: null });
    const steward = await stewardOf(digester.id);
    const before = (await steward.get("/api/steward/today")).body.digesters[0];
    expect(before.budget.binding).toBe("temperatureUnknown");
    await steward.post(`/api/digesters/${digester.id}/readings`).send({ takenAt: minutesAgo(1), temperatureC: 36 });
    const after = (await steward.get("/api/steward/today")).body.digesters[0];
    expect(after.budget.binding).not.toBe("temperatureUnknown");
    expect(after.budget.budgetKgVs).toBeGreaterThan(0);
    expect(after.readings.temperatureC).toMatchObject({ value: 36, stale: false });
  });

  it("when the input is incomplete, out of range, in the future or has unknown keys, then it is a 400 naming the field and nothing is stored", async () => {
    const { digester } = await warmDigester({ temperatureC: null, ph: null });
    const steward = await stewardOf(digester.id);
    const inAnHour = new Date(Date.now() + 3_600_000).toISOString();
    const cases: [object, string][] = [
      [{ takenAt: minutesAgo(1) }, "temperatureC"],
      [{ takenAt: minutesAgo(1), note: "only a note" }, "temperatureC"],
      [{ temperatureC: 30 }, "takenAt"],
      [{ takenAt: "2026-05-03T08:30:00", temperatureC: 30 }, "takenAt"],
      [{ takenAt: inAnHour, temperatureC: 30 }, "takenAt"],
      [{ takenAt: minutesAgo(1), temperatureC: 91 }, "temperatureC"],
      [{ takenAt: minutesAgo(1), temperatureC: -41 }, "temperatureC"],
      [{ takenAt: minutesAgo(1), ph: 14.5 }, "ph"],
      [{ takenAt: minutesAgo(1), gasLevelPercent: 101 }, "gasLevelPercent"],
      [{ takenAt: minutesAgo(1), temperatureC: "30" }, "temperatureC"],
      [{ takenAt: minutesAgo(1), titrationAMl: 8 }, "titrationBMl"],
      [{ takenAt: minutesAgo(1), titrationBMl: 1 }, "titrationAMl"],
      [{ takenAt: minutesAgo(1), titrationAMl: 0, titrationBMl: 1 }, "titrationAMl"],
      // A 0.5 mL, B 20 mL → ratio ≈ 33, above the 5 the database keeps.
      [{ takenAt: minutesAgo(1), titrationAMl: 0.5, titrationBMl: 20 }, "titrationBMl"],
      [{ takenAt: minutesAgo(1), temperatureC: 30, source: "upload" }, "source"],
      [{ takenAt: minutesAgo(1), temperatureC: 30, note: "x".repeat(501) }, "note"],
    ];
    for (const [body, field] of cases) {
      const res = await steward.post(`/api/digesters/${digester.id}/readings`).send(body);
      expect({ body, status: res.status, fields: Object.keys(res.body.error?.fields ?? {}) }).toEqual({
        body,
        status: 400,
        fields: expect.arrayContaining([field]),
      });
    }
    expect(await readingsOf(digester.id)).toHaveLength(0);
  });

  it("when another digester's steward, a resident or a gardener logs a reading, then it is 403 and nothing is stored; a coordinator may", async () => {
    const { digester } = await warmDigester({ temperatureC: null, ph: null });
    const { digester: other } = await warmDigester();
    const body = { takenAt: minutesAgo(2), temperatureC: 30 };
    const otherSteward = await stewardOf(other.id);
    expect((await otherSteward.post(`/api/digesters/${digester.id}/readings`).send(body)).status).toBe(403);
    for (const role of ["resident", "gardener"] as const) {
      const client = await signedInClient(app, { roles: [role] });
      expect((await client.post(`/api/digesters/${digester.id}/readings`).send(body)).status).toBe(403);
    }
    expect(await readingsOf(digester.id)).toHaveLength(0);
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    expect((await coordinator.post(`/api/digesters/${digester.id}/readings`).send(body)).status).toBe(201);
    expect((await coordinator.post(`/api/digesters/2147483647/readings`).send(body)).status).toBe(404);
  });
});

describe("listing readings", () => {
  it("when a steward lists readings, then they come oldest first, limited by from and to", async () => {
    const { digester } = await warmDigester({ temperatureC: null, ph: null });
    const steward = await stewardOf(digester.id);
    const times = ["2026-03-01T08:00:00Z", "2026-03-02T08:00:00Z", "2026-03-03T08:00:00Z"];
    for (const t of [times[2], times[0], times[1]]) {
      expect(
        (await steward.post(`/api/digesters/${digester.id}/readings`).send({ takenAt: t, temperatureC: 30 })).status,
      ).toBe(201);
    }
    const all = await steward.get(`/api/digesters/${digester.id}/readings?from=2026-02-01&to=2026-03-31`);
    expect(all.status).toBe(200);
    expect(all.body.map((r: { takenAt: string }) => r.takenAt)).toEqual(times.map((t) => new Date(t).toISOString()));
    const some = await steward.get(
      `/api/digesters/${digester.id}/readings?from=2026-03-02T00:00:00Z&to=2026-03-02T23:59:59Z`,
    );
    expect(some.body.map((r: { takenAt: string }) => r.takenAt)).toEqual([new Date(times[1]!).toISOString()]);
    expect((await steward.get(`/api/digesters/${digester.id}/readings?from=2026-03-05&to=2026-03-01`)).status).toBe(
      400,
    );
    expect((await steward.get(`/api/digesters/${digester.id}/readings?from=yesterday`)).status).toBe(400);
  });

  it("when someone who does not look after the digester lists its readings, then it is 403", async () => {
    const { digester } = await warmDigester();
    const { digester: other } = await warmDigester();
    expect((await (await stewardOf(other.id)).get(`/api/digesters/${digester.id}/readings`)).status).toBe(403);
    const resident = await signedInClient(app, { roles: ["resident"] });
    expect((await resident.get(`/api/digesters/${digester.id}/readings`)).status).toBe(403);
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.get(`/api/digesters/${digester.id}/readings`);
    expect(res.status).toBe(200);
    expect(res.body).toHaveLength(1);
  });
});
