import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { sequelize } from "../../server/db/sequelize";
import { addDays } from "../../server/lib/clock";
import { loadDigestersToday } from "../../server/modules/digesters/digester-state.service";
import { reserveToday, withLedgerGuard } from "../../server/modules/digesters/feed-capacity";
import { createPerson, clientFor, signedInClient, sql, type ApiClient } from "../helpers/db";
import { committedFromRows, createDropOff, ledgerDay, today, warmDigester } from "../helpers/steward-fixtures";

const app = createApp({ requestLogging: false });

// Check values, DOMAIN.md §1: one 10 L bucket at 0.5 kg/L [judgement] = 5 kg; the default mix holds
// 0.26 × 0.87 = 0.2262 kg VS per kg [read: Zhang et al. 2007] → 1.131 kg VS per bucket [derived].
const BUCKET_KG_VS = 1.131;
// A 10 m³ digester at 35 °C and pH 7.0 fed 10 kg VS on each of the last 7 days (DOMAIN.md §2):
// organic load 1.5 × 1 × 10 = 15 [read: Werner, Stöhr & Hees 1989]; liquid limit 10 000 L / 40 d
// = 250 L a day ÷ (1 + 26/8 − 1) × 0.2262 = 17.4; rolling week 7 × 15 − 6 × 10 = 45; week-on-week
// 1.2 × 10 = 12 kg VS [judgement] binds → 12 / 1.131 = 10.6 buckets: room for exactly 10 [derived].
const TEN_BUCKET_HISTORY_KG_VS = 10;
const WEEK_RAMP_LIMIT_KG_VS = 12;

async function stewardOf(digesterId: number) {
  return signedInClient(app, { roles: ["steward"], stewardOf: [digesterId] });
}

const statusOf = async (dropOffId: number) =>
  (
    await sql<{
      status: string;
      for_date: string;
      override_reason: string | null;
      handled_by_person_id: number | null;
      turned_away_reason: string | null;
      steward_note: string | null;
    }>(
      `SELECT status, for_date::text, override_reason, handled_by_person_id, turned_away_reason, steward_note FROM drop_offs WHERE id = $1`,
      [dropOffId],
    )
  )[0]!;

