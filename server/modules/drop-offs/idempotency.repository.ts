/**
 * Stored answers for the `Idempotency-Key` header (IETF draft "The Idempotency-Key HTTP Header
 * Field"): one row per (person, key), written in the same transaction as what the request created.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

export interface StoredAnswer {
  route: string;
  requestHash: string;
  statusCode: number;
  /** The JSON text of the first answer's body. */
  responseText: string;
}

/**
 * Claims the key for this request. The primary key serialises concurrent claims: a second
 * INSERT of the same (person, key) waits for the first transaction, then does nothing once it
 * commits (or goes ahead if it rolled back). True when this request holds the key.
 */
export async function claimKey(
  transaction: Transaction,
  input: { personId: number; key: string; route: string; requestHash: string },
): Promise<boolean> {
  // SQL: ON CONFLICT DO NOTHING claims the key atomically (a concurrent retry waits, then finds it).
  const rows = await sequelize().query(
    `INSERT INTO idempotency_keys (person_id, key, route, request_hash, status_code, response)
     VALUES ($1, $2, $3, $4, 0, 'null'::jsonb)
     ON CONFLICT (person_id, key) DO NOTHING
     RETURNING 1 AS claimed`,
    { bind: [input.personId, input.key, input.route, input.requestHash], type: QueryTypes.SELECT, transaction },
  );
  return rows.length === 1;
}

export async function findKey(transaction: Transaction, personId: number, key: string): Promise<StoredAnswer | null> {
  const r = await models().IdempotencyKey.findOne({
    attributes: ["route", "requestHash", "statusCode", "response"],
    where: { personId, key },
    transaction,
  });
  if (!r) return null;
  return {
    route: r.route,
    requestHash: r.requestHash,
    statusCode: r.statusCode,
    responseText: typeof r.response === "string" ? r.response : JSON.stringify(r.response),
  };
}

/**
 * Stores the answer. jsonb would reorder the body's object keys, so the body's JSON text is kept
 * as a jsonb string: a replay then sends exactly the bytes of the first answer.
 */
export async function completeKey(
  transaction: Transaction,
  personId: number,
  key: string,
  statusCode: number,
  responseText: string,
): Promise<void> {
  // SQL: to_jsonb keeps the answer's exact JSON text (as a jsonb string), so a replay sends the same bytes.
  await sequelize().query(
    `UPDATE idempotency_keys SET status_code = $3, response = to_jsonb($4::text) WHERE person_id = $1 AND key = $2`,
    {
      bind: [personId, key, statusCode, responseText],
      transaction,
    },
  );
}
