import { UniqueConstraintError } from "sequelize";
import { appUrl } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, notFound } from "../../lib/app-error";
import { hashPassword } from "../../lib/password";
import { logSecurityEvent } from "../../lib/security-log";
import { hashToken, newOneTimeToken } from "../../lib/tokens";
import type { Caller } from "../../middleware/handle";
import type { AcceptInvitation, InvitationInfo, Role } from "../../../shared/schemas/auth";
import type {
  DigesterStewards,
  InvitationCreated,
  PersonRow,
  SetStewards,
  UpdatePerson,
} from "../../../shared/schemas/people";
import { assertAcceptablePassword } from "../../lib/password";
import type { RequestContext } from "../../lib/caller";
import { findStewards, lockDigester, removeStewardships, replaceStewards } from "../digesters";
import { enqueueEmail } from "../outbox/outbox.service";
import { invitationEmail } from "../outbox/templates";
import * as repo from "./people.repository";

export const INVITATION_TTL_MS = 7 * 24 * 60 * 60_000;
/** The same invitation sent again within this many seconds is a repeat (a double click, a burst), not a new one. */
export const REPEAT_INVITATION_SECONDS = 60;

const repeatedInvitation = () =>
  conflict(
    "This invitation went to this address a moment ago. It may take a few minutes to arrive; send it again after that if it has not.",
    { email: "was invited with the same details less than a minute ago" },
  );

const addressJustTaken = () =>
  conflict("Another account or invitation took this address a moment ago. Reload the list of people to see it.", {
    email: "was taken by another account or invitation a moment ago",
  });

const sameRoles = (a: readonly Role[], b: readonly Role[]) =>
  a.length === b.length && [...a].sort().join() === [...b].sort().join();

export function listPeople(): Promise<PersonRow[]> {
  return repo.listPeople();
}

/**
 * Invites someone by e-mail: a person row in status "invited" (so roles and steward duties can
 * be set before they accept), a one-time link valid 7 days (only its hash is stored), and the
 * e-mail in the outbox, all in one transaction. Inviting an invited person again replaces the
 * old link, unless it repeats the same invitation within a minute: invitations of one address
 * take turns (advisory lock), so of a burst of the same invitation one is sent and the others
 * are 409.
 */
export async function invite(
  caller: Caller,
  input: { email: string; name: string; roles: Role[]; householdId?: number | null },
  now = new Date(),
): Promise<InvitationCreated> {
  const { token, hash } = newOneTimeToken();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const personId = await sequelize()
    .transaction(async (t) => {
      await repo.lockInvitationAddress(t, input.email);
      const existing = await repo.lockPerson(t, { email: input.email });
      if (existing && existing.status !== "invited") {
        throw conflict("This person already has an account.", {
          email: "Someone with this e-mail address already has an account.",
        });
      }
      let id: number;
      if (existing) {
        id = existing.id;
        const recent = await repo.recentOpenInvitation(t, id, REPEAT_INVITATION_SECONDS);
        const sameDetails =
          recent !== null &&
          sameRoles(recent.roles, input.roles) &&
          recent.name === input.name &&
          (input.householdId === undefined || input.householdId === existing.householdId);
        if (sameDetails) throw repeatedInvitation();
        await repo.updatePerson(t, id, {
          roles: input.roles,
          ...(input.name ? { name: input.name } : {}),
          ...(input.householdId !== undefined ? { householdId: input.householdId } : {}),
        });
        await repo.revokeInvitations(t, id);
      } else {
        // The name column needs a value; until they choose one, the invitation shows the address.
        id = await repo.insertInvitedPerson(t, {
          email: input.email,
          name: input.name || input.email.split("@")[0]!.slice(0, 120),
          roles: input.roles,
          householdId: input.householdId ?? null,
        });
      }
      await repo.insertInvitation(t, {
        tokenHash: hash,
        email: input.email,
        name: input.name,
        roles: input.roles,
        invitedBy: caller.id,
        expiresAt,
        personId: id,
      });
      await enqueueEmail(
        t,
        invitationEmail({
          to: input.email,
          name: input.name,
          inviterName: caller.name,
          link: `${appUrl()}/invitation/${token}`,
          expiresAt,
        }),
      );
      return id;
    })
    .catch((err: unknown) => {
      // The address became an account's a moment ago (an e-mail change, a household's invitation).
      if (err instanceof UniqueConstraintError) throw addressJustTaken();
      throw err;
    });
  return { personId, email: input.email, expiresAt: expiresAt.toISOString() };
}

const invitationUnknown = () =>
  new AppError(
    404,
    "link_not_found",
    "This invitation link is not valid. Copy the whole link from the e-mail, or ask for a new invitation.",
  );
const linkGone = (message: string) => new AppError(410, "link_expired", message);

