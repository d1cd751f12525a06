import { afterAll, beforeAll, describe, expect, it } from "vitest";
import net from "node:net";
import nodemailer from "nodemailer";
import { createApp } from "../../server/app";
import { sequelize } from "../../server/db/sequelize";
import * as repo from "../../server/modules/outbox/outbox.repository";
import {
  deliverDueEmails,
  enqueueEmail,
  isPermanentMailError,
  LEASE_MS,
  MAX_ATTEMPTS,
  retryDelayMs,
} from "../../server/modules/outbox/outbox.service";
import { signedInClient, sql, uniqueEmail } from "../helpers/db";
import { ensureMailDev, mailsTo, waitForMails } from "../helpers/mail";

let mail: { stop: () => Promise<void> };

beforeAll(async () => {
  mail = await ensureMailDev();
  // Flush whatever other test files left due, so each test below sees only its own rows.
  await deliverDueEmails({ limit: 1000 });
});

afterAll(async () => {
  await mail.stop();
});

async function queue(to: string, subject = "Outbox test") {
  return sequelize().transaction((t) => enqueueEmail(t, { to, subject, text: `Hello ${to}` }));
}

async function row(id: number) {
  const [r] = await sql<{
    status: string;
    attempts: number;
    next_attempt_at: Date;
    last_error: string | null;
    message_id: string;
    sent_at: Date | null;
  }>(`SELECT status, attempts, next_attempt_at, last_error, message_id, sent_at FROM outbox_emails WHERE id = $1`, [
    id,
  ]);
  return r!;
}

/**
 * A minimal SMTP server that answers every RCPT TO with `reply` (RFC 5321 §4.2: 5yz permanent,
 * 4yz transient) — a real SMTP conversation with nodemailer, not a stub of it.
 */
async function refusingSmtp(reply: string) {
  const server = net.createServer((socket) => {
    socket.write("220 refuser ESMTP\r\n");
    let buffer = "";
    socket.on("data", (data) => {
      buffer += String(data);
      let index: number;
      while ((index = buffer.indexOf("\r\n")) >= 0) {
        const line = buffer.slice(0, index).toUpperCase();
        buffer = buffer.slice(index + 2);
        if (line.startsWith("EHLO") || line.startsWith("HELO")) socket.write("250 refuser\r\n");
        else if (line.startsWith("MAIL FROM")) socket.write("250 OK\r\n");
        else if (line.startsWith("RCPT TO")) socket.write(`${reply}\r\n`);
        else if (line.startsWith("RSET")) socket.write("250 OK\r\n");
        else if (line.startsWith("QUIT")) socket.end("221 bye\r\n");
        else socket.write("500 unknown\r\n");
      }
    });
    socket.on("error", () => undefined);
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const port = (server.address() as net.AddressInfo).port;
  return {
    transport: nodemailer.createTransport({ host: "127.0.0.1", port, secure: false, ignoreTLS: true }),
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

describe("writing to the outbox", () => {
  it("when the cause's transaction rolls back, then no message row remains", async () => {
    const to = uniqueEmail("rollback");
    await expect(
      sequelize().transaction(async (t) => {
        await enqueueEmail(t, { to, subject: "Never", text: "never sent" });
        throw new Error("the cause failed");
      }),
    ).rejects.toThrow("the cause failed");
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [to])).toHaveLength(0);
  });

  it("when the same dedupe key is queued twice, then one row exists", async () => {
    const to = uniqueEmail("dedupe");
    const key = `test:${to}`;
    await sequelize().transaction((t) => enqueueEmail(t, { to, subject: "Once", text: "once", dedupeKey: key }));
    const second = await sequelize().transaction((t) =>
      enqueueEmail(t, { to, subject: "Once", text: "once", dedupeKey: key }),
    );
    expect(second).toBe(0);
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [to])).toHaveLength(1);
  });
});