describe("the steward's today view", () => {
  it("when a steward opens today, then each of their digesters shows the budget in words, the drop-offs waiting and the readings with their age", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const { digester: notMine } = await warmDigester();
    const waitingToday = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const waitingYesterday = await createDropOff({
      householdId: household.id,
      digesterId: digester.id,
      forDate: addDays(today(), -1),
    });
    const tomorrow = await createDropOff({
      householdId: household.id,
      digesterId: digester.id,
      forDate: addDays(today(), 1),
    });
    const accepted = await createDropOff({ householdId: household.id, digesterId: digester.id, status: "accepted" });
    const steward = await stewardOf(digester.id);

    const res = await steward.get("/api/steward/today");
    expect(res.status).toBe(200);
    expect(res.body.date).toBe(today());
    expect(res.body.digesters.map((d: { id: number }) => d.id)).toEqual([digester.id]);
    const day = res.body.digesters[0];
    expect(day.id).not.toBe(notMine.id);
    expect(day.budget.binding).toBe("weekRamp");
    expect(day.budget.explanation).toMatch(/week-on-week/i);
    // The accepted bucket already counts: 12 − 1.131 kg VS left.
    expect(day.budget.committedKgVs).toBeCloseTo(BUCKET_KG_VS, 3);
    expect(day.budget.budgetKgVs).toBeCloseTo(WEEK_RAMP_LIMIT_KG_VS - BUCKET_KG_VS, 2);
    expect(day.waiting.map((w: { id: number }) => w.id)).toEqual([waitingYesterday.id, waitingToday.id]);
    expect(day.waiting.map((w: { id: number }) => w.id)).not.toContain(tomorrow.id);
    expect(day.accepted.map((a: { id: number }) => a.id)).toEqual([accepted.id]);
    // Dilution water w = 26/8 − 1 = 2.25 L/kg (DOMAIN.md §2 limit 7 [derived]) × 5 kg = 11.25 → 11.3 L.
    expect(day.waiting[1].suggestedWaterLitres).toBe(11.3);
    expect(day.budget.targetTsPercent).toBe(8);
    expect(day.waiting[1]).toMatchObject({
      householdName: expect.any(String),
      bucketCount: 1,
      bucketLitres: 10,
      fitsToday: true,
      citrusOverLimit: false,
    });
    expect(day.readings.temperatureC).toMatchObject({ value: 35, stale: false, maxAgeHours: 48 });
    expect(day.readings.temperatureC.ageHours).toBeGreaterThanOrEqual(0.1);
    expect(day.readings.ph).toMatchObject({ value: 7, stale: false, maxAgeHours: 168 });
  });

  it("when the readings are older than DOMAIN.md's limits (temperature 48 h, pH 7 days), then they are flagged and the warnings say what to do", async () => {
    const { digester } = await warmDigester({ temperatureC: null, ph: null });
    await sql(
      `INSERT INTO readings (digester_id, taken_at, temperature_c) VALUES ($1, now() - interval '4 days', 33) RETURNING id`,
      [digester.id],
    );
    await sql(
      `INSERT INTO readings (digester_id, taken_at, ph) VALUES ($1, now() - interval '8 days', 7.1) RETURNING id`,
      [digester.id],
    );
    const steward = await stewardOf(digester.id);
    const day = (await steward.get("/api/steward/today")).body.digesters[0];
    expect(day.readings.temperatureC).toMatchObject({ value: 33, stale: true });
    expect(day.readings.temperatureC.ageHours).toBeGreaterThan(95);
    expect(day.readings.ph).toMatchObject({ value: 7.1, stale: true });
    expect(day.budget.binding).toBe("temperatureUnknown");
    expect(day.budget.budgetKgVs).toBe(0);
    const codes = day.budget.warnings.map((w: { code: string }) => w.code);
    expect(codes).toEqual(expect.arrayContaining(["temperatureUnknown", "noRecentPh"]));
    const ph = day.budget.warnings.find((w: { code: string }) => w.code === "noRecentPh");
    expect(ph.actions).toEqual(["Measure pH and log it."]);
  });

  it("when a coordinator opens today, then every digester is there; residents and gardeners are refused", async () => {
    const { digester: a } = await warmDigester();
    const { digester: b } = await warmDigester();
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const ids = (await coordinator.get("/api/steward/today")).body.digesters.map((d: { id: number }) => d.id);
    expect(ids).toEqual(expect.arrayContaining([a.id, b.id]));
    const resident = await signedInClient(app, { roles: ["resident"] });
    expect((await resident.get("/api/steward/today")).status).toBe(403);
  });
});

