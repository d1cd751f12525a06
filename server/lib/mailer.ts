import nodemailer, { type Transporter } from "nodemailer";
import { env } from "../config/env";

let transporter: Transporter | undefined;

/** The SMTP transport (maildev in the demo and tests, SMTP_URL in production). */
export function mailTransport(): Transporter {
  if (transporter) return transporter;
  const url = new URL(env().SMTP_URL);
  const secure = url.protocol === "smtps:";
  transporter = nodemailer.createTransport({
    host: url.hostname,
    port: Number(url.port || (secure ? 465 : 25)),
    secure,
    ignoreTLS: !secure && (url.hostname === "127.0.0.1" || url.hostname === "localhost"),
    auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
    connectionTimeout: 3_000,
    greetingTimeout: 3_000,
    socketTimeout: 10_000,
  });
  return transporter;
}

/** True when the SMTP server answers; never throws. */
export async function mailReachable(timeoutMs = 1_500): Promise<boolean> {
  try {
    return await Promise.race([
      mailTransport().verify(),
      new Promise<boolean>((resolve) => setTimeout(() => resolve(false), timeoutMs).unref()),
    ]);
  } catch {
    return false;
  }
}

export function closeMail() {
  transporter?.close();
  transporter = undefined;
}
