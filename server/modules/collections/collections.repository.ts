/**
 * Collection requests' SQL: one statement per function, plain objects out. The service owns the
 * transactions and the order of the row locks.
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { CollectionRequestStatus, CollectionRequestView } from "../../../shared/schemas/collections";
import { sequelize } from "../../db/sequelize";

const columns = `
  r.id, r.household_id AS "householdId", h.name AS "householdName", h.address_text AS "addressText",
  to_char(r.for_date, 'YYYY-MM-DD') AS "forDate", r.bucket_count AS "bucketCount", r.status,
  s.round_id AS "roundId"`;
const from = `FROM collection_requests r JOIN households h ON h.id = r.household_id
  LEFT JOIN collection_round_stops s ON s.request_id = r.id`;

/** Most requests one list returns. */
export const REQUEST_LIST_LIMIT = 500;

/** Locks the household row until the transaction ends (serialises two requests of one household). */
export async function lockHousehold(transaction: Transaction, householdId: number): Promise<void> {
  await sequelize().query(`SELECT id FROM households WHERE id = $1 FOR UPDATE`, { bind: [householdId], transaction });
}

/** Whether the household has an open or planned request on `forDate` (YYYY-MM-DD). */
export async function hasLiveRequest(
  householdId: number,
  forDate: string,
  transaction?: Transaction,
): Promise<boolean> {
  const rows = await sequelize().query<{ id: number }>(
    `SELECT id FROM collection_requests WHERE household_id = $1 AND for_date = $2 AND status IN ('open', 'planned')`,
    { bind: [householdId, forDate], type: QueryTypes.SELECT, transaction },
  );
  return rows.length > 0;
}

/** Inserts an open request; returns its id. */
export async function insertRequest(
  transaction: Transaction,
  input: { householdId: number; forDate: string; bucketCount: number },
): Promise<number> {
  const [row] = await sequelize().query<{ id: number }>(
    `INSERT INTO collection_requests (household_id, for_date, bucket_count) VALUES ($1, $2, $3) RETURNING id`,
    { bind: [input.householdId, input.forDate, input.bucketCount], type: QueryTypes.SELECT, transaction },
  );
  return row!.id;
}

/** One request as the API shows it, with its household and round (if planned). */
export async function findRequestView(
  id: number,
  transaction?: Transaction,
): Promise<CollectionRequestView | undefined> {
  const [view] = await sequelize().query<CollectionRequestView>(`SELECT ${columns} ${from} WHERE r.id = $1`, {
    bind: [id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return view;
}

/** Requests, newest day first, optionally of one household and/or one day (YYYY-MM-DD). */
export function listRequestViews(filter: {
  householdId?: number | undefined;
  forDate?: string | undefined;
}): Promise<CollectionRequestView[]> {
  const where: string[] = [];
  const bind: unknown[] = [];
  if (filter.householdId !== undefined) {
    bind.push(filter.householdId);
    where.push(`r.household_id = $${bind.length}`);
  }
  if (filter.forDate) {
    bind.push(filter.forDate);
    where.push(`r.for_date = $${bind.length}`);
  }
  return sequelize().query<CollectionRequestView>(
    `SELECT ${columns} ${from} ${where.length ? `WHERE ${where.join(" AND ")}` : ""} ORDER BY r.for_date DESC, r.id DESC LIMIT ${REQUEST_LIST_LIMIT}`,
    { bind, type: QueryTypes.SELECT },
  );
}

/** Locks a request row until the transaction ends; its household and status, or undefined when there is none. */
/**
 * Locks the round the request is a stop of, if any, before the request itself: planning and
 * marking a stop collected lock round before request, and cancelling must take the same order.
 */
export async function lockRoundOfRequest(transaction: Transaction, requestId: number): Promise<void> {
  await sequelize().query(
    `SELECT r.id FROM collection_round_stops s JOIN collection_rounds r ON r.id = s.round_id
      WHERE s.request_id = $1 FOR UPDATE OF r`,
    { bind: [requestId], type: QueryTypes.SELECT, transaction },
  );
}

export async function lockRequest(
  transaction: Transaction,
  id: number,
): Promise<{ householdId: number; status: CollectionRequestStatus } | undefined> {
  const [row] = await sequelize().query<{ householdId: number; status: CollectionRequestStatus }>(
    `SELECT household_id AS "householdId", status FROM collection_requests WHERE id = $1 FOR UPDATE`,
    { bind: [id], type: QueryTypes.SELECT, transaction },
  );
  return row;
}

/** Takes the request off the round it is a stop of; returns that round's id (null when none). */
export async function removeFromRounds(transaction: Transaction, requestId: number): Promise<number | null> {
  const rows = await sequelize().query<{ roundId: number }>(
    `DELETE FROM collection_round_stops WHERE request_id = $1 RETURNING round_id AS "roundId"`,
    { bind: [requestId], type: QueryTypes.SELECT, transaction },
  );
  return rows[0]?.roundId ?? null;
}

export async function markCancelled(transaction: Transaction, id: number): Promise<void> {
  await sequelize().query(`UPDATE collection_requests SET status = 'cancelled', updated_at = now() WHERE id = $1`, {
    bind: [id],
    transaction,
  });
}