describe("accepting a drop-off", () => {
  it("when it fits, then it is accepted, counts against today's budget, and the ledger records the cap and the load", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({});
    expect(res.status).toBe(200);
    expect(res.body.dropOff).toMatchObject({ id: drop.id, status: "accepted", overrideReason: null });
    expect(res.body.feeding).toBeNull();
    expect(res.body.budget.budgetKgVs).toBeCloseTo(WEEK_RAMP_LIMIT_KG_VS - BUCKET_KG_VS, 2);
    const row = await statusOf(drop.id);
    expect(row).toMatchObject({ status: "accepted", handled_by_person_id: steward.person.id });
    const ledger = await ledgerDay(digester.id);
    expect(ledger!.committed).toBeCloseTo(BUCKET_KG_VS, 4);
    expect(ledger!.cap).toBeCloseTo(WEEK_RAMP_LIMIT_KG_VS, 3);
    expect(ledger!.override).toBe(0);
  });

  it("when accepted and fed in one step, then a feeding linked to the drop-off is written with the suggested dilution water", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({ feedNow: true });
    expect(res.status).toBe(200);
    expect(res.body.dropOff.status).toBe("fed");
    // Dilution water w = TS/TS_target − 1 = 26/8 − 1 = 2.25 L/kg (DOMAIN.md §2 limit 7 [derived]); 5 kg → 11.25 → 11.3 L.
    expect(res.body.feeding).toMatchObject({
      dropOffId: drop.id,
      freshKg: 5,
      kgVs: BUCKET_KG_VS,
      waterLitres: 11.3,
      fedOn: today(),
    });
    const feedings = await sql<{ drop_off_id: number; water_litres: string }>(
      `SELECT drop_off_id, water_litres FROM feedings WHERE drop_off_id = $1`,
      [drop.id],
    );
    expect(feedings).toHaveLength(1);
    expect((await statusOf(drop.id)).status).toBe("fed");
    // Fed counts once: the ledger holds the bucket from the feeding, not twice.
    expect((await ledgerDay(digester.id))!.committed).toBeCloseTo(BUCKET_KG_VS, 4);
  });

  it("when accepted and fed with water given, then that water is recorded", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({ feedNow: true, waterLitres: 9.5 });
    expect(res.status).toBe(200);
    expect(res.body.feeding.waterLitres).toBe(9.5);
  });

  it("when it does not fit, then it is a 409 in the error shape and nothing changes", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    // 13 kg VS by weight: above the 12 kg VS the week-on-week rise allows today.
    const big = await createDropOff({ householdId: household.id, digesterId: digester.id, weightKg: 13 / 0.2262 });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/drop-offs/${big.id}/accept`).send({});
    expect(res.status).toBe(409);
    expect(res.body).toEqual({
      error: {
        code: "conflict",
        message: expect.stringMatching(/over today's budget/i),
        fields: { override: expect.any(String) },
      },
    });
    expect((await statusOf(big.id)).status).toBe("pending");
    expect(await ledgerDay(digester.id)).toBeUndefined();
  });

  it("when it does not fit but the steward overrides with a reason, then it is accepted and the override is recorded", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const big = await createDropOff({ householdId: household.id, digesterId: digester.id, weightKg: 13 / 0.2262 });
    const steward = await stewardOf(digester.id);
    const res = await steward
      .post(`/api/drop-offs/${big.id}/accept`)
      .send({ override: { reason: "Festival leftovers, pH checked" } });
    expect(res.status).toBe(200);
    expect(res.body.dropOff.overrideReason).toBe("Festival leftovers, pH checked");
    expect((await statusOf(big.id)).override_reason).toBe("Festival leftovers, pH checked");
    const ledger = (await ledgerDay(digester.id))!;
    expect(ledger.committed).toBeCloseTo(big.kgVs, 4);
    expect(ledger.override).toBeCloseTo(big.kgVs - WEEK_RAMP_LIMIT_KG_VS, 3);
    expect(ledger.committed).toBeLessThanOrEqual(ledger.cap! + ledger.override + 1e-9);
  });

  it("when an override is sent for a drop-off that fits, then no override is recorded", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({ override: { reason: "just in case" } });
    expect(res.status).toBe(200);
    expect((await statusOf(drop.id)).override_reason).toBeNull();
  });

  it("when the budget is unknown (no temperature), then accepting needs an override", async () => {
    const { digester, household } = await warmDigester({ temperatureC: null });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const refused = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({});
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/log(ged)? a temperature|temperature is logged/i);
    const accepted = await steward
      .post(`/api/drop-offs/${drop.id}/accept`)
      .send({ override: { reason: "Measured 34 °C by hand, logging later" } });
    expect(accepted.status).toBe(200);
  });

  it("when the digester is resting or offline, then accepting is refused even with an override", async () => {
    for (const status of ["resting", "offline"] as const) {
      const { digester, household } = await warmDigester({ status, previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
      const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
      const steward = await stewardOf(digester.id);
      const res = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({ override: { reason: "please" } });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe("digester_closed");
      expect(res.body.error.message).toContain(status);
      expect((await statusOf(drop.id)).status).toBe("pending");
    }
  });

  it("when another digester's steward or a resident tries, then it is 403 and nothing changes", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const { digester: other } = await warmDigester();
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const otherSteward = await stewardOf(other.id);
    expect((await otherSteward.post(`/api/drop-offs/${drop.id}/accept`).send({})).status).toBe(403);
    expect(
      (await otherSteward.post(`/api/drop-offs/${drop.id}/turn-away`).send({ reason: "contamination" })).status,
    ).toBe(403);
    const resident = await signedInClient(app, { roles: ["resident"], householdId: household.id });
    expect((await resident.post(`/api/drop-offs/${drop.id}/accept`).send({})).status).toBe(403);
    expect((await statusOf(drop.id)).status).toBe("pending");
  });

  it("when it was already decided, cancelled, unknown or for a later day, then the answer says so", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    for (const status of ["accepted", "fed", "turned_away", "cancelled"] as const) {
      const drop = await createDropOff({
        householdId: household.id,
        digesterId: digester.id,
        status,
        forDate: addDays(today(), -2),
      });
      const res = await steward.post(`/api/drop-offs/${drop.id}/accept`).send({});
      expect({ status, code: res.status }).toEqual({ status, code: 409 });
    }
    const later = await createDropOff({
      householdId: household.id,
      digesterId: digester.id,
      forDate: addDays(today(), 1),
    });
    const res = await steward.post(`/api/drop-offs/${later.id}/accept`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain(addDays(today(), 1));
    expect((await steward.post(`/api/drop-offs/2147483647/accept`).send({})).status).toBe(404);
    expect((await steward.post(`/api/drop-offs/abc/accept`).send({})).status).toBe(400);
    expect((await steward.post(`/api/drop-offs/${later.id}/accept`).send({ feedNow: "yes" })).status).toBe(400);
    expect((await steward.post(`/api/drop-offs/${later.id}/accept`).send({ status: "fed" })).status).toBe(400);
  });

  it("when a drop-off from an earlier day is accepted, then it counts today, when its scraps go in", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({
      householdId: household.id,
      digesterId: digester.id,
      forDate: addDays(today(), -1),
    });
    const steward = await stewardOf(digester.id);
    expect((await steward.post(`/api/drop-offs/${drop.id}/accept`).send({})).status).toBe(200);
    expect((await statusOf(drop.id)).for_date).toBe(today());
    expect(await committedFromRows(digester.id)).toBeCloseTo(BUCKET_KG_VS, 4);
  });
});

describe("feeding and turning away", () => {
  it("when an accepted drop-off is fed, then it becomes fed with one linked feeding and today's load does not change", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    await steward.post(`/api/drop-offs/${drop.id}/accept`).send({});
    const before = (await ledgerDay(digester.id))!.committed;
    const res = await steward.post(`/api/drop-offs/${drop.id}/feed`).send({ waterLitres: 10 });
    expect(res.status).toBe(200);
    expect(res.body.dropOff.status).toBe("fed");
    expect(res.body.feeding).toMatchObject({ dropOffId: drop.id, waterLitres: 10 });
    expect((await ledgerDay(digester.id))!.committed).toBeCloseTo(before, 4);
    expect(await committedFromRows(digester.id)).toBeCloseTo(before, 4);
    // Feeding twice is refused.
    expect((await steward.post(`/api/drop-offs/${drop.id}/feed`).send({})).status).toBe(409);
  });

  it("when a waiting drop-off is fed before it is accepted, then it is a 409 asking to accept first", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/drop-offs/${drop.id}/feed`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/accept/i);
  });

  it("when a drop-off is turned away with a reason, then it is recorded, and an accepted one gives its room back", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const pending = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const accepted = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    await steward.post(`/api/drop-offs/${accepted.id}/accept`).send({});
    expect((await ledgerDay(digester.id))!.committed).toBeCloseTo(BUCKET_KG_VS, 4);

    const first = await steward
      .post(`/api/drop-offs/${pending.id}/turn-away`)
      .send({ reason: "too_much_citrus", note: "Mostly orange peel" });
    expect(first.status).toBe(200);
    expect(await statusOf(pending.id)).toMatchObject({
      status: "turned_away",
      turned_away_reason: "too_much_citrus",
      steward_note: "Mostly orange peel",
    });

    const second = await steward.post(`/api/drop-offs/${accepted.id}/turn-away`).send({ reason: "contamination" });
    expect(second.status).toBe(200);
    expect(second.body.budget.committedKgVs).toBe(0);
    expect((await ledgerDay(digester.id))!.committed).toBeCloseTo(0, 4);
    expect(
      (await steward.post(`/api/drop-offs/${accepted.id}/turn-away`).send({ reason: "contamination" })).status,
    ).toBe(409);
  });

  it("when the reason is 'other' without a note, or not one of the reasons, then it is a 400 naming the field", async () => {
    const { digester, household } = await warmDigester();
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    const other = await steward.post(`/api/drop-offs/${drop.id}/turn-away`).send({ reason: "other" });
    expect(other.status).toBe(400);
    expect(other.body.error.fields).toHaveProperty("note");
    const unknown = await steward.post(`/api/drop-offs/${drop.id}/turn-away`).send({ reason: "smelly" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toHaveProperty("reason");
    expect((await statusOf(drop.id)).status).toBe("pending");
  });
});

