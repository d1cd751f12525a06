import { UniqueConstraintError } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict } from "../../lib/app-error";
import { hashPassword, verifyPassword } from "../../lib/password";
import { logSecurityEvent } from "../../lib/security-log";
import type { Caller } from "../../middleware/handle";
import type { ChangeEmail, ChangePassword } from "../../../shared/schemas/auth";
import { useResets } from "../auth";
import { assertAcceptablePassword, type RequestContext } from "../auth/auth.service";
import * as people from "../people";
import { enqueueEmail } from "../outbox/outbox.service";
import { emailChangedEmail, passwordChangedEmail } from "../outbox/templates";

const wrongPassword = (field: string) =>
  new AppError(400, "wrong_password", "The password you typed is not your current password.", {
    [field]: "This is not your current password.",
  });

async function assertPassword(caller: Caller, password: string, field: string): Promise<void> {
  const record = await people.findById(caller.id);
  if (!record?.passwordHash || !(await verifyPassword(record.passwordHash, password))) throw wrongPassword(field);
}

async function fresh(caller: Caller): Promise<Caller> {
  return (await people.findById(caller.id))!.caller;
}

export async function updateName(caller: Caller, name: string): Promise<Caller> {
  await people.setName(caller.id, name);
  return fresh(caller);
}

/**
 * Changes the password after checking the current one, ends every other session of the person
 * (this one stays), and tells them by e-mail.
 */
export async function changePassword(
  caller: Caller,
  input: ChangePassword,
  currentSessionId: string | undefined,
  ctx: RequestContext,
) {
  await assertPassword(caller, input.currentPassword, "currentPassword");
  if (input.newPassword === input.currentPassword) {
    throw badRequest("Please choose a new password.", {
      newPassword: "This is your current password; choose a different one.",
    });
  }
  assertAcceptablePassword(input.newPassword, "newPassword");
  const passwordHash = await hashPassword(input.newPassword);
  await sequelize().transaction(async (t) => {
    await people.setPassword(t, caller.id, passwordHash);
    await useResets(t, caller.id);
    await people.deleteSessionsOf(caller.id, currentSessionId ?? "", t);
    await enqueueEmail(t, passwordChangedEmail({ to: caller.email, name: caller.name }));
  });
  logSecurityEvent("password_changed", { ...ctx, userId: caller.id });
}

/** Changes the sign-in and notification address after checking the password; the old address is told. */
export async function changeEmail(caller: Caller, input: ChangeEmail, ctx: RequestContext): Promise<Caller> {
  await assertPassword(caller, input.password, "password");
  if (input.newEmail.toLowerCase() === caller.email.toLowerCase()) {
    throw badRequest("This is already your e-mail address.", { newEmail: "This is already your address." });
  }
  const taken = () =>
    conflict("This e-mail address is in use.", { newEmail: "Another account already uses this address." });
  try {
    await sequelize().transaction(async (t) => {
      if (await people.emailTaken(t, input.newEmail, caller.id)) throw taken();
      await people.setEmail(t, caller.id, input.newEmail);
      await enqueueEmail(t, emailChangedEmail({ to: caller.email, name: caller.name, newEmail: input.newEmail }));
    });
  } catch (err) {
    // Two people claiming one address at the same moment: the unique index decides.
    if (err instanceof UniqueConstraintError) throw taken();
    throw err;
  }
  logSecurityEvent("email_changed", { ...ctx, userId: caller.id });
  return fresh(caller);
}
