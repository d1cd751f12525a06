import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { Caller } from "../../middleware/handle";
import type { Role } from "../../../shared/schemas/auth";

interface CallerRow {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  household_id: number | null;
  steward_of: number[] | null;
  status: "invited" | "active" | "disabled";
  password_hash: string | null;
}

const callerColumns = `
  p.id, p.email, p.name, p.roles, p.household_id, p.status, p.password_hash,
  (SELECT array_agg(ds.digester_id ORDER BY ds.digester_id) FROM digester_stewards ds WHERE ds.person_id = p.id) AS steward_of`;

function toCaller(row: CallerRow): Caller {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles,
    stewardOf: row.steward_of ?? [],
    householdId: row.household_id,
  };
}

export interface SignInRecord {
  caller: Caller;
  status: CallerRow["status"];
  passwordHash: string | null;
}

async function findOne(where: string, bind: unknown[], transaction?: Transaction): Promise<SignInRecord | null> {
  const rows = await sequelize().query<CallerRow>(`SELECT ${callerColumns} FROM people p WHERE ${where}`, {
    bind,
    type: QueryTypes.SELECT,
    transaction,
  });
  const row = rows[0];
  return row ? { caller: toCaller(row), status: row.status, passwordHash: row.password_hash } : null;
}

/** The account behind an e-mail (case-insensitive), with its hash, for checking a password. */
export function findByEmail(email: string, transaction?: Transaction) {
  return findOne("p.email = $1", [email], transaction);
}

export function findById(id: number, transaction?: Transaction) {
  return findOne("p.id = $1", [id], transaction);
}

/** The signed-in person for a session, or null when the account is gone or not active. */
export async function findActiveCaller(id: number): Promise<Caller | null> {
  const record = await findOne("p.id = $1 AND p.status = 'active'", [id]);
  return record?.caller ?? null;
}

export async function setPassword(transaction: Transaction, personId: number, passwordHash: string): Promise<void> {
  await sequelize().query(
    `UPDATE people SET password_hash = $2, password_changed_at = now(), updated_at = now() WHERE id = $1`,
    { bind: [personId, passwordHash], transaction },
  );
}

/**
 * Ends every session of a person at once (all but `exceptSessionId` when given), by deleting the
 * rows: the next request with such a cookie finds no session and is anonymous.
 */
export async function deleteSessionsOf(
  personId: number,
  exceptSessionId?: string,
  transaction?: Transaction,
): Promise<number> {
  const rows = await sequelize().query(
    `DELETE FROM sessions WHERE (sess -> 'passport' ->> 'user') = $1 AND sid <> $2 RETURNING sid`,
    { bind: [String(personId), exceptSessionId ?? ""], type: QueryTypes.SELECT, transaction },
  );
  return rows.length;
}

export async function countRecentResets(personId: number, since: Date, transaction?: Transaction): Promise<number> {
  const rows = await sequelize().query<{ n: string }>(
    `SELECT count(*) AS n FROM password_resets WHERE person_id = $1 AND created_at > $2`,
    { bind: [personId, since], type: QueryTypes.SELECT, transaction },
  );
  return Number(rows[0]?.n ?? 0);
}

export async function insertReset(
  transaction: Transaction,
  personId: number,
  tokenHash: string,
  expiresAt: Date,
): Promise<void> {
  await sequelize().query(`INSERT INTO password_resets (token_hash, person_id, expires_at) VALUES ($1, $2, $3)`, {
    bind: [tokenHash, personId, expiresAt],
    transaction,
  });
}

export interface ResetRow {
  id: number;
  personId: number;
  expiresAt: Date;
  usedAt: Date | null;
  personStatus: CallerRow["status"];
}

/** The reset row for a token hash, locked for the rest of the transaction so it is used once. */
export async function findResetForUpdate(transaction: Transaction, tokenHash: string): Promise<ResetRow | null> {
  const rows = await sequelize().query<{
    id: number;
    person_id: number;
    expires_at: Date;
    used_at: Date | null;
    status: CallerRow["status"];
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
  await sequelize().query(`UPDATE password_resets SET used_at = now() WHERE person_id = $1 AND used_at IS NULL`, {
    bind: [personId],
    transaction,
  });
}

/** Stores a reset request for an address as typed (known or not): the same statement either way. */
export async function insertResetRequest(email: string): Promise<void> {
  await sequelize().query(`INSERT INTO password_reset_requests (email) VALUES ($1)`, { bind: [email] });
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
