import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { DropOff } from "../../../shared/schemas/drop-offs";

interface DropOffRecord extends Omit<DropOff, "createdAt"> {
  createdAt: Date;
}

// NUMERIC columns are cast to float8 (the driver returns NUMERIC as strings); dates as text.
const columns = `
  d.id, d.household_id AS "householdId", d.digester_id AS "digesterId", g.name AS "digesterName",
  p.name AS "loggedBy", d.for_date::text AS "forDate", d.bucket_count AS "bucketCount",
  d.bucket_litres::float8 AS "bucketLitres", d.weight_kg::float8 AS "weightKg", d.mass_source AS "massSource",
  d.fresh_kg::float8 AS "freshKg", d.kg_vs::float8 AS "kgVs", d.mix, d.citrus_percent::float8 AS "citrusPercent",
  d.no_refuse_confirmed AS "noRefuseConfirmed", d.status, d.turned_away_reason AS "turnedAwayReason", d.note,
  f.fed_on::text AS "fedOn", d.created_at AS "createdAt"`;

const from = `
  FROM drop_offs d
  JOIN digesters g ON g.id = d.digester_id
  LEFT JOIN people p ON p.id = d.person_id
  LEFT JOIN feedings f ON f.drop_off_id = d.id`;

const toDropOff = (r: DropOffRecord): DropOff => ({ ...r, createdAt: new Date(r.createdAt).toISOString() });

/** Most rows one household list returns (years of weekly buckets). */
export const HOUSEHOLD_LIST_LIMIT = 2_000;

/** A household's drop-offs, newest first (or just one of them when `id` is given). */
export async function findHouseholdDropOffs(
  householdId: number,
  options: { id?: number; transaction?: Transaction } = {},
): Promise<DropOff[]> {
  const rows = await sequelize().query<DropOffRecord>(
    `SELECT ${columns} ${from}
      WHERE d.household_id = $1 ${options.id === undefined ? "" : "AND d.id = $2"}
      ORDER BY d.for_date DESC, d.id DESC
      LIMIT ${HOUSEHOLD_LIST_LIMIT}`,
    {
      bind: options.id === undefined ? [householdId] : [householdId, options.id],
      type: QueryTypes.SELECT,
      transaction: options.transaction,
    },
  );
  return rows.map(toDropOff);
}

export interface NewDropOff {
  householdId: number;
  digesterId: number;
  personId: number;
  forDate: string;
  bucketCount: number | null;
  bucketLitres: number | null;
  weightKg: number | null;
  massSource: "weighed" | "estimated";
  freshKg: number;
  kgVs: number;
  mix: string;
  citrusPercent: number;
  noRefuseConfirmed: boolean;
  note: string | null;
}

/** Inserts a pending drop-off; returns its id and creation time. */
export async function insertDropOff(transaction: Transaction, d: NewDropOff): Promise<{ id: number; createdAt: Date }> {
  const rows = await sequelize().query<{ id: number; createdAt: Date }>(
    `INSERT INTO drop_offs (household_id, digester_id, person_id, for_date, bucket_count, bucket_litres, weight_kg,
                            mass_source, fresh_kg, kg_vs, mix, citrus_percent, no_refuse_confirmed, note, status)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, 'pending')
     RETURNING id, created_at AS "createdAt"`,
    {
      bind: [
        d.householdId,
        d.digesterId,
        d.personId,
        d.forDate,
        d.bucketCount,
        d.bucketLitres,
        d.weightKg,
        d.massSource,
        d.freshKg,
        d.kgVs,
        d.mix,
        d.citrusPercent,
        d.noRefuseConfirmed,
        d.note,
      ],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows[0]!;
}

/** Cancels the drop-off if it is the household's and still pending, in one statement (a steward may be accepting it right now). */
export async function cancelIfPending(id: number, householdId: number): Promise<boolean> {
  const rows = await sequelize().query<{ id: number }>(
    `UPDATE drop_offs SET status = 'cancelled', updated_at = now()
      WHERE id = $1 AND household_id = $2 AND status = 'pending' RETURNING id`,
    { bind: [id, householdId], type: QueryTypes.SELECT },
  );
  return rows.length === 1;
}

export interface ImpactTotals {
  dropOffCount: number;
  pending: number;
  accepted: number;
  fed: number;
  turnedAway: number;
  cancelled: number;
  fedFreshKg: number;
  fedKgVs: number;
  waterLitres: number;
  firstFedOn: string | null;
  lastFedOn: string | null;
}

/** Counts by status and the fed totals of one household, in one query. */
export async function impactTotals(householdId: number): Promise<ImpactTotals> {
  const rows = await sequelize().query<ImpactTotals>(
    `SELECT count(*)::int AS "dropOffCount",
            count(*) FILTER (WHERE d.status = 'pending')::int AS pending,
            count(*) FILTER (WHERE d.status = 'accepted')::int AS accepted,
            count(*) FILTER (WHERE d.status = 'fed')::int AS fed,
            count(*) FILTER (WHERE d.status = 'turned_away')::int AS "turnedAway",
            count(*) FILTER (WHERE d.status = 'cancelled')::int AS cancelled,
            coalesce(sum(d.fresh_kg) FILTER (WHERE d.status = 'fed'), 0)::float8 AS "fedFreshKg",
            coalesce(sum(d.kg_vs) FILTER (WHERE d.status = 'fed'), 0)::float8 AS "fedKgVs",
            coalesce(sum(f.water_litres) FILTER (WHERE d.status = 'fed'), 0)::float8 AS "waterLitres",
            min(coalesce(f.fed_on, d.for_date)) FILTER (WHERE d.status = 'fed')::text AS "firstFedOn",
            max(coalesce(f.fed_on, d.for_date)) FILTER (WHERE d.status = 'fed')::text AS "lastFedOn"
       FROM drop_offs d LEFT JOIN feedings f ON f.drop_off_id = d.id
      WHERE d.household_id = $1`,
    { bind: [householdId], type: QueryTypes.SELECT },
  );
  return rows[0]!;
}
