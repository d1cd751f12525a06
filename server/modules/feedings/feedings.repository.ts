import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { Feeding } from "../../../shared/schemas/feedings";

// NUMERIC columns are cast to float8: the driver returns NUMERIC as strings.
const feedingColumns = `
  f.id, f.digester_id AS "digesterId", f.fed_on::text AS "fedOn", f.fed_at AS "fedAt",
  f.fresh_kg::float8 AS "freshKg", f.kg_vs::float8 AS "kgVs", f.water_litres::float8 AS "waterLitres",
  f.drop_off_id AS "dropOffId", h.name AS "householdName", f.mix, f.override_reason AS "overrideReason",
  f.note, p.name AS "enteredBy"`;

const feedingJoins = `
  LEFT JOIN drop_offs d ON d.id = f.drop_off_id
  LEFT JOIN households h ON h.id = d.household_id
  LEFT JOIN people p ON p.id = f.person_id`;

/** The driver gives timestamptz as a Date; the contract carries ISO strings. */
const normalise = (row: Feeding): Feeding => ({ ...row, fedAt: new Date(row.fedAt).toISOString() });

export interface NewFeeding {
  digesterId: number;
  fedOn: string;
  fedAt: Date;
  freshKg: number;
  kgVs: number;
  waterLitres: number;
  dropOffId: number | null;
  personId: number;
  mix: string | null;
  citrusPercent: number;
  overrideReason: string | null;
  note: string | null;
}

export async function insertFeeding(t: Transaction, input: NewFeeding): Promise<Feeding> {
  const [row] = await sequelize().query<Feeding>(
    `WITH f AS (
       INSERT INTO feedings (digester_id, fed_on, fed_at, fresh_kg, kg_vs, water_litres, drop_off_id, person_id, mix, citrus_percent,
                             override_reason, note)
       VALUES ($digesterId, $fedOn, $fedAt, $freshKg, $kgVs, $waterLitres, $dropOffId, $personId, $mix, $citrusPercent,
               $overrideReason, $note)
       RETURNING *)
     SELECT ${feedingColumns} FROM f ${feedingJoins}`,
    { type: QueryTypes.SELECT, bind: { ...input }, transaction: t },
  );
  return normalise(row!);
}

/** Feedings of the given digesters from `fromDay` to `toDay` (inclusive), oldest first. */
export async function listFeedings(
  digesterIds: number[],
  fromDay: string,
  toDay: string,
  transaction?: Transaction,
): Promise<Feeding[]> {
  const rows = await sequelize().query<Feeding>(
    `SELECT ${feedingColumns} FROM feedings f ${feedingJoins}
      WHERE f.digester_id = ANY($ids::int[]) AND f.fed_on BETWEEN $fromDay AND $toDay
      ORDER BY f.fed_on, f.fed_at, f.id`,
    { type: QueryTypes.SELECT, bind: { ids: digesterIds, fromDay, toDay }, transaction },
  );
  return rows.map(normalise);
}

/**
 * Stamps today's row of the ledger (0004-steward-feed-ledger.ts) before a commitment: the cap
 * is the limit just computed under the digester's lock (never below what is already committed,
 * so a lowered limit never invalidates the past), and an overridden amount widens it. The
 * trigger then adds the load; the CHECK refuses anything above cap + overrides.
 */
export async function stampLedgerDay(
  t: Transaction,
  digesterId: number,
  day: string,
  capKgVs: number,
  overrideKgVs: number,
) {
  await sequelize().query(
    `INSERT INTO digester_days (digester_id, day, cap_kg_vs, override_kg_vs) VALUES ($digesterId, $day, $cap, $override)
     ON CONFLICT (digester_id, day) DO UPDATE
       SET cap_kg_vs = GREATEST(EXCLUDED.cap_kg_vs, digester_days.committed_kg_vs),
           override_kg_vs = digester_days.override_kg_vs + EXCLUDED.override_kg_vs,
           updated_at = now()`,
    { type: QueryTypes.INSERT, bind: { digesterId, day, cap: capKgVs, override: overrideKgVs }, transaction: t },
  );
}

/** A late record for an earlier day is a fact, not a new commitment: it widens that day's cap, if any. */
export async function widenLedgerDay(t: Transaction, digesterId: number, day: string, kgVs: number) {
  await sequelize().query(
    `UPDATE digester_days SET override_kg_vs = override_kg_vs + $kgVs, updated_at = now()
      WHERE digester_id = $digesterId AND day = $day AND cap_kg_vs IS NOT NULL`,
    { type: QueryTypes.UPDATE, bind: { digesterId, day, kgVs }, transaction: t },
  );
}

/** True when a database error is the ledger's "committed within cap" check. */
export function isLedgerViolation(err: unknown): boolean {
  const e = err as {
    parent?: { code?: string; constraint?: string };
    original?: { code?: string; constraint?: string };
  };
  const pg = e?.parent ?? e?.original;
  return pg?.code === "23514" && pg.constraint === "committed_within_cap";
}
