/**
 * Fixtures for the steward-side API tests: a digester in a known state (volume, a recent
 * temperature and pH, a feeding history), drop-offs whose quantities come from the same
 * shared/domain function the app uses, and a look at the daily ledger.
 */
import { dropOffQuantities, type DropOffMix } from "../../shared/domain";
import { addDays, localDate } from "../../server/lib/clock";
import { createDigester, createHousehold, sql } from "./db";

export const today = () => localDate(new Date());

export interface WarmDigesterOptions {
  workingVolumeM3?: number;
  /** Digester temperature logged five minutes ago (null: none). */
  temperatureC?: number | null;
  /** pH logged five minutes ago (null: none). */
  ph?: number | null;
  /** kg VS fed on each of the 7 days before today (0: none). */
  previousDailyKgVs?: number;
  status?: "active" | "resting" | "offline";
  startedOn?: string;
}

/** A digester with recent readings and a feeding history, plus a household that brings scraps to it. */
export async function warmDigester(options: WarmDigesterOptions = {}) {
  const digester = await createDigester({
    workingVolumeM3: options.workingVolumeM3 ?? 10,
    status: options.status,
    startedOn: options.startedOn ?? "2025-01-06",
  });
  const temperatureC = options.temperatureC === undefined ? 35 : options.temperatureC;
  const ph = options.ph === undefined ? 7.0 : options.ph;
  if (temperatureC !== null || ph !== null) {
    await sql(
      `INSERT INTO readings (digester_id, taken_at, temperature_c, ph) VALUES ($1, now() - interval '5 minutes', $2, $3) RETURNING id`,
      [digester.id, temperatureC, ph],
    );
  }
  const perDay = options.previousDailyKgVs ?? 0;
  if (perDay > 0) {
    for (let back = 1; back <= 7; back += 1) {
      await sql(`INSERT INTO feedings (digester_id, fed_on, fresh_kg, kg_vs) VALUES ($1, $2, $3, $4) RETURNING id`, [
        digester.id,
        addDays(today(), -back),
        Math.round((perDay / 0.2262) * 1000) / 1000,
        perDay,
      ]);
    }
  }
  const household = await createHousehold({ assignedDigesterId: digester.id });
  return { digester, household };
}

export interface DropOffFixture {
  householdId: number;
  digesterId: number;
  forDate?: string;
  bucketCount?: number;
  bucketLitres?: number;
  weightKg?: number;
  mix?: DropOffMix;
  citrusPercent?: number;
  status?: "pending" | "accepted" | "fed" | "turned_away" | "cancelled";
}

/** Inserts a drop-off with quantities from shared/domain `dropOffQuantities` (default: one 10 L bucket of mixed scraps, pending, today). */
export async function createDropOff(f: DropOffFixture): Promise<{ id: number; kgVs: number; freshKg: number }> {
  const byWeight = f.weightKg !== undefined;
  const q = dropOffQuantities({
    bucketCount: byWeight ? null : (f.bucketCount ?? 1),
    bucketLitres: byWeight ? null : (f.bucketLitres ?? 10),
    weightKg: f.weightKg ?? null,
    mix: f.mix ?? "mixed",
    citrusPercent: f.citrusPercent ?? 0,
  });
  const freshKg = Math.round(q.freshKg * 1000) / 1000;
  const kgVs = Math.round(q.kgVs * 10_000) / 10_000;
  const [row] = await sql<{ id: number }>(
    `INSERT INTO drop_offs (household_id, digester_id, for_date, bucket_count, bucket_litres, weight_kg, mass_source, fresh_kg, kg_vs, mix,
                            citrus_percent, status, turned_away_reason)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13) RETURNING id`,
    [
      f.householdId,
      f.digesterId,
      f.forDate ?? today(),
      byWeight ? null : (f.bucketCount ?? 1),
      byWeight ? null : (f.bucketLitres ?? 10),
      f.weightKg ?? null,
      q.massSource,
      freshKg,
      kgVs,
      f.mix ?? "mixed",
      f.citrusPercent ?? 0,
      f.status ?? "pending",
      f.status === "turned_away" ? "other" : null,
    ],
  );
  return { id: row!.id, kgVs, freshKg };
}

/** The digester's ledger row for a day (numbers, or undefined when there is none). */
export async function ledgerDay(digesterId: number, day = today()) {
  const [row] = await sql<{ committed: number; cap: number | null; override: number }>(
    `SELECT committed_kg_vs::float8 AS committed, cap_kg_vs::float8 AS cap, override_kg_vs::float8 AS override
       FROM digester_days WHERE digester_id = $1 AND day = $2`,
    [digesterId, day],
  );
  return row;
}

/** What the budget counts for a digester's day, straight from the source tables (fed + accepted, kg VS). */
export async function committedFromRows(digesterId: number, day = today()): Promise<number> {
  const [row] = await sql<{ total: number }>(
    `SELECT coalesce((SELECT sum(kg_vs) FROM feedings WHERE digester_id = $1 AND fed_on = $2), 0)::float8
          + coalesce((SELECT sum(kg_vs) FROM drop_offs WHERE digester_id = $1 AND for_date = $2 AND status = 'accepted'), 0)::float8 AS total`,
    [digesterId, day],
  );
  return row!.total;
}
