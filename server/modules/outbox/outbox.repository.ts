import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { OutboxEmailRow } from "../../../shared/schemas/people";

export interface NewOutboxEmail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  messageId: string;
  dedupeKey?: string;
}

export interface DueEmail {
  id: number;
  to: string;
  subject: string;
  text: string;
  html: string | null;
  messageId: string;
  attempts: number;
}

/** Writes the message inside the caller's transaction, so it exists exactly when its cause does. */
export async function insertEmail(transaction: Transaction, email: NewOutboxEmail): Promise<number> {
  const rows = await sequelize().query<{ id: string }>(
    `INSERT INTO outbox_emails (to_address, subject, text_body, html_body, message_id, dedupe_key)
     VALUES ($1, $2, $3, $4, $5, $6)
     ON CONFLICT (dedupe_key) DO NOTHING
     RETURNING id`,
    {
      bind: [email.to, email.subject, email.text, email.html ?? null, email.messageId, email.dedupeKey ?? null],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows[0] ? Number(rows[0].id) : 0;
}

/** Takes the transaction-scoped advisory lock; false when another process is already sending. */
export async function tryLock(transaction: Transaction, lockName: string): Promise<boolean> {
  const rows = await sequelize().query<{ locked: boolean }>(
    "SELECT pg_try_advisory_xact_lock(hashtext($1)) AS locked",
    {
      bind: [lockName],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows[0]?.locked === true;
}

export async function findDue(transaction: Transaction, now: Date, limit: number): Promise<DueEmail[]> {
  const rows = await sequelize().query<{
    id: string;
    to_address: string;
    subject: string;
    text_body: string;
    html_body: string | null;
    message_id: string;
    attempts: number;
  }>(
    `SELECT id, to_address, subject, text_body, html_body, message_id, attempts
       FROM outbox_emails
      WHERE status = 'pending' AND next_attempt_at <= $1
      ORDER BY next_attempt_at, id
      LIMIT $2`,
    { bind: [now, limit], type: QueryTypes.SELECT, transaction },
  );
  return rows.map((r) => ({
    id: Number(r.id),
    to: r.to_address,
    subject: r.subject,
    text: r.text_body,
    html: r.html_body,
    messageId: r.message_id,
    attempts: r.attempts,
  }));
}

// The three writes below run outside the lock's transaction (autocommit) on purpose: each
// step is durable the moment it happens, so a crash mid-batch loses nothing already done.

/** Counts the attempt and leases the row until `leaseUntil`, so a crash mid-send retries it later. */
export async function claim(id: number, leaseUntil: Date): Promise<boolean> {
  const rows = await sequelize().query(
    `UPDATE outbox_emails SET attempts = attempts + 1, next_attempt_at = $2
      WHERE id = $1 AND status = 'pending' RETURNING id`,
    { bind: [id, leaseUntil], type: QueryTypes.SELECT },
  );
  return rows.length === 1;
}

export async function markSent(id: number): Promise<void> {
  await sequelize().query(
    `UPDATE outbox_emails SET status = 'sent', sent_at = now(), last_error = NULL WHERE id = $1`,
    {
      bind: [id],
    },
  );
}

export async function markRetry(id: number, nextAttemptAt: Date, error: string): Promise<void> {
  await sequelize().query(
    `UPDATE outbox_emails SET next_attempt_at = $2, last_error = $3 WHERE id = $1 AND status = 'pending'`,
    {
      bind: [id, nextAttemptAt, error],
    },
  );
}

export async function markFailed(id: number, error: string): Promise<void> {
  await sequelize().query(`UPDATE outbox_emails SET status = 'failed', last_error = $2 WHERE id = $1`, {
    bind: [id, error],
  });
}

/** Messages not delivered (yet): failed ones first, newest first. */
export async function listUndelivered(limit: number): Promise<OutboxEmailRow[]> {
  const rows = await sequelize().query<{
    id: string;
    to_address: string;
    subject: string;
    status: "pending" | "failed";
    attempts: number;
    last_error: string | null;
    created_at: Date;
    next_attempt_at: Date;
  }>(
    `SELECT id, to_address, subject, status, attempts, last_error, created_at, next_attempt_at
       FROM outbox_emails
      WHERE status IN ('failed', 'pending')
      ORDER BY (status = 'failed') DESC, created_at DESC
      LIMIT $1`,
    { bind: [limit], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: Number(r.id),
    toAddress: r.to_address,
    subject: r.subject,
    status: r.status,
    attempts: r.attempts,
    lastError: r.last_error,
    createdAt: new Date(r.created_at).toISOString(),
    nextAttemptAt: new Date(r.next_attempt_at).toISOString(),
  }));
}
