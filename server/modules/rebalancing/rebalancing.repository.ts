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

/**
 * Movable pending drop-offs on the given days (today and tomorrow), optionally only these ids,
 * optionally locked. A drop-off made by marking a collection-round stop collected
 * (`collection_round_stops.drop_off_id`) is left out: its buckets are already at the round's
 * end digester, so there is nothing for the resident to carry elsewhere. It still counts in
 * `pendingLoads`.
 */
export function pendingDropOffs(
  days: string[],
  options: { ids?: number[]; transaction?: Transaction; lock?: boolean } = {},
): Promise<PendingDropOff[]> {
  return sequelize().query<PendingDropOff>(
    `SELECT o.id, to_char(o.for_date, 'YYYY-MM-DD') AS "forDate", o.household_id AS "householdId",
            h.name AS "householdName", h.lat, h.lng, o.digester_id AS "digesterId", o.fresh_kg::float8 AS "freshKg"
       FROM drop_offs o JOIN households h ON h.id = o.household_id
      WHERE o.status = 'pending' AND o.for_date = ANY($1::date[])
        AND NOT EXISTS (SELECT 1 FROM collection_round_stops s WHERE s.drop_off_id = o.id)
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

/** Fresh kg pending per digester and day, every pending drop-off (collected on a round or not): what takes room. */
export function pendingLoads(days: string[], transaction?: Transaction): Promise<PendingLoad[]> {
  return sequelize().query<PendingLoad>(
    `SELECT o.digester_id AS "digesterId", to_char(o.for_date, 'YYYY-MM-DD') AS "forDate", sum(o.fresh_kg)::float8 AS "freshKg"
       FROM drop_offs o
      WHERE o.status = 'pending' AND o.for_date = ANY($1::date[])
      GROUP BY o.digester_id, o.for_date`,
    { bind: [days], type: QueryTypes.SELECT, transaction },
  );
}

/** One drop-off by id with its status, and whether a collection round made it (for a clear 404/409 on a move). */
export async function dropOffStatus(
  id: number,
  transaction: Transaction,
): Promise<{ status: string; forDate: string; onRound: boolean } | null> {
  const rows = await sequelize().query<{ status: string; forDate: string; onRound: boolean }>(
    `SELECT o.status, to_char(o.for_date, 'YYYY-MM-DD') AS "forDate",
            EXISTS (SELECT 1 FROM collection_round_stops s WHERE s.drop_off_id = o.id) AS "onRound"
       FROM drop_offs o WHERE o.id = $1`,
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
