/**
 * `drop_offs`, owned by the digester's day: a household's scraps on their way into a digester.
 * Plain reads and writes go through the DropOff model (plain objects out); SQL is named where a
 * row lock or an aggregate needs it.
 */
import { QueryTypes, type Transaction, fn } from "sequelize";
import type { DropOffMix } from "../../../shared/domain";
import type { DropOff, DropOffStatus, TurnedAwayReason } from "../../../shared/schemas/drop-offs";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

/** Most rows one household list returns (years of weekly buckets). */
export const HOUSEHOLD_LIST_LIMIT = 2_000;

interface DropOffRecord extends Omit<DropOff, "createdAt"> {
  createdAt: Date;
}

/** NUMERIC columns are cast to float8 in named SQL (the driver returns NUMERIC as strings); dates as text. */
const householdColumns = `
  d.id, d.household_id AS "householdId", d.digester_id AS "digesterId", g.name AS "digesterName",
  p.name AS "loggedBy", d.for_date::text AS "forDate", d.bucket_count AS "bucketCount",
  d.bucket_litres::float8 AS "bucketLitres", d.weight_kg::float8 AS "weightKg", d.mass_source AS "massSource",
  d.fresh_kg::float8 AS "freshKg", d.kg_vs::float8 AS "kgVs", d.mix, d.citrus_percent::float8 AS "citrusPercent",
  d.no_refuse_confirmed AS "noRefuseConfirmed", d.status, d.turned_away_reason AS "turnedAwayReason", d.note,
  f.fed_on::text AS "fedOn", d.created_at AS "createdAt"`;

/** A household's drop-offs, newest first (or just one of them when `id` is given), with digester, logger and feeding day. */
export async function findHouseholdDropOffs(
  householdId: number,
  options: { id?: number; transaction?: Transaction } = {},
): Promise<DropOff[]> {
  // SQL kept for a hot read (a resident's list, up to 2,000 rows): the DropOff model with its three
  // includes served GET /api/drop-offs?mine=true at about a third of the rate in `npm run bench:api`.
  const rows = await sequelize().query<DropOffRecord>(
    `SELECT ${householdColumns}
       FROM drop_offs d
       JOIN digesters g ON g.id = d.digester_id
       LEFT JOIN people p ON p.id = d.person_id
       LEFT JOIN feedings f ON f.drop_off_id = d.id
      WHERE d.household_id = $1 ${options.id === undefined ? "" : "AND d.id = $2"}
      ORDER BY d.for_date DESC, d.id DESC
      LIMIT ${HOUSEHOLD_LIST_LIMIT}`,
    {
      bind: options.id === undefined ? [householdId] : [householdId, options.id],
      type: QueryTypes.SELECT,
      transaction: options.transaction,
    },
  );
  return rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt).toISOString() }));
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
  mix: DropOffMix;
  citrusPercent: number;
  noRefuseConfirmed: boolean;
  note: string | null;
}

/** Inserts a pending drop-off; returns its id and creation time. */
export async function insertDropOff(transaction: Transaction, d: NewDropOff): Promise<{ id: number; createdAt: Date }> {
  const row = await models().DropOff.create({ ...d, status: "pending", turnedAwayReason: null }, { transaction });
  return { id: row.id, createdAt: row.createdAt };
}

