/**
 * `outbox_emails`, owned by the outbox module: e-mails written in their cause's transaction and
 * sent later. Plain reads and writes through the OutboxEmail model; SQL for the ON CONFLICT
 * insert and the advisory lock.
 */
import { Op, QueryTypes, type Transaction, fn, literal } from "sequelize";
import { models } from "../../db/models";
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
  // SQL: ON CONFLICT (dedupe_key) DO NOTHING, so a repeated cause queues one e-mail.
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
  // SQL: a transaction-scoped advisory lock.
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
  const rows = await models().OutboxEmail.findAll({
    attributes: ["id", "toAddress", "subject", "textBody", "htmlBody", "messageId", "attempts"],
    where: { status: "pending", nextAttemptAt: { [Op.lte]: now } },
    order: [
      ["nextAttemptAt", "ASC"],
      ["id", "ASC"],
    ],
    limit,
    transaction,
  });
  return rows.map((r) => ({
    id: r.id,
    to: r.toAddress,
    subject: r.subject,
    text: r.textBody,
    html: r.htmlBody,
    messageId: r.messageId,
    attempts: r.attempts,
  }));
}

// The three writes below run outside the lock's transaction (autocommit) on purpose: each
// step is durable the moment it happens, so a crash mid-batch loses nothing already done.

/** Counts the attempt and leases the row until `leaseUntil`, so a crash mid-send retries it later. */
export async function claim(id: number, leaseUntil: Date): Promise<boolean> {
  const [count] = await models().OutboxEmail.update(
    { attempts: literal("attempts + 1") as unknown as number, nextAttemptAt: leaseUntil },
    { where: { id, status: "pending" } },
  );
  return count === 1;
}

export async function markSent(id: number): Promise<void> {
  await models().OutboxEmail.update(
    { status: "sent", sentAt: fn("now") as unknown as Date, lastError: null },
    { where: { id } },
  );
}

export async function markRetry(id: number, nextAttemptAt: Date, error: string): Promise<void> {
  await models().OutboxEmail.update({ nextAttemptAt, lastError: error }, { where: { id, status: "pending" } });
}

export async function markFailed(id: number, error: string): Promise<void> {
  await models().OutboxEmail.update({ status: "failed", lastError: error }, { where: { id } });
}

/** Messages not delivered (yet): failed ones first, newest first. */
export async function listUndelivered(limit: number): Promise<OutboxEmailRow[]> {
  const rows = await models().OutboxEmail.findAll({
    attributes: ["id", "toAddress", "subject", "status", "attempts", "lastError", "createdAt", "nextAttemptAt"],
    where: { status: ["failed", "pending"] },
    order: [
      [literal("(status = 'failed')"), "DESC"],
      ["createdAt", "DESC"],
    ],
    limit,
  });
  return rows.map((r) => ({
    id: r.id,
    toAddress: r.toAddress,
    subject: r.subject,
    status: r.status as "pending" | "failed",
    attempts: r.attempts,
    lastError: r.lastError,
    createdAt: new Date(r.createdAt).toISOString(),
    nextAttemptAt: new Date(r.nextAttemptAt).toISOString(),
  }));
}
