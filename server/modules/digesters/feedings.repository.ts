/**
 * `feedings`, owned by the digester's day: scraps that went into a digester (from a drop-off or
 * by hand). Written through the Feeding model; the list stays named SQL (see below).
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { DropOffMix } from "../../../shared/domain";
import type { Feeding } from "../../../shared/schemas/feedings";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

// NUMERIC columns are cast to float8 in named SQL: the driver returns NUMERIC as strings.
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
  mix: DropOffMix | null;
  citrusPercent: number;
  overrideReason: string | null;
  note: string | null;
}

/** Inserts a feeding; returns it as the contract shows it (with the drop-off's household and who entered it). */
export async function insertFeeding(t: Transaction, input: NewFeeding): Promise<Feeding> {
  const { id } = await models().Feeding.create(input, { transaction: t });
  const [row] = await sequelize().query<Feeding>(
    `SELECT ${feedingColumns} FROM feedings f ${feedingJoins} WHERE f.id = $id`,
    {
      type: QueryTypes.SELECT,
      bind: { id },
      transaction: t,
    },
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
  // SQL kept for a hot read (GET /api/steward/today): a list joined three ways (drop-off →
  // household, person), the same statement the nested model include would build, without
  // building model instances for each row.
  const rows = await sequelize().query<Feeding>(
    `SELECT ${feedingColumns} FROM feedings f ${feedingJoins}
      WHERE f.digester_id = ANY($ids::int[]) AND f.fed_on BETWEEN $fromDay AND $toDay
      ORDER BY f.fed_on, f.fed_at, f.id`,
    { type: QueryTypes.SELECT, bind: { ids: digesterIds, fromDay, toDay }, transaction },
  );
  return rows.map(normalise);
}
