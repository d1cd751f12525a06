/**
 * maildev in tests: its REST API at MAILDEV_WEB_URL (the test runner sets it; default
 * http://127.0.0.1:1081, SMTP on 1026). `ensureMailDev()` starts one in-process when nothing
 * answers there, and its `stop()` stops only what it started.
 *
 * Find mail by recipient (tests use unique addresses), never by clearing the inbox: other test
 * files may be reading it.
 */
import { MailDev } from "maildev";

export const MAILDEV_WEB_URL = (process.env.MAILDEV_WEB_URL ?? "http://127.0.0.1:1081").replace(/\/+$/, "");

export interface ReceivedMail {
  id: string;
  subject: string;
  text: string;
  html?: string;
  to: Array<{ address: string; name?: string }>;
  messageId?: string;
  headers: Record<string, string>;
}

async function answering(): Promise<boolean> {
  try {
    const res = await fetch(`${MAILDEV_WEB_URL}/api/healthz`);
    return res.ok;
  } catch {
    return false;
  }
}

/** Makes sure a maildev answers; returns a stop() that stops it only if it was started here. */
export async function ensureMailDev(): Promise<{ stop: () => Promise<void> }> {
  if (await answering()) return { stop: async () => undefined };
  const web = new URL(MAILDEV_WEB_URL);
  const smtpPort = Number(
    new URL((process.env.SMTP_URL ?? "smtp://127.0.0.1:1026").replace(/^smtp/, "http")).port || 1026,
  );
  const maildev = new MailDev({
    smtp: smtpPort,
    web: Number(web.port),
    ip: "127.0.0.1",
    webIp: "127.0.0.1",
    silent: true,
  });
  await maildev.start();
  return { stop: () => maildev.stop() };
}

/** Every message in maildev addressed to `address` (case-insensitive). */
export async function mailsTo(address: string): Promise<ReceivedMail[]> {
  const res = await fetch(`${MAILDEV_WEB_URL}/api/email`);
  if (!res.ok) throw new Error(`maildev answered ${res.status}`);
  const all = (await res.json()) as ReceivedMail[];
  const wanted = address.toLowerCase();
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === wanted));
}

/** Waits (polling) until `count` messages to `address` have arrived, and returns them. */
export async function waitForMails(address: string, count = 1, timeoutMs = 5_000): Promise<ReceivedMail[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await mailsTo(address);
    if (found.length >= count) return found;
    if (Date.now() > deadline) throw new Error(`expected ${count} e-mail(s) to ${address}, found ${found.length}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The first link in the mail's text whose path starts with `pathPrefix` (e.g. "/invitation/"). */
export function linkIn(mail: ReceivedMail, pathPrefix: string): URL {
  for (const match of mail.text.matchAll(/https?:\/\/\S+/g)) {
    const url = new URL(match[0]);
    if (url.pathname.startsWith(pathPrefix)) return url;
  }
  throw new Error(`no link to ${pathPrefix} in "${mail.subject}"`);
}

/** The token at the end of a one-time link such as /invitation/<token>. */
export function tokenIn(mail: ReceivedMail, pathPrefix: string): string {
  return linkIn(mail, pathPrefix).pathname.slice(pathPrefix.length);
}
