import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { DropOffMix } from "../../../shared/domain";
import type { DropOffStatus, TurnedAwayReason } from "../../../shared/schemas/drop-offs";

export interface DropOffRow {
  id: number;
  digesterId: number;
  householdName: string;
  forDate: string;
  bucketCount: number | null;
  bucketLitres: number | null;
  weightKg: number | null;
  massSource: "weighed" | "estimated";
  freshKg: number;
  kgVs: number;
  mix: DropOffMix;
  citrusPercent: number;
  status: DropOffStatus;
  turnedAwayReason: TurnedAwayReason | null;
  note: string | null;
  stewardNote: string | null;
  overrideReason: string | null;
  createdAt: Date;
}

// NUMERIC columns are cast to float8: the driver returns NUMERIC as strings.
const dropOffColumns = `
  d.id, d.digester_id AS "digesterId", h.name AS "householdName", d.for_date::text AS "forDate",
  d.bucket_count AS "bucketCount", d.bucket_litres::float8 AS "bucketLitres", d.weight_kg::float8 AS "weightKg",
  d.mass_source AS "massSource", d.fresh_kg::float8 AS "freshKg", d.kg_vs::float8 AS "kgVs", d.mix,
  d.citrus_percent::float8 AS "citrusPercent", d.status, d.turned_away_reason AS "turnedAwayReason", d.note,
  d.steward_note AS "stewardNote", d.override_reason AS "overrideReason", d.created_at AS "createdAt"`;

/** The digester a drop-off is for (no lock: the caller locks the digester first, then the drop-off). */
export async function findDropOffDigester(t: Transaction, id: number): Promise<number | null> {
  const [row] = await sequelize().query<{ digesterId: number }>(
    `SELECT digester_id AS "digesterId" FROM drop_offs WHERE id = $id`,
    {
      type: QueryTypes.SELECT,
      bind: { id },
      transaction: t,
    },
  );
  return row?.digesterId ?? null;
}

/** One drop-off, locked FOR UPDATE (always after its digester, so locks are taken in one order). */
export async function lockDropOff(t: Transaction, id: number): Promise<DropOffRow | null> {
  const [row] = await sequelize().query<DropOffRow>(
    `SELECT ${dropOffColumns} FROM drop_offs d JOIN households h ON h.id = d.household_id WHERE d.id = $id FOR UPDATE OF d`,
    { type: QueryTypes.SELECT, bind: { id }, transaction: t },
  );
  return row ?? null;
}

/** Drop-offs that need the steward: pending up to today (oldest first), and accepted ones not fed yet. */
export function listOpenDropOffs(digesterIds: number[], today: string): Promise<DropOffRow[]> {
  return sequelize().query<DropOffRow>(
    `SELECT ${dropOffColumns} FROM drop_offs d JOIN households h ON h.id = d.household_id
      WHERE d.digester_id = ANY($ids::int[])
        AND ((d.status = 'pending' AND d.for_date <= $today) OR d.status = 'accepted')
      ORDER BY d.for_date, d.created_at, d.id`,
    { type: QueryTypes.SELECT, bind: { ids: digesterIds, today } },
  );
}

export interface DecisionUpdate {
  status: "accepted" | "fed" | "turned_away";
  forDate?: string;
  turnedAwayReason?: TurnedAwayReason | null;
  stewardNote?: string | null;
  overrideReason?: string | null;
  personId: number;
}

/** Records the steward's decision on a drop-off; the ledger trigger moves its load. */
export async function updateDropOffDecision(t: Transaction, id: number, update: DecisionUpdate): Promise<void> {
  await sequelize().query(
    `UPDATE drop_offs
        SET status = $status,
            for_date = COALESCE($forDate, for_date),
            turned_away_reason = $turnedAwayReason,
            steward_note = COALESCE($stewardNote, steward_note),
            override_reason = COALESCE($overrideReason, override_reason),
            handled_by_person_id = $personId,
            handled_at = now(),
            updated_at = now()
      WHERE id = $id`,
    {
      type: QueryTypes.UPDATE,
      bind: {
        id,
        status: update.status,
        forDate: update.forDate ?? null,
        turnedAwayReason: update.status === "turned_away" ? (update.turnedAwayReason ?? null) : null,
        stewardNote: update.stewardNote ?? null,
        overrideReason: update.overrideReason ?? null,
        personId: update.personId,
      },
      transaction: t,
    },
  );
}
