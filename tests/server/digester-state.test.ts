import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { loadDigestersToday } from "../../server/modules/digesters/digester-state.service";
import { addDays, localDate } from "../../server/lib/clock";
import { createDigester, signedInClient, sql, createHousehold } from "../helpers/db";

const now = new Date();
const today = localDate(now);
const hoursAgo = (h: number) => new Date(now.getTime() - h * 3_600_000);

async function reading(digesterId: number, takenAt: Date, values: { temperatureC?: number; ph?: number }) {
  await sql(`INSERT INTO readings (digester_id, taken_at, temperature_c, ph) VALUES ($1, $2, $3, $4)`, [
    digesterId,
    takenAt,
    values.temperatureC ?? null,
    values.ph ?? null,
  ]);
}

async function fed(digesterId: number, day: string, kgVs: number) {
  await sql(`INSERT INTO feedings (digester_id, fed_on, fresh_kg, kg_vs) VALUES ($1, $2, $3, $4)`, [
    digesterId,
    day,
    kgVs / 0.2262,
    kgVs,
  ]);
}

/** A 2 m³ established digester at 35 °C, pH 7.0, fed 2.0 kg VS on each of the last 7 days. */
async function steadyDigester() {
  const d = await createDigester({ workingVolumeM3: 2, startedOn: addDays(today, -200) });
  await reading(d.id, hoursAgo(3), { temperatureC: 35, ph: 7.0 });
  for (let i = 1; i <= 7; i++) await fed(d.id, addDays(today, -i), 2.0);
  return d;
}

describe("today's feed budget from the database", () => {
  it("when a warm, stable digester was fed 2 kg VS a day, then the week-on-week ramp binds at 1.2 × 2 = 2.4 kg VS", async () => {
    // Limits (DOMAIN.md §2): organic 1.5 × 1 × 2 = 3.0; week ramp 1.2 × 2.0 = 2.4 [judgement];
    // rolling week 7 × 3.0 − 6 × 2.0 = 9.0; hydraulic ≈ 3.5 [derived]. The smallest binds.
    const d = await steadyDigester();
    const [state] = await loadDigestersToday([d.id], { now });
    expect(state!.budget.binding).toBe("weekRamp");
    expect(state!.budget.budgetKgVs).toBeCloseTo(2.4, 6);
    expect(state!.previous7DaysKgVs).toEqual([2, 2, 2, 2, 2, 2, 2]);
  });

  it("when drop-offs were accepted and fed today, then they come off today's budget; pending ones do not", async () => {
    const d = await steadyDigester();
    const h = await createHousehold();
    await fed(d.id, today, 0.5);
    await sql(
      `INSERT INTO drop_offs (household_id, digester_id, for_date, weight_kg, mass_source, fresh_kg, kg_vs, status)
       VALUES ($1, $2, $3, 4, 'weighed', 4, 0.9, 'accepted'), ($1, $2, $3, 2, 'weighed', 2, 0.45, 'pending')`,
      [h.id, d.id, today],
    );
    const [state] = await loadDigestersToday([d.id], { now });
    expect(state!.committedTodayKgVs).toBeCloseTo(1.4, 6);
    expect(state!.budget.budgetKgVs).toBeCloseTo(2.4 - 1.4, 6);
    expect(state!.pendingTodayKgVs).toBeCloseTo(0.45, 6);
  });

  it("when no temperature was logged in the last 3 days, then the budget is 0 and asks for a temperature", async () => {
    const d = await createDigester({ workingVolumeM3: 2, startedOn: addDays(today, -200) });
    await reading(d.id, hoursAgo(100), { temperatureC: 35 });
    const [state] = await loadDigestersToday([d.id], { now });
    expect(state!.budget.binding).toBe("temperatureUnknown");
    expect(state!.budget.budgetKgVs).toBe(0);
  });

  it("when the digester is resting, then it welcomes nothing and says why", async () => {
    const d = await createDigester({ workingVolumeM3: 2, status: "resting", startedOn: addDays(today, -200) });
    await reading(d.id, hoursAgo(3), { temperatureC: 35, ph: 7.1 });
    const [state] = await loadDigestersToday([d.id], { now });
    expect(state!.budget.budgetKgVs).toBe(0);
    expect(state!.budget.explanation).toMatch(/resting/);
  });

  it("when a signed-in person lists digesters, then each has today's room and binding limit", async () => {
    const d = await steadyDigester();
    const client = await signedInClient(createApp({ requestLogging: false }), { roles: ["resident"] });
    const res = await client.get("/api/digesters");
    expect(res.status).toBe(200);
    const mine = res.body.find((x: { id: number }) => x.id === d.id);
    expect(mine).toMatchObject({
      id: d.id,
      status: "active",
      location: { lat: 51.5, lng: -0.1 },
      today: { binding: "weekRamp" },
    });
    // 2.4 kg VS of the default mix (0.2262 kg VS/kg [read: Zhang et al. 2007 via DOMAIN.md §1]) ≈ 10.6 kg.
    expect(mine.today.budgetKgScraps).toBeCloseTo(2.4 / 0.2262, 0);
  });
});
