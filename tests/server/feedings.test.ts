import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { addDays } from "../../server/lib/clock";
import { signedInClient, sql } from "../helpers/db";
import { committedFromRows, createDropOff, ledgerDay, today, warmDigester } from "../helpers/steward-fixtures";

const app = createApp({ requestLogging: false });

// A 10 m³ digester at 35 °C, pH 7.0, fed 10 kg VS a day for a week: the week-on-week rise allows
// 1.2 × 10 = 12 kg VS today (DOMAIN.md §2 limit 5 [judgement]; worked through in steward.test.ts).
const HISTORY_KG_VS = 10;
const LIMIT_KG_VS = 12;

const stewardOf = (digesterId: number) => signedInClient(app, { roles: ["steward"], stewardOf: [digesterId] });

describe("feeding by hand", () => {
  it("when a steward records scraps by hand, then a feeding is written with kg VS of its mix and the suggested dilution water", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    const res = await steward
      .post(`/api/digesters/${digester.id}/feedings`)
      .send({ freshKg: 4, mix: "fruitVeg", note: "Market leftovers" });
    expect(res.status).toBe(201);
    // Fruit & veg: TS 14 %, VS 89 % of TS (DOMAIN.md §1 table defaults [memory: Bouallagui et al. 2005]) → 4 × 0.14 × 0.89 = 0.4984 kg VS [derived].
    expect(res.body.feeding).toMatchObject({
      digesterId: digester.id,
      fedOn: today(),
      freshKg: 4,
      kgVs: 0.4984,
      mix: "fruitVeg",
      dropOffId: null,
      note: "Market leftovers",
    });
    // Dilution water w = 14/8 − 1 = 0.75 L/kg (DOMAIN.md §2 limit 7 [derived]) → 3 L.
    expect(res.body.feeding.waterLitres).toBe(3);
    expect(res.body.budget.budgetKgVs).toBeCloseTo(LIMIT_KG_VS - 0.4984, 3);
    expect(await committedFromRows(digester.id)).toBeCloseTo(0.4984, 4);
    expect((await ledgerDay(digester.id))!.committed).toBeCloseTo(0.4984, 4);
  });

  it("when the water is given, then it is recorded as given", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    const res = await steward.post(`/api/digesters/${digester.id}/feedings`).send({ freshKg: 2, waterLitres: 0 });
    expect(res.status).toBe(201);
    expect(res.body.feeding.waterLitres).toBe(0);
  });

  it("when a hand feeding goes beyond today's budget, then it needs an override, which is recorded", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    // 60 kg of mixed scraps = 13.6 kg VS (0.2262 kg VS/kg [read: Zhang et al. 2007]) > 12.
    const refused = await steward.post(`/api/digesters/${digester.id}/feedings`).send({ freshKg: 60 });
    expect(refused.status).toBe(409);
    expect(refused.body.error.fields).toHaveProperty("override");
    expect(await committedFromRows(digester.id)).toBe(0);
    const res = await steward
      .post(`/api/digesters/${digester.id}/feedings`)
      .send({ freshKg: 60, override: { reason: "Emptying the school kitchen before the holidays" } });
    expect(res.status).toBe(201);
    expect(res.body.feeding.overrideReason).toBe("Emptying the school kitchen before the holidays");
    const [row] = await sql<{ override_reason: string }>(`SELECT override_reason FROM feedings WHERE id = $1`, [
      res.body.feeding.id,
    ]);
    expect(row!.override_reason).toBe("Emptying the school kitchen before the holidays");
  });

  it("when a feeding is recorded late for an earlier day, then it is stored on that day without spending today's budget", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    const yesterday = addDays(today(), -1);
    const res = await steward.post(`/api/digesters/${digester.id}/feedings`).send({ freshKg: 3, fedOn: yesterday });
    expect(res.status).toBe(201);
    expect(res.body.feeding.fedOn).toBe(yesterday);
    expect(await committedFromRows(digester.id)).toBe(0);
    expect(await committedFromRows(digester.id, yesterday)).toBeCloseTo(HISTORY_KG_VS + 3 * 0.2262, 4);
  });

  it("when the day is in the future or too long ago, or the amounts are out of range, then it is a 400 naming the field", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    const cases: [object, string][] = [
      [{ freshKg: 2, fedOn: addDays(today(), 1) }, "fedOn"],
      [{ freshKg: 2, fedOn: addDays(today(), -8) }, "fedOn"],
      [{ freshKg: 2, fedOn: "2026-02-30" }, "fedOn"],
      [{ freshKg: 0 }, "freshKg"],
      [{ freshKg: 501 }, "freshKg"],
      [{ freshKg: "2" }, "freshKg"],
      [{ freshKg: 2, waterLitres: -1 }, "waterLitres"],
      [{ freshKg: 2, mix: "meat" }, "mix"],
      [{ freshKg: 2, override: { reason: "" } }, "override.reason"],
      [{ freshKg: 2, dropOffId: 4 }, "dropOffId"],
    ];
    for (const [body, field] of cases) {
      const res = await steward.post(`/api/digesters/${digester.id}/feedings`).send(body);
      expect({ body, status: res.status, hasField: Object.keys(res.body.error?.fields ?? {}).includes(field) }).toEqual(
        { body, status: 400, hasField: true },
      );
    }
    expect(await committedFromRows(digester.id)).toBe(0);
  });

  it("when the digester is resting, then a feeding today is refused", async () => {
    const { digester } = await warmDigester({ status: "resting", previousDailyKgVs: HISTORY_KG_VS });
    const steward = await stewardOf(digester.id);
    const res = await steward
      .post(`/api/digesters/${digester.id}/feedings`)
      .send({ freshKg: 1, override: { reason: "try" } });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("digester_closed");
  });

  it("when another digester's steward records a feeding, then it is 403", async () => {
    const { digester } = await warmDigester();
    const { digester: other } = await warmDigester();
    const steward = await stewardOf(other.id);
    expect((await steward.post(`/api/digesters/${digester.id}/feedings`).send({ freshKg: 1 })).status).toBe(403);
    expect((await steward.get(`/api/digesters/${digester.id}/feedings`)).status).toBe(403);
  });
});

describe("listing feedings", () => {
  it("when a steward lists feedings, then they come oldest first with the drop-off's household, filtered by day", async () => {
    const { digester, household } = await warmDigester({ previousDailyKgVs: HISTORY_KG_VS });
    const drop = await createDropOff({ householdId: household.id, digesterId: digester.id });
    const steward = await stewardOf(digester.id);
    await steward.post(`/api/drop-offs/${drop.id}/accept`).send({ feedNow: true });
    const all = await steward.get(`/api/digesters/${digester.id}/feedings`);
    expect(all.status).toBe(200);
    expect(all.body).toHaveLength(8);
    const days = all.body.map((f: { fedOn: string }) => f.fedOn);
    expect(days).toEqual([...days].sort());
    expect(all.body.at(-1)).toMatchObject({
      dropOffId: drop.id,
      householdName: household.name,
      enteredBy: steward.person.name,
    });
    const onlyToday = await steward.get(`/api/digesters/${digester.id}/feedings?from=${today()}&to=${today()}`);
    expect(onlyToday.body).toHaveLength(1);
    const reversed = await steward.get(
      `/api/digesters/${digester.id}/feedings?from=${today()}&to=${addDays(today(), -3)}`,
    );
    expect(reversed.status).toBe(400);
    expect((await steward.get(`/api/digesters/${digester.id}/feedings?limit=5`)).status).toBe(400);
  });
});
