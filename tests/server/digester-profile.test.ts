import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { addDays } from "../../server/lib/clock";
import { signedInClient, sql } from "../helpers/db";
import { createDropOff, today, warmDigester } from "../helpers/steward-fixtures";

const app = createApp({ requestLogging: false });
const stewardOf = (digesterId: number) => signedInClient(app, { roles: ["steward"], stewardOf: [digesterId] });

const stored = async (id: number) =>
  (
    await sql<Record<string, unknown>>(
      `SELECT working_volume_m3::float8 AS volume, drum_diameter_m::float8 AS drum, olr_ref_kg_vs_per_m3_day::float8 AS olr, olr_override_reason,
            status, status_reason, heating, gas_first_burned_on::text AS gas FROM digesters WHERE id = $1`,
      [id],
    )
  )[0]!;

describe("the digester's detail", () => {
  it("when its steward opens it, then the profile, its stewards by name and today's view come back, with no e-mail addresses", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: 10 });
    await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const res = await steward.get(`/api/digesters/${digester.id}`);
    expect(res.status).toBe(200);
    expect(res.body.profile).toMatchObject({
      id: digester.id,
      workingVolumeM3: 10,
      status: "active",
      olrRefKgVsPerM3Day: 1.5,
      targetTsPercent: 8,
    });
    expect(res.body.profile.stewards).toEqual([{ id: steward.person.id, name: steward.person.name }]);
    expect(res.body.day.waiting).toHaveLength(1);
    expect(res.body.day.budget.binding).toBe("weekRamp");
    expect(JSON.stringify(res.body)).not.toContain("@");
  });

  it("when another digester's steward or a resident asks, then it is 403", async () => {
    const { digester } = await warmDigester();
    const { digester: other } = await warmDigester();
    expect((await (await stewardOf(other.id)).get(`/api/digesters/${digester.id}`)).status).toBe(403);
    expect(
      (await (await signedInClient(app, { roles: ["resident"] })).get(`/api/digesters/${digester.id}`)).status,
    ).toBe(403);
  });
});

describe("editing the profile", () => {
  it("when the steward changes settings within bounds, then they are stored", async () => {
    const { digester } = await warmDigester();
    const steward = await stewardOf(digester.id);
    const res = await steward.patch(`/api/digesters/${digester.id}`).send({
      workingVolumeM3: 2.5,
      drumDiameterM: 1.2,
      drumMassKg: 45,
      addedMassKg: 20,
      burnerLitresPerHour: 300,
      heating: "solar",
      insulation: "partial",
      gasFirstBurnedOn: "2025-02-10",
      targetTsPercent: 7,
      bucketKgPerLitre: 0.6,
    });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      workingVolumeM3: 2.5,
      drumDiameterM: 1.2,
      drumMassKg: 45,
      addedMassKg: 20,
      heating: "solar",
      gasFirstBurnedOn: "2025-02-10",
    });
    expect(await stored(digester.id)).toMatchObject({ volume: 2.5, drum: 1.2, heating: "solar", gas: "2025-02-10" });
  });

  it("when the loading rate goes above 2.0 kg VS/m³/day, then it needs a recorded reason (DOMAIN.md §2 limit 1), which is cleared when the rate comes back down", async () => {
    const { digester } = await warmDigester();
    const steward = await stewardOf(digester.id);
    const refused = await steward.patch(`/api/digesters/${digester.id}`).send({ olrRefKgVsPerM3Day: 2.4 });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields).toHaveProperty("olrOverrideReason");
    expect((await stored(digester.id)).olr).toBe(1.5);
    const ok = await steward
      .patch(`/api/digesters/${digester.id}`)
      .send({ olrRefKgVsPerM3Day: 2.4, olrOverrideReason: "Heated to 37 °C and stirred daily" });
    expect(ok.status).toBe(200);
    expect(await stored(digester.id)).toMatchObject({
      olr: 2.4,
      olr_override_reason: "Heated to 37 °C and stirred daily",
    });
    // The budget now uses 2.4 (organic load 2.4 × 10 m³ = 24 kg VS at 35 °C).
    const day = (await steward.get("/api/steward/today")).body.digesters[0];
    expect(day.budget.limits.organicLoad).toBeCloseTo(24, 6);
    const back = await steward.patch(`/api/digesters/${digester.id}`).send({ olrRefKgVsPerM3Day: 1.8 });
    expect(back.status).toBe(200);
    expect(await stored(digester.id)).toMatchObject({ olr: 1.8, olr_override_reason: null });
  });

  it("when a setting is out of bounds, unknown or contradicts another, then it is a 400 naming the field and nothing changes", async () => {
    const { digester } = await warmDigester();
    const steward = await stewardOf(digester.id);
    const cases: [object, string][] = [
      [{ workingVolumeM3: 0 }, "workingVolumeM3"],
      [{ workingVolumeM3: 101 }, "workingVolumeM3"],
      [{ drumDiameterM: 11 }, "drumDiameterM"],
      [{ drumMassKg: -1 }, "drumMassKg"],
      [{ burnerLitresPerHour: 10 }, "burnerLitresPerHour"],
      [{ heating: "gas" }, "heating"],
      [{ insulation: "thick" }, "insulation"],
      [{ olrRefKgVsPerM3Day: 4.5, olrOverrideReason: "very warm" }, "olrRefKgVsPerM3Day"],
      [{ targetTsPercent: 20 }, "targetTsPercent"],
      [{ bucketKgPerLitre: 1.5 }, "bucketKgPerLitre"],
      [{ startedOn: "2026-13-01" }, "startedOn"],
      [{ gasFirstBurnedOn: "2024-01-01" }, "gasFirstBurnedOn"],
      [{ gasFirstBurnedOn: addDays(today(), 3) }, "gasFirstBurnedOn"],
      [{ status: "resting" }, "status"],
      [{ lat: 10 }, "lat"],
      [{}, "body"],
    ];
    for (const [body, field] of cases) {
      const res = await steward.patch(`/api/digesters/${digester.id}`).send(body);
      expect({ body, status: res.status, fields: Object.keys(res.body.error?.fields ?? {}) }).toEqual({
        body,
        status: 400,
        fields: expect.arrayContaining([field]),
      });
    }
    expect(await stored(digester.id)).toMatchObject({ volume: 10, status: "active", heating: "none", gas: null });
  });
});