/** Cancels the drop-off if it is the household's and still pending, in one statement (a steward may be accepting it right now). */
export async function cancelIfPending(id: number, householdId: number): Promise<boolean> {
  const [count] = await models().DropOff.update(
    { status: "cancelled" },
    { where: { id, householdId, status: "pending" } },
  );
  return count === 1;
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
  // SQL: an aggregate with FILTER clauses over drop-offs and their feedings.
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

// ---- The steward's decisions ----

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

/** NUMERIC columns are cast to float8 in named SQL (the driver returns NUMERIC as strings). */
const dropOffColumns = `
  d.id, d.digester_id AS "digesterId", h.name AS "householdName", d.for_date::text AS "forDate",
  d.bucket_count AS "bucketCount", d.bucket_litres::float8 AS "bucketLitres", d.weight_kg::float8 AS "weightKg",
  d.mass_source AS "massSource", d.fresh_kg::float8 AS "freshKg", d.kg_vs::float8 AS "kgVs", d.mix,
  d.citrus_percent::float8 AS "citrusPercent", d.status, d.turned_away_reason AS "turnedAwayReason", d.note,
  d.steward_note AS "stewardNote", d.override_reason AS "overrideReason", d.created_at AS "createdAt"`;

/** The digester a drop-off is for (no lock: the caller locks the digester first, then the drop-off). */
export async function findDropOffDigester(t: Transaction, id: number): Promise<number | null> {
  const row = await models().DropOff.findByPk(id, { attributes: ["digesterId"], transaction: t });
  return row?.digesterId ?? null;
}

/** One drop-off, locked FOR UPDATE (always after its digester, so locks are taken in one order). */
export async function lockDropOff(t: Transaction, id: number): Promise<DropOffRow | null> {
  // SQL: a row lock (FOR UPDATE OF the drop-off only, not the household it names).
  const [row] = await sequelize().query<DropOffRow>(
    `SELECT ${dropOffColumns} FROM drop_offs d JOIN households h ON h.id = d.household_id WHERE d.id = $id FOR UPDATE OF d`,
    { type: QueryTypes.SELECT, bind: { id }, transaction: t },
  );
  return row ?? null;
}

/** Drop-offs that need the steward: pending up to today (oldest first), and accepted ones not fed yet. */
export function listOpenDropOffs(digesterIds: number[], today: string): Promise<DropOffRow[]> {
  // SQL kept for a hot read (GET /api/steward/today): one joined statement, no model instances
  // per row (the model's include was not measured here; the resident's list through it was slower).
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
  await models().DropOff.update(
    {
      status: update.status,
      turnedAwayReason: update.status === "turned_away" ? (update.turnedAwayReason ?? null) : null,
      handledByPersonId: update.personId,
      handledAt: fn("now") as unknown as Date,
      // Absent fields keep what the row has.
      ...(update.forDate != null ? { forDate: update.forDate } : {}),
      ...(update.stewardNote != null ? { stewardNote: update.stewardNote } : {}),
      ...(update.overrideReason != null ? { overrideReason: update.overrideReason } : {}),
    },
    { where: { id }, transaction: t },
  );
}

// ---- Moving pending drop-offs (rebalancing) ----

export interface PendingDropOff {
  id: number;
  forDate: string;
  householdId: number;
  householdName: string;
  lat: number | null;
  lng: number | null;
  digesterId: number;
  freshKg: number;
}

/** Pending drop-offs on the given days, optionally only these ids, optionally locked (after the digesters). */
export function pendingDropOffs(
  days: string[],
  options: { ids?: number[]; transaction?: Transaction; lock?: boolean } = {},
): Promise<PendingDropOff[]> {
  // SQL: a row lock on the drop-offs only (FOR UPDATE OF), reading the household's name and place.
  return sequelize().query<PendingDropOff>(
    `SELECT o.id, o.for_date::text AS "forDate", o.household_id AS "householdId",
            h.name AS "householdName", h.lat, h.lng, o.digester_id AS "digesterId", o.fresh_kg::float8 AS "freshKg"
       FROM drop_offs o JOIN households h ON h.id = o.household_id
      WHERE o.status = 'pending' AND o.for_date = ANY($1::date[])
        ${options.ids ? "AND o.id = ANY($2::int[])" : ""}
      ORDER BY o.for_date, o.digester_id, o.id
      ${options.lock ? "FOR UPDATE OF o" : ""}`,
    { bind: options.ids ? [days, options.ids] : [days], type: QueryTypes.SELECT, transaction: options.transaction },
  );
}

export interface PendingLoad {
  digesterId: number;
  forDate: string;
  freshKg: number;
}

/** Fresh kg pending per digester and day: what takes room. */
export function pendingLoads(days: string[], transaction?: Transaction): Promise<PendingLoad[]> {
  // SQL: an aggregate (sum per digester and day).
  return sequelize().query<PendingLoad>(
    `SELECT o.digester_id AS "digesterId", o.for_date::text AS "forDate", sum(o.fresh_kg)::float8 AS "freshKg"
       FROM drop_offs o
      WHERE o.status = 'pending' AND o.for_date = ANY($1::date[])
      GROUP BY o.digester_id, o.for_date`,
    { bind: [days], type: QueryTypes.SELECT, transaction },
  );
}

/** One drop-off's status and day (for a clear 404/409 on a move). */
export async function dropOffStatus(
  id: number,
  transaction: Transaction,
): Promise<{ status: DropOffStatus; forDate: string } | null> {
  const row = await models().DropOff.findByPk(id, { attributes: ["status", "forDate"], transaction });
  return row ? { status: row.status, forDate: row.forDate } : null;
}

export async function moveDropOff(transaction: Transaction, id: number, digesterId: number): Promise<void> {
  await models().DropOff.update({ digesterId }, { where: { id }, transaction });
}

// ---- What other planners read ----

/** Fresh kg of drop-offs pending per digester on one date (collection rounds' room). */
export function pendingKgOnDate(
  transaction: Transaction,
  forDate: string,
): Promise<{ digesterId: number; pendingKg: number }[]> {
  // SQL: an aggregate (sum per digester).
  return sequelize().query(
    `SELECT digester_id AS "digesterId", sum(fresh_kg)::float8 AS "pendingKg"
       FROM drop_offs WHERE for_date = $1 AND status = 'pending' GROUP BY digester_id`,
    { bind: [forDate], type: QueryTypes.SELECT, transaction },
  );
}

export interface RecentDelivery {
  householdId: number;
  /** kg fresh fed or accepted in the 56 days to `today`. */
  recentKg: number;
  /** Distinct weeks (Monday-based) with such a drop-off. */
  recentWeeks: number;
  /** First day of such a drop-off. */
  firstRecentDay: string;
}

/** Each household's last 8 weeks of fed or accepted drop-offs (the scheduler's weekly kg). */
export function recentDeliveries(today: string, transaction?: Transaction): Promise<RecentDelivery[]> {
  // SQL: an aggregate (sum, count of distinct weeks, min per household).
  return sequelize().query<RecentDelivery>(
    `SELECT household_id AS "householdId", sum(fresh_kg)::float8 AS "recentKg",
            count(DISTINCT date_trunc('week', for_date))::int AS "recentWeeks", min(for_date)::text AS "firstRecentDay"
       FROM drop_offs
      WHERE status IN ('fed', 'accepted') AND for_date > $1::date - 56 AND for_date <= $1::date
      GROUP BY household_id`,
    { bind: [today], type: QueryTypes.SELECT, transaction },
  );
}
