/**
 * `password_resets`, `password_reset_requests` and `rate_limit_hits` (see sign-in-throttle.ts)
 * are the auth module's; the people, their passwords and sessions belong to the people module
 * (its index.ts).
 */
import { Op, QueryTypes, type Transaction } from "sequelize";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

interface ResetStatusRow {
  status: "invited" | "active" | "disabled";
}

export async function countRecentResets(personId: number, since: Date, transaction?: Transaction): Promise<number> {
  return models().PasswordReset.count({ where: { personId, createdAt: { [Op.gt]: since } }, transaction });
}

export async function insertReset(
  transaction: Transaction,
  personId: number,
  tokenHash: string,
  expiresAt: Date,
): Promise<void> {
  await models().PasswordReset.create({ tokenHash, personId, expiresAt }, { transaction });
}

export interface ResetRow {
  id: number;
  personId: number;
  expiresAt: Date;
  usedAt: Date | null;
  personStatus: ResetStatusRow["status"];
}

/**
 * The reset row for a token hash, locked for the rest of the transaction so it is used once.
 * SQL: a row lock on the reset alone (`FOR UPDATE OF r`) while reading its person's status.
 */
export async function findResetForUpdate(transaction: Transaction, tokenHash: string): Promise<ResetRow | null> {
  const rows = await sequelize().query<{
    id: number;
    person_id: number;
    expires_at: Date;
    used_at: Date | null;
    status: ResetStatusRow["status"];
  }>(
    `SELECT r.id, r.person_id, r.expires_at, r.used_at, p.status
       FROM password_resets r JOIN people p ON p.id = r.person_id
      WHERE r.token_hash = $1
      FOR UPDATE OF r`,
    { bind: [tokenHash], type: QueryTypes.SELECT, transaction },
  );
  const r = rows[0];
  return r
    ? { id: r.id, personId: r.person_id, expiresAt: new Date(r.expires_at), usedAt: r.used_at, personStatus: r.status }
    : null;
}

/** Marks this and every other open reset link of the person used: one new password ends them all. */
export async function useResets(transaction: Transaction, personId: number): Promise<void> {
  await models().PasswordReset.update({ usedAt: new Date() }, { where: { personId, usedAt: null }, transaction });
}

/** Stores a reset request for an address as typed (known or not): the same statement either way. */
export async function insertResetRequest(email: string): Promise<void> {
  await models().PasswordResetRequest.create({ email });
}

/**
 * Takes the oldest waiting reset request out of the queue inside `transaction` (deleted on
 * commit). SKIP LOCKED: several app processes may work the queue at once, each on other rows.
 */
export async function takeResetRequest(transaction: Transaction): Promise<{ id: number; email: string } | null> {
  const rows = await sequelize().query<{ id: string; email: string }>(
    `DELETE FROM password_reset_requests
      WHERE id = (SELECT id FROM password_reset_requests ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED)
      RETURNING id, email`,
    { type: QueryTypes.SELECT, transaction },
  );
  const row = rows[0];
  return row ? { id: Number(row.id), email: row.email } : null;
}

/** Serialises reset links per person for the rest of the transaction, so the hourly cap holds across processes. */
export async function lockResetsOf(transaction: Transaction, personId: number): Promise<void> {
  await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.reset'), $1)`, {
    bind: [personId],
    type: QueryTypes.SELECT,
    transaction,
  });
}
