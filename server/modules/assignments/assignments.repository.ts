import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";

export interface AssignableHousehold {
  id: number;
  name: string;
  addressText: string;
  lat: number | null;
  lng: number | null;
  assignedDigesterId: number | null;
  pinned: boolean;
  declaredWeeklyKg: number;
  /** kg fresh fed or accepted in the last 56 days. */
  recentKg: number;
  /** Distinct weeks (Monday-based) with a fed or accepted drop-off in the last 56 days. */
  recentWeeks: number;
  /** First day of a fed or accepted drop-off in the last 56 days. */
  firstRecentDay: string | null;
}

/**
 * Every household with what the scheduler needs: place, current assignment and pin, declared
 * amount and its last 8 weeks of fed or accepted drop-offs (one grouped query).
 */
export function assignableHouseholds(today: string, transaction?: Transaction): Promise<AssignableHousehold[]> {
  return sequelize().query<AssignableHousehold>(
    `SELECT h.id, h.name, h.address_text AS "addressText", h.lat, h.lng,
            h.assigned_digester_id AS "assignedDigesterId", h.assignment_pinned AS pinned,
            h.declared_weekly_kg::float8 AS "declaredWeeklyKg",
            coalesce(r.kg, 0)::float8 AS "recentKg", coalesce(r.weeks, 0)::int AS "recentWeeks",
            to_char(r.first_day, 'YYYY-MM-DD') AS "firstRecentDay"
       FROM households h
       LEFT JOIN (
         SELECT household_id, sum(fresh_kg) AS kg, count(DISTINCT date_trunc('week', for_date)) AS weeks,
                min(for_date) AS first_day
           FROM drop_offs
          WHERE status IN ('fed', 'accepted') AND for_date > $1::date - 56 AND for_date <= $1::date
          GROUP BY household_id
       ) r ON r.household_id = h.id
      ORDER BY h.id`,
    { bind: [today], type: QueryTypes.SELECT, transaction },
  );
}

/**
 * The assignment's version: a hash of every (household, digester, pinned) triple of the assigned
 * or pinned households. Any change to an assignment or pin gives a new version; a newly
 * registered household (unassigned) does not, so residents signing up do not stale a proposal.
 */
export async function assignmentVersion(transaction?: Transaction): Promise<string> {
  const rows = await sequelize().query<{ v: string | null }>(
    `SELECT md5(coalesce(string_agg(id || ':' || coalesce(assigned_digester_id::text, '-') || ':' || assignment_pinned::text, ',' ORDER BY id), '')) AS v
       FROM households WHERE assigned_digester_id IS NOT NULL OR assignment_pinned`,
    { type: QueryTypes.SELECT, transaction },
  );
  return rows[0]?.v ?? "";
}

/** Serialises every change of assignments (apply, pin) across processes until the transaction ends. */
export async function lockAssignments(transaction: Transaction): Promise<void> {
  await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.assignments'))`, { transaction });
}

export async function setAssignment(
  transaction: Transaction,
  householdId: number,
  digesterId: number | null,
  pinned: boolean,
): Promise<boolean> {
  const rows = await sequelize().query<{ id: number }>(
    `UPDATE households SET assigned_digester_id = $2, assignment_pinned = $3, updated_at = now() WHERE id = $1 RETURNING id`,
    { bind: [householdId, digesterId, pinned], type: QueryTypes.SELECT, transaction },
  );
  return rows.length > 0;
}

/** Active residents of these households, for the e-mails. */
export function residentsOf(
  householdIds: number[],
  transaction?: Transaction,
): Promise<{ householdId: number; email: string; name: string }[]> {
  if (householdIds.length === 0) return Promise.resolve([]);
  return sequelize().query(
    `SELECT household_id AS "householdId", email::text AS email, name FROM people
      WHERE household_id = ANY($1::int[]) AND status = 'active' ORDER BY id`,
    { bind: [householdIds], type: QueryTypes.SELECT, transaction },
  );
}
