/**
 * `households`, owned by the households module: a household's place, declared amount and
 * assigned digester (the assignment board sets the latter through this module's index.ts).
 * Plain reads and writes through the Household model; named SQL for the aggregates.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { models } from "../../db/models";
import type { HouseholdModel } from "../../db/models/household.model";
import { sequelize } from "../../db/sequelize";

export interface HouseholdRecord {
  id: number;
  name: string;
  addressText: string;
  lat: number | null;
  lng: number | null;
  declaredWeeklyKg: number;
  assignedDigesterId: number | null;
  assignedDigesterName: string | null;
}

function toRecord(h: HouseholdModel): HouseholdRecord {
  return {
    id: h.id,
    name: h.name,
    addressText: h.addressText,
    lat: h.lat,
    lng: h.lng,
    declaredWeeklyKg: h.declaredWeeklyKg,
    assignedDigesterId: h.assignedDigesterId,
    assignedDigesterName: h.assignedDigester?.name ?? null,
  };
}

/** One household with its assigned digester's name. */
export async function findHousehold(id: number, transaction?: Transaction): Promise<HouseholdRecord | null> {
  const row = await models().Household.findByPk(id, {
    include: [{ association: "assignedDigester", attributes: ["name"] }],
    transaction,
  });
  return row ? toRecord(row) : null;
}

/** Whether a household exists. */
export async function householdExists(transaction: Transaction, id: number): Promise<boolean> {
  return (await models().Household.findByPk(id, { attributes: ["id"], transaction })) !== null;
}

/** Locks the household row until the transaction ends (serialises two requests of one household). */
export async function lockHousehold(transaction: Transaction, householdId: number): Promise<void> {
  await models().Household.findByPk(householdId, { attributes: ["id"], lock: transaction.LOCK.UPDATE, transaction });
}

export async function insertHousehold(
  transaction: Transaction,
  input: { name: string; addressText: string; lat: number; lng: number; declaredWeeklyKg: number | undefined },
): Promise<number> {
  const { declaredWeeklyKg, ...rest } = input;
  const row = await models().Household.create(
    { ...rest, assignedDigesterId: null, ...(declaredWeeklyKg === undefined ? {} : { declaredWeeklyKg }) },
    { transaction },
  );
  return row.id;
}

export async function updateHousehold(
  transaction: Transaction,
  id: number,
  changes: { name?: string; addressText?: string; lat?: number; lng?: number; declaredWeeklyKg?: number },
): Promise<void> {
  const present = Object.fromEntries(Object.entries(changes).filter(([, v]) => v !== undefined));
  if (Object.keys(present).length === 0) return;
  await models().Household.update(present, { where: { id }, transaction });
}

export interface HouseholdListRecord extends HouseholdRecord {
  memberCount: number;
}

/** Households with their assigned digester and member count: all, or only the given one. */
export function listHouseholds(onlyId: number | null): Promise<HouseholdListRecord[]> {
  // SQL: each household with its member count (an aggregate subquery), in one statement.
  return sequelize().query<HouseholdListRecord>(
    `SELECT h.id, h.name, h.address_text AS "addressText", h.lat, h.lng,
            h.declared_weekly_kg::float8 AS "declaredWeeklyKg", h.assigned_digester_id AS "assignedDigesterId",
            d.name AS "assignedDigesterName",
            (SELECT count(*)::int FROM people p WHERE p.household_id = h.id AND p.status <> 'disabled') AS "memberCount"
       FROM households h LEFT JOIN digesters d ON d.id = h.assigned_digester_id
      ${onlyId === null ? "" : "WHERE h.id = $1"}
      ORDER BY h.name, h.id`,
    { bind: onlyId === null ? [] : [onlyId], type: QueryTypes.SELECT },
  );
}

// ---- The assignment board's reads and writes ----

export interface AssignmentRow {
  id: number;
  name: string;
  addressText: string;
  lat: number | null;
  lng: number | null;
  assignedDigesterId: number | null;
  pinned: boolean;
  declaredWeeklyKg: number;
}

/** Every household with its place, assignment, pin and declared weekly amount, by id. */
export async function assignmentRows(transaction?: Transaction): Promise<AssignmentRow[]> {
  const rows = await models().Household.findAll({ order: [["id", "ASC"]], transaction });
  return rows.map((h) => ({
    id: h.id,
    name: h.name,
    addressText: h.addressText,
    lat: h.lat,
    lng: h.lng,
    assignedDigesterId: h.assignedDigesterId,
    pinned: h.assignmentPinned,
    declaredWeeklyKg: h.declaredWeeklyKg,
  }));
}

/**
 * The assignment's version: a hash of every (household, digester, pinned) triple of the assigned
 * or pinned households. Any change to an assignment or pin gives a new version; a newly
 * registered household (unassigned) does not, so residents signing up do not stale a proposal.
 */
export async function assignmentVersion(transaction?: Transaction): Promise<string> {
  // SQL: an aggregate (md5 over string_agg in id order).
  const rows = await sequelize().query<{ v: string | null }>(
    `SELECT md5(coalesce(string_agg(id || ':' || coalesce(assigned_digester_id::text, '-') || ':' || assignment_pinned::text, ',' ORDER BY id), '')) AS v
       FROM households WHERE assigned_digester_id IS NOT NULL OR assignment_pinned`,
    { type: QueryTypes.SELECT, transaction },
  );
  return rows[0]?.v ?? "";
}

/** Sets a household's digester and pin; false when there is no such household. */
export async function setAssignment(
  transaction: Transaction,
  householdId: number,
  digesterId: number | null,
  pinned: boolean,
): Promise<boolean> {
  const [count] = await models().Household.update(
    { assignedDigesterId: digesterId, assignmentPinned: pinned },
    { where: { id: householdId }, transaction },
  );
  return count > 0;
}