describe("resting and offline", () => {
  it("when the steward sets the digester resting with a reason, then its budget is 0, the reason shows and accepts are refused; active again restores it", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: 10 });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const noReason = await steward.put(`/api/digesters/${digester.id}/status`).send({ status: "resting" });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields).toHaveProperty("reason");

    const rest = await steward
      .put(`/api/digesters/${digester.id}/status`)
      .send({ status: "resting", reason: "pH 6.3: buffering" });
    expect(rest.status).toBe(200);
    expect(await stored(digester.id)).toMatchObject({ status: "resting", status_reason: "pH 6.3: buffering" });
    const day = (await steward.get("/api/steward/today")).body.digesters[0];
    expect(day.budget).toMatchObject({ budgetKgVs: 0, budgetBuckets: 0, closed: true });
    expect(day.budget.explanation).toContain("resting (pH 6.3: buffering)");
    expect(day.waiting[0].fitsToday).toBe(false);
    expect(
      (await steward.post(`/api/drop-offs/${drop.id}/accept`).send({ override: { reason: "x y z" } })).body.error.code,
    ).toBe("digester_closed");

    const active = await steward.put(`/api/digesters/${digester.id}/status`).send({ status: "active" });
    expect(active.status).toBe(200);
    expect(await stored(digester.id)).toMatchObject({ status: "active", status_reason: null });
    expect((await steward.post(`/api/drop-offs/${drop.id}/accept`).send({})).status).toBe(200);
  });
});

describe("the daily history for the charts", () => {
  it("when the steward asks for 14 days, then each day has its load, the organic limit at its temperature and the expected gas", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: 10 });
    const steward = await stewardOf(digester.id);
    const res = await steward.get(`/api/digesters/${digester.id}/history?days=14`);
    expect(res.status).toBe(200);
    expect(res.body.days).toHaveLength(14);
    expect(res.body.to).toBe(today());
    expect(res.body.from).toBe(addDays(today(), -13));
    const byDate = new Map(res.body.days.map((d: { date: string }) => [d.date, d]));
    expect(byDate.get(addDays(today(), -1))).toMatchObject({ loadKgVs: 10, loadKgScraps: 44.2 });
    expect(byDate.get(addDays(today(), -8))).toMatchObject({ loadKgVs: 0 });
    const now = byDate.get(today()) as Record<string, number | null>;
    expect(now.temperatureMeanC).toBe(35);
    expect(now.ph).toBe(7);
    // Organic-load limit: OLRref 1.5 × f(35 °C) = 1 × 10 m³ = 15 kg VS (DOMAIN.md §2 limits 1–2 [read: Werner, Stöhr & Hees 1989]).
    expect(now.organicLimitKgVs).toBe(15);

    // Expected gas, Chen & Hashimoto 1978 as in DOMAIN.md §3 [derived here independently]: the 14-day mean load
    // is 70 / 14 = 5 kg VS/d; slurry = 5 / 0.2262 × (1 + 26/8 − 1) L; θ = V / slurry; S0 = 5 / slurry;
    // μm = 0.013 × 35 − 0.129; K = 0.6 + 0.0206 e^(0.051 S0); γ = B0 S0/θ (1 − K/(θ μm − 1 + K)), B0 0.40;
    // biogas = γ V / 0.60.
    const slurryM3 = ((5 / 0.2262) * (26 / 8)) / 1000;
    const theta = 10 / slurryM3;
    const s0 = 5 / slurryM3;
    const mu = 0.013 * 35 - 0.129;
    const k = 0.6 + 0.0206 * Math.exp(0.051 * s0);
    const gamma = ((0.4 * s0) / theta) * (1 - k / (theta * mu - 1 + k));
    expect(now.expectedBiogasLitres).toBe(Math.round(((gamma * 10) / 0.6) * 1000));
    // Days before the only temperature reading have no limit and no gas estimate.
    expect(byDate.get(addDays(today(), -5))).toMatchObject({
      organicLimitKgVs: null,
      expectedBiogasLitres: null,
      temperatureMeanC: null,
    });
  });

  it("when a steward accepted drop-offs today, then the history shows the cap the ledger recorded", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: 10 });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    await steward.post(`/api/drop-offs/${drop.id}/accept`).send({});
    const res = await steward.get(`/api/digesters/${digester.id}/history?days=7`);
    const now = res.body.days.at(-1);
    // Week-on-week rise 1.2 × 10 = 12 kg VS binds (DOMAIN.md §2 limit 5 [judgement]).
    expect(now).toMatchObject({ date: today(), recordedCapKgVs: 12, loadKgVs: 1.131 });
    expect((await steward.get(`/api/digesters/${digester.id}/history?days=3`)).status).toBe(400);
    expect((await steward.get(`/api/digesters/${digester.id}/history?days=400`)).status).toBe(400);
  });
});