describe("deliverDueEmails()", () => {
  it("when a message is due, then maildev receives it with the row's Message-ID and the row is marked sent", async () => {
    const to = uniqueEmail("deliver");
    const id = await queue(to);
    const result = await deliverDueEmails();
    expect(result.sent).toBeGreaterThanOrEqual(1);
    const [message] = await waitForMails(to);
    const r = await row(id);
    expect(r.status).toBe("sent");
    expect(r.sent_at).not.toBeNull();
    expect(r.message_id).toMatch(/^<[0-9a-f-]{36}@hearthloop\.invalid>$/);
    expect(message!.messageId ?? message!.headers["message-id"]).toContain(r.message_id.slice(1, -1));
  });

  it("when the sender died after the SMTP server accepted but before marking the row, then the resend carries the same Message-ID", async () => {
    const to = uniqueEmail("twice");
    const id = await queue(to);
    await deliverDueEmails();
    // Undo the mark, as if the process had died between sendMail() and markSent().
    await sql(
      `UPDATE outbox_emails SET status = 'pending', sent_at = NULL, next_attempt_at = now() WHERE id = $1 RETURNING id`,
      [id],
    );
    await deliverDueEmails();
    const mails = await waitForMails(to, 2);
    const ids = mails.map((m) => m.messageId ?? m.headers["message-id"]);
    expect(ids[0]).toBe(ids[1]);
    expect((await row(id)).status).toBe("sent");
  });

  it("when the sender died after claiming a row but before sending, then the row is sent once the lease runs out (nothing lost)", async () => {
    const to = uniqueEmail("lease");
    const id = await queue(to);
    const now = new Date();
    expect(await repo.claim(id, new Date(now.getTime() + LEASE_MS))).toBe(true);
    await deliverDueEmails({ now });
    expect(await mailsTo(to)).toHaveLength(0);
    expect((await row(id)).status).toBe("pending");
    await deliverDueEmails({ now: new Date(now.getTime() + LEASE_MS + 1_000) });
    await waitForMails(to);
    expect((await row(id)).status).toBe("sent");
  });

  it("when the SMTP server cannot be reached, then the row stays pending with back-off and the error, and is sent later", async () => {
    const to = uniqueEmail("transient");
    const id = await queue(to);
    // A port nothing listens on: a real ECONNREFUSED from nodemailer.
    const closed = net.createServer();
    await new Promise<void>((r) => closed.listen(0, "127.0.0.1", r));
    const port = (closed.address() as net.AddressInfo).port;
    await new Promise<void>((r) => closed.close(() => r()));
    const broken = nodemailer.createTransport({
      host: "127.0.0.1",
      port,
      secure: false,
      ignoreTLS: true,
      connectionTimeout: 1_000,
    });
    const now = new Date();
    const result = await deliverDueEmails({ now, transport: broken });
    expect(result.retried).toBe(1);
    const r = await row(id);
    expect(r.status).toBe("pending");
    expect(r.attempts).toBe(1);
    expect(r.last_error).toMatch(/ECONNREFUSED|ECONNECTION/);
    expect(new Date(r.next_attempt_at).getTime() - now.getTime()).toBe(retryDelayMs(1));
    // Not due yet: a run now leaves it alone.
    expect((await deliverDueEmails({ now })).sent).toBe(0);
    await deliverDueEmails({ now: new Date(now.getTime() + retryDelayMs(1) + 1_000) });
    await waitForMails(to);
    expect((await row(id)).status).toBe("sent");
  });

  it("when the SMTP server answers 4xx, then it is retried; when it answers 5xx, then the row is marked failed and coordinators see it", async () => {
    const transientTo = uniqueEmail("busy");
    const permanentTo = uniqueEmail("nosuchuser");
    const transientId = await queue(transientTo);
    const busy = await refusingSmtp("451 4.3.0 mailbox busy, try later");
    try {
      await deliverDueEmails({ transport: busy.transport });
    } finally {
      await busy.close();
    }
    expect((await row(transientId)).status).toBe("pending");
    expect((await row(transientId)).last_error).toContain("451");

    const permanentId = await queue(permanentTo, "Undeliverable");
    const refuser = await refusingSmtp("550 5.1.1 no such user");
    try {
      await deliverDueEmails({ transport: refuser.transport });
    } finally {
      await refuser.close();
    }
    const failed = await row(permanentId);
    expect(failed.status).toBe("failed");
    expect(failed.attempts).toBe(1);
    expect(failed.last_error).toContain("550");

    const coordinator = await signedInClient(createApp({ requestLogging: false }), { roles: ["coordinator"] });
    const list = await coordinator.get("/api/outbox-emails");
    expect(list.status).toBe(200);
    expect(list.body).toContainEqual(
      expect.objectContaining({ id: permanentId, toAddress: permanentTo, status: "failed" }),
    );
    // Deliver the parked transient row so later tests start clean.
    await deliverDueEmails({ now: new Date(Date.now() + retryDelayMs(1) + 1_000) });
  });

  it("when transient errors go on to the last allowed attempt, then the row is marked failed", async () => {
    const to = uniqueEmail("giveup");
    const id = await queue(to);
    await sql(`UPDATE outbox_emails SET attempts = $2 WHERE id = $1 RETURNING id`, [id, MAX_ATTEMPTS - 1]);
    const busy = await refusingSmtp("421 4.7.0 try again later");
    try {
      await deliverDueEmails({ transport: busy.transport });
    } finally {
      await busy.close();
    }
    expect((await row(id)).status).toBe("failed");
  });

  it("when another process holds the sender lock, then this call skips and sends nothing", async () => {
    const to = uniqueEmail("locked");
    const id = await queue(to);
    const holder = await sequelize().transaction();
    try {
      await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.outbox'))`, { transaction: holder });
      const result = await deliverDueEmails();
      expect(result).toEqual({ skipped: true, sent: 0, retried: 0, failed: 0 });
      expect((await row(id)).status).toBe("pending");
    } finally {
      await holder.rollback();
    }
    const [a, b] = await Promise.all([deliverDueEmails(), deliverDueEmails()]);
    expect(a.sent + b.sent).toBeGreaterThanOrEqual(1);
    await waitForMails(to);
    expect(await mailsTo(to)).toHaveLength(1);
  });
});

describe("retry policy", () => {
  it("when attempts grow, then the delay doubles from 30 s and stops at 1 h", () => {
    expect([1, 2, 3, 4, 8, 9, 20].map(retryDelayMs)).toEqual([
      30_000, 60_000, 120_000, 240_000, 3_600_000, 3_600_000, 3_600_000,
    ]);
  });

  it("when an error has a 5xx reply or a bad envelope, then it is permanent; 4xx and connection errors are not", () => {
    expect(isPermanentMailError({ responseCode: 550 })).toBe(true);
    expect(isPermanentMailError({ code: "EENVELOPE" })).toBe(true);
    expect(isPermanentMailError({ responseCode: 421 })).toBe(false);
    expect(isPermanentMailError({ code: "ECONNECTION" })).toBe(false);
    expect(isPermanentMailError(new Error("socket hang up"))).toBe(false);
  });
});
