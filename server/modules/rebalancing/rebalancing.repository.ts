import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";

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

/** Pending drop-offs on the given days (today and tomorrow), optionally only these ids, optionally locked. */
export function pendingDropOffs(
  days: string[],
  options: { ids?: number[]; transaction?: Transaction; lock?: boolean } = {},
): Promise<PendingDropOff[]> {
  return sequelize().query<PendingDropOff>(
    `SELECT o.id, to_char(o.for_date, 'YYYY-MM-DD') AS "forDate", o.household_id AS "householdId",
            h.name AS "householdName", h.lat, h.lng, o.digester_id AS "digesterId", o.fresh_kg::float8 AS "freshKg"
       FROM drop_offs o JOIN households h ON h.id = o.household_id
      WHERE o.status = 'pending' AND o.for_date = ANY($1::date[])
        ${options.ids ? "AND o.id = ANY($2::int[])" : ""}
      ORDER BY o.for_date, o.digester_id, o.id
      ${options.lock ? "FOR UPDATE OF o" : ""}`,
    { bind: options.ids ? [days, options.ids] : [days], type: QueryTypes.SELECT, transaction: options.transaction },
  );
}

/** One drop-off by id with its status (for a clear 404/409 on a move). */
export async function dropOffStatus(id: number, transaction: Transaction): Promise<{ status: string; forDate: string } | null> {
  const rows = await sequelize().query<{ status: string; forDate: string }>(
    `SELECT status, to_char(for_date, 'YYYY-MM-DD') AS "forDate" FROM drop_offs WHERE id = $1`,
    { bind: [id], type: QueryTypes.SELECT, transaction },
  );
  return rows[0] ?? null;
}

export async function moveDropOff(transaction: Transaction, id: number, digesterId: number): Promise<void> {
  await sequelize().query(`UPDATE drop_offs SET digester_id = $2, updated_at = now() WHERE id = $1`, {
    bind: [id, digesterId],
    transaction,
  });
}
