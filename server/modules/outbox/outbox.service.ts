/**
 * The e-mail outbox (transactional outbox pattern). A cause (an invitation, a reset request)
 * writes its message row in its own transaction; the sender delivers due rows later.
 *
 * Guarantees, step by step:
 * - the row exists iff its cause committed (same transaction);
 * - one sender at a time across processes (`pg_try_advisory_xact_lock`);
 * - before sending, the attempt is counted and the row leased for {@link LEASE_MS}: a crash
 *   before or during the send leaves it pending, and it is sent after the lease;
 * - a crash after the SMTP server accepted but before the row was marked sent gives one
 *   duplicate, carrying the same Message-ID (fixed when the row was written), so mail clients
 *   can fold it;
 * - transient errors (4xx replies, connection trouble) retry with exponential back-off;
 *   permanent ones (5xx replies, a malformed envelope) and the last allowed attempt mark the
 *   row failed, and coordinators see it in the outbox list.
 */
import { randomUUID } from "node:crypto";
import type { Transaction } from "sequelize";
import { env } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { logger } from "../../lib/logger";
import { mailTransport } from "../../lib/mailer";
import * as repo from "./outbox.repository";

export const LEASE_MS = 2 * 60_000;
export const MAX_ATTEMPTS = 10;
const FIRST_RETRY_MS = 30_000;
const MAX_RETRY_MS = 60 * 60_000;
const LOCK_NAME = "hearthloop.outbox";

export interface OutgoingEmail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Same key twice → one message (e.g. "reminder:42:2026-05-01"). */
  dedupeKey?: string;
}

/** The part of a nodemailer transport the sender uses (tests may pass another). */
export interface MailSender {
  sendMail(message: {
    from: string;
    to: string;
    subject: string;
    text: string;
    html?: string;
    messageId: string;
  }): Promise<unknown>;
}

const queuedListeners = new Set<() => void>();

/** Called after a transaction that queued mail commits; the job uses it to send at once. */
export function onEmailQueued(listener: () => void): () => void {
  queuedListeners.add(listener);
  return () => queuedListeners.delete(listener);
}

function messageIdDomain(): string {
  const match = /@([A-Za-z0-9.-]+)>?\s*$/.exec(env().MAIL_FROM);
  return match?.[1] ?? "hearthloop.invalid";
}

/** Queues a message inside `transaction`; returns its row id (0 when the dedupe key already exists). */
export async function enqueueEmail(transaction: Transaction, email: OutgoingEmail): Promise<number> {
  const id = await repo.insertEmail(transaction, {
    ...email,
    messageId: `<${randomUUID()}@${messageIdDomain()}>`,
  });
  transaction.afterCommit(() => {
    for (const listener of queuedListeners) listener();
  });
  return id;
}

/** Delay before attempt `attempts + 1`: 30 s, 1 min, 2 min … capped at 1 h. */
export function retryDelayMs(attempts: number): number {
  return Math.min(FIRST_RETRY_MS * 2 ** Math.max(0, attempts - 1), MAX_RETRY_MS);
}

interface SmtpError {
  code?: string;
  responseCode?: number;
  response?: string;
  message?: string;
}

/** Permanent: the server refused for good (5xx) or the message itself is unusable. */
export function isPermanentMailError(err: unknown): boolean {
  const e = (err ?? {}) as SmtpError;
  if (typeof e.responseCode === "number") return e.responseCode >= 500 && e.responseCode < 600;
  return e.code === "EENVELOPE" || e.code === "EMESSAGE";
}

function describe(err: unknown): string {
  const e = (err ?? {}) as SmtpError;
  const parts = [e.code, e.responseCode, (e.response ?? e.message ?? "").replace(/\s+/g, " ").slice(0, 300)];
  return parts.filter((p) => p !== undefined && p !== "").join(" ") || "unknown error";
}

export interface DeliveryResult {
  /** True when another process held the sender lock and nothing was done here. */
  skipped: boolean;
  sent: number;
  retried: number;
  failed: number;
}

/**
 * Sends every due pending message (at most `limit` per call). Safe to call from any number of
 * processes at once: only the lock holder sends. Tests call it directly.
 */
export async function deliverDueEmails(
  options: { now?: Date; limit?: number; transport?: MailSender } = {},
): Promise<DeliveryResult> {
  const now = options.now ?? new Date();
  const limit = options.limit ?? 20;
  const transport: MailSender = options.transport ?? mailTransport();
  const from = env().MAIL_FROM;
  const result: DeliveryResult = { skipped: false, sent: 0, retried: 0, failed: 0 };

  await sequelize().transaction(async (lock) => {
    if (!(await repo.tryLock(lock, LOCK_NAME))) {
      result.skipped = true;
      return;
    }
    const due = await repo.findDue(lock, now, limit);
    for (const email of due) {
      if (!(await repo.claim(email.id, new Date(now.getTime() + LEASE_MS)))) continue;
      const attempt = email.attempts + 1;
      try {
        await transport.sendMail({
          from,
          to: email.to,
          subject: email.subject,
          text: email.text,
          ...(email.html ? { html: email.html } : {}),
          messageId: email.messageId,
        });
      } catch (err) {
        const reason = describe(err);
        if (isPermanentMailError(err) || attempt >= MAX_ATTEMPTS) {
          await repo.markFailed(email.id, reason);
          result.failed += 1;
          logger.warn({ outboxId: email.id, attempt, reason }, "e-mail failed for good");
        } else {
          await repo.markRetry(email.id, new Date(now.getTime() + retryDelayMs(attempt)), reason);
          result.retried += 1;
          logger.info({ outboxId: email.id, attempt, reason }, "e-mail will be retried");
        }
        continue;
      }
      await repo.markSent(email.id);
      result.sent += 1;
    }
  });
  return result;
}

/** For coordinators: messages that did not arrive yet or never will. */
export function undeliveredEmails() {
  return repo.listUndelivered(100);
}