function assertUsable(invitation: repo.InvitationRow | null, now: Date): repo.InvitationRow {
  if (!invitation || invitation.personId === null) throw invitationUnknown();
  if (invitation.usedAt || invitation.personStatus === "active") {
    throw linkGone("This invitation has already been accepted. Sign in with your e-mail address and password.");
  }
  if (invitation.expiresAt.getTime() <= now.getTime()) {
    throw linkGone("This invitation has expired (links work for 7 days). Ask your coordinator to invite you again.");
  }
  if (invitation.personStatus !== "invited")
    throw linkGone("This invitation can no longer be used. Ask your coordinator for help.");
  return invitation;
}

/** What the acceptance page shows before the person chooses a password. */
export async function invitationInfo(token: string, now = new Date()): Promise<InvitationInfo> {
  const invitation = assertUsable(await repo.findInvitation(hashToken(token)), now);
  return {
    email: invitation.email,
    name: invitation.name,
    roles: invitation.roles,
    expiresAt: invitation.expiresAt.toISOString(),
  };
}

/** Sets name and password from a one-time invitation; returns the now active person. */
export async function acceptInvitation(
  token: string,
  input: AcceptInvitation,
  ctx: RequestContext,
  now = new Date(),
): Promise<Caller> {
  assertAcceptablePassword(input.password, "password");
  const passwordHash = await hashPassword(input.password);
  const caller = await sequelize().transaction(async (t) => {
    const invitation = assertUsable(await repo.findInvitation(hashToken(token), t), now);
    const personId = invitation.personId!;
    await repo.activateInvitedPerson(t, personId, input.name, passwordHash);
    await repo.markInvitationUsed(t, invitation.id);
    const record = await repo.findById(personId, t);
    return record!.caller;
  });
  logSecurityEvent("invitation_accepted", { ...ctx, userId: caller.id });
  return caller;
}

/** A coordinator's change to a person. Disabling ends their sessions in the same transaction. */
export async function updatePerson(
  caller: Caller,
  id: number,
  changes: UpdatePerson,
  ctx: RequestContext,
): Promise<PersonRow> {
  if (id === caller.id) {
    if (changes.status === "disabled")
      throw badRequest("You cannot disable your own account.", { status: "You cannot disable yourself." });
    if (changes.roles && !changes.roles.includes("coordinator")) {
      throw badRequest("You cannot remove your own coordinator role.", {
        roles: "Ask another coordinator to change your roles.",
      });
    }
  }
  const { before, row } = await sequelize().transaction(async (t) => {
    const person = await repo.lockPerson(t, { id });
    if (!person) throw notFound("This person");
    if (changes.status === "active" && !person.hasPassword) {
      throw conflict("This person has not accepted their invitation yet.", {
        status: "They become active when they accept the invitation.",
      });
    }
    // An invited person stays invited; only accepting the invitation activates them.
    const status = changes.status === "active" && person.status === "invited" ? undefined : changes.status;
    await repo.updatePerson(t, id, { ...changes, status });
    if (changes.roles && !changes.roles.includes("steward")) await removeStewardships(t, id);
    if (status === "disabled") await repo.deleteSessionsOf(id, undefined, t);
    return { before: person, row: (await repo.getPersonRow(id, t))! };
  });
  if (changes.status === "disabled" && before.status !== "disabled") {
    logSecurityEvent("person_disabled", { ...ctx, userId: caller.id, targetId: id });
  }
  if (changes.roles && changes.roles.slice().sort().join() !== before.roles.slice().sort().join()) {
    logSecurityEvent("roles_changed", {
      ...ctx,
      userId: caller.id,
      targetId: id,
      reason: changes.roles.join("+") || "none",
    });
  }
  return row;
}

/** Replaces the stewards of a digester; each must hold the steward role and not be disabled. */
export async function setStewards(digesterId: number, input: SetStewards): Promise<DigesterStewards> {
  return sequelize().transaction(async (t) => {
    if (!(await lockDigester(t, digesterId))) throw notFound("This digester");
    const people = await repo.findPeopleByIds(t, input.personIds);
    const byId = new Map(people.map((p) => [p.id, p]));
    const problems: string[] = [];
    for (const id of input.personIds) {
      const p = byId.get(id);
      if (!p) problems.push(`there is no person with id ${id}`);
      else if (!p.roles.includes("steward")) problems.push(`${p.name} does not have the steward role`);
      else if (p.status === "disabled") problems.push(`${p.name} is disabled`);
    }
    if (problems.length > 0)
      throw badRequest("Some of these people cannot be stewards.", { personIds: problems.join("; ") });
    await replaceStewards(t, digesterId, input.personIds);
    return { digesterId, stewards: await findStewards(digesterId, { transaction: t, everyone: true }) };
  });
}
