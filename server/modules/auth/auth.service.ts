import { appUrl } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { AppError } from "../../lib/app-error";
import { dummyPasswordHash, hashPassword, verifyPassword } from "../../lib/password";
import { logSecurityEvent } from "../../lib/security-log";
import { hashToken, newOneTimeToken } from "../../lib/tokens";
import type { Caller } from "../../middleware/handle";
import { enqueueEmail } from "../outbox/outbox.service";
import { passwordResetEmail } from "../outbox/templates";
import { assertAcceptablePassword } from "../../lib/password";
import type { RequestContext } from "../../lib/caller";
import * as people from "../people";
import * as repo from "./auth.repository";
import { clearSignInFailures } from "./sign-in-throttle";

export type { RequestContext } from "../../lib/caller";
export { assertAcceptablePassword } from "../../lib/password";

export const RESET_LINK_TTL_MS = 60 * 60_000;
/** At most this many reset e-mails per account per hour, so the form cannot flood an inbox. */
const RESETS_PER_HOUR = 3;

/** One answer for an unknown e-mail and a wrong password, so neither reveals which accounts exist. */
export const invalidCredentials = () =>
  new AppError(
    401,
    "invalid_credentials",
    "The e-mail address or the password is not right. Check both and try again.",
  );

/**
 * Checks an e-mail and password. Unknown, invited and disabled accounts still cost one argon2
 * verification (against a dummy hash), so the answer takes about as long either way.
 */
export async function verifyCredentials(email: string, password: string, ctx: RequestContext): Promise<Caller | null> {
  const record = await people.findByEmail(email);
  const usable = record && record.status === "active" && record.passwordHash;
  const ok = await verifyPassword(usable ? record.passwordHash! : await dummyPasswordHash(), password);
  if (usable && ok) {
    logSecurityEvent("sign_in_succeeded", { ...ctx, userId: record.caller.id, email });
    return record.caller;
  }
  const reason = !record
    ? "unknown_account"
    : record.status !== "active"
      ? `account_${record.status}`
      : "wrong_password";
  logSecurityEvent("sign_in_failed", { ...ctx, email, userId: record?.caller.id, reason });
  return null;
}

/** The person a session belongs to, as long as the account is still active. */
export function sessionCaller(personId: number): Promise<Caller | null> {
  return people.findActiveCaller(personId);
}

const resetListeners = new Set<() => void>();

/** Called (after the answer has gone) when a reset request is stored; the job uses it to handle it at once. */
export function onResetRequested(listener: () => void): () => void {
  resetListeners.add(listener);
  return () => resetListeners.delete(listener);
}

/**
 * Takes a reset request: stores the address as typed and returns, the same path and the same
 * statement whether or not an account uses it, so neither the answer nor its time tells
 * (ASVS V6, no account discovery). The route always replies 202. The account lookup, the link
 * and the e-mail happen afterwards in {@link processResetRequests}.
 */
export async function requestPasswordReset(email: string, ctx: RequestContext): Promise<void> {
  logSecurityEvent("password_reset_requested", { ...ctx, email });
  await repo.insertResetRequest(email);
  // After this turn of the event loop, i.e. once the answer is on its way.
  setImmediate(() => {
    for (const listener of resetListeners) listener();
  });
}

/** At most this many requests per run, so one run never holds the job for long. */
const RESET_REQUESTS_PER_RUN = 200;

/**
 * Works the queue of reset requests, one transaction each: a request for an active account
 * gets a one-hour link and an e-mail through the outbox (at most {@link RESETS_PER_HOUR} per
 * account and hour); any other is dropped. A crash leaves unhandled requests queued.
 * Returns how many requests were handled.
 */
export async function processResetRequests(now = new Date()): Promise<number> {
  let handled = 0;
  while (handled < RESET_REQUESTS_PER_RUN) {
    const took = await sequelize().transaction(async (t) => {
      const request = await repo.takeResetRequest(t);
      if (!request) return false;
      const record = await people.findByEmail(request.email, t);
      if (!record || record.status !== "active") return true;
      const personId = record.caller.id;
      await repo.lockResetsOf(t, personId);
      if ((await repo.countRecentResets(personId, new Date(now.getTime() - 60 * 60_000), t)) >= RESETS_PER_HOUR)
        return true;
      const { token, hash } = newOneTimeToken();
      const expiresAt = new Date(now.getTime() + RESET_LINK_TTL_MS);
      await repo.insertReset(t, personId, hash, expiresAt);
      await enqueueEmail(
        t,
        passwordResetEmail({
          to: record.caller.email,
          name: record.caller.name,
          link: `${appUrl()}/reset-password/${token}`,
          expiresAt,
        }),
      );
      return true;
    });
    if (!took) break;
    handled += 1;
  }
  return handled;
}

const linkGone = (message: string) => new AppError(410, "link_expired", message);
const linkUnknown = () =>
  new AppError(
    404,
    "link_not_found",
    "This reset link is not valid. Copy the whole link from the e-mail, or ask for a new one.",
  );

async function usableReset(t: Parameters<typeof repo.findResetForUpdate>[0], token: string, now: Date) {
  const reset = await repo.findResetForUpdate(t, hashToken(token));
  if (!reset) throw linkUnknown();
  if (reset.usedAt) throw linkGone("This reset link has already been used. Ask for a new one if you still need it.");
  if (reset.expiresAt.getTime() <= now.getTime())
    throw linkGone("This reset link has expired (links work for one hour). Ask for a new one.");
  if (reset.personStatus !== "active") throw linkGone("This account is not active. Ask your coordinator for help.");
  return reset;
}

/** Whether a reset link can still be used (the page checks before showing the form). */
export async function checkResetLink(token: string, now = new Date()): Promise<void> {
  await sequelize().transaction(async (t) => {
    await usableReset(t, token, now);
  });
}

/**
 * Sets the new password from a one-time link, ends every session of that person and forgets
 * the account's failed sign-ins (a stranger's guesses must not keep the owner out after a
 * reset). Returns the person's e-mail, so the route can remember this browser for them.
 */
export async function completePasswordReset(
  token: string,
  password: string,
  ctx: RequestContext,
  now = new Date(),
): Promise<{ personId: number; email: string }> {
  assertAcceptablePassword(password, "password");
  const passwordHash = await hashPassword(password);
  const person = await sequelize().transaction(async (t) => {
    const reset = await usableReset(t, token, now);
    await people.setPassword(t, reset.personId, passwordHash);
    await repo.useResets(t, reset.personId);
    await people.deleteSessionsOf(reset.personId, undefined, t);
    const record = await people.findById(reset.personId, t);
    await clearSignInFailures(record!.caller.email, t);
    return { personId: reset.personId, email: record!.caller.email };
  });
  logSecurityEvent("password_reset_completed", { ...ctx, userId: person.personId });
  return person;
}