describe("capacity under concurrency", () => {
  it("when 50 accepts arrive at once for room of 10 buckets, then exactly 10 succeed, 40 get 409, and the database never goes over", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    // The precondition, from the same state service the app uses: room for 10 buckets, not 11.
    const [state] = await loadDigestersToday([digester.id]);
    expect(state!.budget.budgetKgVs).toBeCloseTo(WEEK_RAMP_LIMIT_KG_VS, 6);
    expect(state!.budget.budgetBuckets).toBeGreaterThanOrEqual(10);
    expect(state!.budget.budgetBuckets).toBeLessThan(11);

    const drops: { id: number; kgVs: number }[] = [];
    for (let i = 0; i < 50; i += 1)
      drops.push(await createDropOff({ householdId: household.id, digesterId: digester.id }));
    const stewards: ApiClient[] = [];
    for (let i = 0; i < 5; i += 1) {
      const person = await createPerson({ roles: ["steward"], stewardOf: [digester.id] });
      stewards.push(await clientFor(app, person));
    }
    const responses = await Promise.all(
      drops.map((d, i) => stewards[i % stewards.length]!.post(`/api/drop-offs/${d.id}/accept`).send({})),
    );
    const statuses = responses.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(10);
    expect(statuses.filter((s) => s === 409)).toHaveLength(40);
    for (const r of responses.filter((x) => x.status === 409)) {
      expect(r.body).toEqual({
        error: { code: "conflict", message: expect.any(String), fields: { override: expect.any(String) } },
      });
    }
    const [{ accepted, kgVs }] = (await sql<{ accepted: string; kgVs: number }>(
      `SELECT count(*) AS accepted, coalesce(sum(kg_vs), 0)::float8 AS "kgVs" FROM drop_offs WHERE digester_id = $1 AND status = 'accepted'`,
      [digester.id],
    )) as [{ accepted: string; kgVs: number }];
    expect(Number(accepted)).toBe(10);
    expect(kgVs).toBeCloseTo(10 * BUCKET_KG_VS, 4);
    expect(kgVs).toBeLessThanOrEqual(WEEK_RAMP_LIMIT_KG_VS);
    const ledger = (await ledgerDay(digester.id))!;
    expect(ledger.committed).toBeCloseTo(kgVs, 4);
    expect(ledger.override).toBe(0);
  });

  it("when a commitment races past the application's check on a stale budget, then the ledger's constraint refuses it with the same 409", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const drops: { id: number; kgVs: number }[] = [];
    for (let i = 0; i < 11; i += 1)
      drops.push(await createDropOff({ householdId: household.id, digesterId: digester.id }));
    // A view of the budget taken before anything was accepted: it says all 10.6 buckets are free.
    const [stale] = await loadDigestersToday([digester.id]);
    const steward = await stewardOf(digester.id);
    for (const d of drops.slice(0, 10))
      expect((await steward.post(`/api/drop-offs/${d.id}/accept`).send({})).status).toBe(200);

    const late = drops[10]!;
    // Inside one transaction, as a service would: the stale check passes, the trigger adds the load, the CHECK refuses it.
    const insideAttempt = withLedgerGuard(() =>
      sequelize().transaction(async (t) => {
        await reserveToday(t, stale!, late.kgVs, undefined);
        await sequelize().query(`UPDATE drop_offs SET status = 'accepted' WHERE id = $id`, {
          bind: { id: late.id },
          transaction: t,
        });
      }),
    );
    await expect(insideAttempt).rejects.toMatchObject({ status: 409, code: "conflict" });
    expect((await statusOf(late.id)).status).toBe("pending");
    expect((await ledgerDay(digester.id))!.committed).toBeCloseTo(10 * BUCKET_KG_VS, 4);
  });

  it("when accepted rows are written straight into a capped day, then the database refuses them", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: TEN_BUCKET_HISTORY_KG_VS });
    const first = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    expect((await steward.post(`/api/drop-offs/${first.id}/accept`).send({})).status).toBe(200);
    await expect(
      sql(`UPDATE digester_days SET cap_kg_vs = committed_kg_vs WHERE digester_id = $1 RETURNING day`, [
        digester.id,
      ]).then(() => createDropOff({ householdId: household.id, digesterId: digester.id, status: "accepted" })),
    ).rejects.toThrow(/committed_within_cap/);
  });
});
