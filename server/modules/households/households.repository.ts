import { QueryTypes, type Transaction } from "sequelize";
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

export interface MemberRecord {
  id: number;
  name: string;
  status: "invited" | "active" | "disabled";
}

export interface DigesterPoint {
  id: number;
  name: string;
  lat: number;
  lng: number;
  status: "active" | "resting" | "offline";
}

// NUMERIC columns are cast to float8: the driver returns NUMERIC as strings.
const householdColumns = `
  h.id, h.name, h.address_text AS "addressText", h.lat, h.lng,
  h.declared_weekly_kg::float8 AS "declaredWeeklyKg", h.assigned_digester_id AS "assignedDigesterId",
  d.name AS "assignedDigesterName"`;

export async function findHousehold(id: number, transaction?: Transaction): Promise<HouseholdRecord | null> {
  const rows = await sequelize().query<HouseholdRecord>(
    `SELECT ${householdColumns} FROM households h LEFT JOIN digesters d ON d.id = h.assigned_digester_id WHERE h.id = $1`,
    { bind: [id], type: QueryTypes.SELECT, transaction },
  );
  return rows[0] ?? null;
}

export function findMembers(householdId: number, transaction?: Transaction): Promise<MemberRecord[]> {
  return sequelize().query<MemberRecord>(
    `SELECT id, name, status FROM people WHERE household_id = $1 ORDER BY status = 'invited', name, id`,
    { bind: [householdId], type: QueryTypes.SELECT, transaction },
  );
}

/** Every digester's name, place and status (a neighbourhood has a handful). */
export function digesterPoints(transaction?: Transaction): Promise<DigesterPoint[]> {
  return sequelize().query<DigesterPoint>(`SELECT id, name, lat, lng, status FROM digesters ORDER BY id`, {
    type: QueryTypes.SELECT,
    transaction,
  });
}

/** The caller's person row, locked so that two registrations at once cannot both attach a household. */
export async function lockPersonHousehold(
  transaction: Transaction,
  personId: number,
): Promise<{ householdId: number | null } | null> {
  const rows = await sequelize().query<{ householdId: number | null }>(
    `SELECT household_id AS "householdId" FROM people WHERE id = $1 FOR UPDATE`,
    { bind: [personId], type: QueryTypes.SELECT, transaction },
  );
  return rows[0] ?? null;
}

export async function insertHousehold(
  transaction: Transaction,
  input: { name: string; addressText: string; lat: number; lng: number; declaredWeeklyKg: number | undefined },
): Promise<number> {
  const rows = await sequelize().query<{ id: number }>(
    `INSERT INTO households (name, address_text, lat, lng, declared_weekly_kg)
     VALUES ($1, $2, $3, $4, coalesce($5::numeric, 3)) RETURNING id`,
    {
      bind: [input.name, input.addressText, input.lat, input.lng, input.declaredWeeklyKg ?? null],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows[0]!.id;
}

export async function attachPerson(transaction: Transaction, personId: number, householdId: number): Promise<void> {
  await sequelize().query(`UPDATE people SET household_id = $2, updated_at = now() WHERE id = $1`, {
    bind: [personId, householdId],
    transaction,
  });
}

export async function updateHousehold(
  transaction: Transaction,
  id: number,
  changes: { name?: string; addressText?: string; lat?: number; lng?: number; declaredWeeklyKg?: number },
): Promise<void> {
  const columns: Record<string, string> = {
    name: "name",
    addressText: "address_text",
    lat: "lat",
    lng: "lng",
    declaredWeeklyKg: "declared_weekly_kg",
  };
  const sets: string[] = [];
  const bind: unknown[] = [id];
  for (const [key, column] of Object.entries(columns)) {
    const value = changes[key as keyof typeof changes];
    if (value === undefined) continue;
    bind.push(value);
    sets.push(`${column} = $${bind.length}`);
  }
  if (sets.length === 0) return;
  await sequelize().query(`UPDATE households SET ${sets.join(", ")}, updated_at = now() WHERE id = $1`, {
    bind,
    transaction,
  });
}

export async function countMembers(transaction: Transaction, householdId: number): Promise<number> {
  const rows = await sequelize().query<{ n: number }>(
    `SELECT count(*)::int AS n FROM people WHERE household_id = $1 AND status <> 'disabled'`,
    {
      bind: [householdId],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows[0]?.n ?? 0;
}

export interface HouseholdListRecord extends HouseholdRecord {
  memberCount: number;
}

/** Households with their assigned digester and member count: all, or only the given one. */
export function listHouseholds(onlyId: number | null): Promise<HouseholdListRecord[]> {
  return sequelize().query<HouseholdListRecord>(
    `SELECT ${householdColumns},
            (SELECT count(*)::int FROM people p WHERE p.household_id = h.id AND p.status <> 'disabled') AS "memberCount"
       FROM households h LEFT JOIN digesters d ON d.id = h.assigned_digester_id
      ${onlyId === null ? "" : "WHERE h.id = $1"}
      ORDER BY h.name, h.id`,
    { bind: onlyId === null ? [] : [onlyId], type: QueryTypes.SELECT },
  );
}
