/**
 * Households: a resident registers their own (name, address, a point on the map), changes it,
 * and invites other members by e-mail. Until a coordinator assigns a digester, the household's
 * digester is the nearest active one as the crow flies — computed when read, never stored, so the
 * coordinator's scheduler still sees the household as unassigned.
 */
import { UniqueConstraintError } from "sequelize";
import { appUrl } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { AppError, conflict, forbidden } from "../../lib/app-error";
import { newOneTimeToken } from "../../lib/tokens";
import type { Caller } from "../../middleware/handle";
import { haversineM } from "../../../shared/domain/geo";
import type {
  AddMember,
  Household,
  HouseholdDigester,
  HouseholdRow,
  MemberAdded,
  MyHousehold,
  UpdateHousehold,
} from "../../../shared/schemas/households";
import { enqueueEmail } from "../outbox/outbox.service";
import { invitationEmail } from "../outbox/templates";
import { DEFAULT_IMPACT_FACTORS, fedScrapsImpact, impactMethodSentence } from "../../../shared/domain/impact";
import type { HouseholdImpact } from "../../../shared/schemas/households";
import { digesterPoints, impactTotals, type DigesterPoint, type ImpactTotals } from "../digesters";
import * as people from "../people";
import { INVITATION_TTL_MS } from "../people";
import * as repo from "./households.repository";

/** A household with more members than this is more likely a mistake than a home [judgement]. */
export const MAX_HOUSEHOLD_MEMBERS = 12;

const noHousehold = () =>
  new AppError(
    409,
    "household_required",
    "Register your household first: drop-offs and members belong to a household.",
  );

/** The nearest active digester to a point (great-circle distance), or null when none is active. */
export function nearestDigester(
  from: { lat: number; lng: number },
  digesters: readonly DigesterPoint[],
): { digester: DigesterPoint; distanceM: number } | null {
  let best: { digester: DigesterPoint; distanceM: number } | null = null;
  for (const d of digesters) {
    if (d.status !== "active") continue;
    const distanceM = haversineM(from, d) as number;
    if (!best || distanceM < best.distanceM) best = { digester: d, distanceM };
  }
  return best;
}

function householdDigester(h: repo.HouseholdRecord, digesters: readonly DigesterPoint[]): HouseholdDigester | null {
  const location = h.lat !== null && h.lng !== null ? { lat: h.lat, lng: h.lng } : null;
  if (h.assignedDigesterId !== null) {
    const d = digesters.find((x) => x.id === h.assignedDigesterId);
    return {
      id: h.assignedDigesterId,
      name: h.assignedDigesterName ?? d?.name ?? "",
      source: "assigned",
      distanceM: location && d ? Math.round(haversineM(location, d)) : null,
    };
  }
  if (!location) return null;
  const nearest = nearestDigester(location, digesters);
  return nearest
    ? {
        id: nearest.digester.id,
        name: nearest.digester.name,
        source: "nearest",
        distanceM: Math.round(nearest.distanceM),
      }
    : null;
}

async function loadHousehold(caller: Caller, householdId: number): Promise<Household | null> {
  const [h, members, points] = await Promise.all([
    repo.findHousehold(householdId),
    people.findMembers(householdId),
    digesterPoints(),
  ]);
  if (!h) return null;
  return {
    id: h.id,
    name: h.name,
    addressText: h.addressText,
    location: h.lat !== null && h.lng !== null ? { lat: h.lat, lng: h.lng } : null,
    declaredWeeklyKg: h.declaredWeeklyKg,
    digester: householdDigester(h, points),
    members: members.map((m) => ({ id: m.id, name: m.name, status: m.status, isYou: m.id === caller.id })),
  };
}

/** The caller's household, or null before they register one. */
export async function getMine(caller: Caller): Promise<MyHousehold> {
  if (caller.householdId === null) return { household: null };
  return { household: await loadHousehold(caller, caller.householdId) };
}

/** Registers the caller's own household and makes them its first member, in one transaction. */
export async function register(
  caller: Caller,
  input: { name: string; addressText: string; location: { lat: number; lng: number }; declaredWeeklyKg?: number },
): Promise<MyHousehold> {
  const householdId = await sequelize().transaction(async (t) => {
    const person = await people.lockPersonHousehold(t, caller.id);
    if (!person) throw forbidden();
    if (person.householdId !== null) {
      throw conflict(
        "You already belong to a household. Change it on your household page, or ask a coordinator to move you.",
      );
    }
    const id = await repo.insertHousehold(t, {
      name: input.name,
      addressText: input.addressText,
      lat: input.location.lat,
      lng: input.location.lng,
      declaredWeeklyKg: input.declaredWeeklyKg,
    });
    await people.attachPerson(t, caller.id, id);
    return id;
  });
  return { household: await loadHousehold({ ...caller, householdId }, householdId) };
}

/** Changes the caller's household (never its digester: that is the coordinator's). */
export async function updateMine(caller: Caller, changes: UpdateHousehold): Promise<MyHousehold> {
  if (caller.householdId === null) throw noHousehold();
  const householdId = caller.householdId;
  await sequelize().transaction(async (t) => {
    await repo.updateHousehold(t, householdId, {
      name: changes.name,
      addressText: changes.addressText,
      lat: changes.location?.lat,
      lng: changes.location?.lng,
      declaredWeeklyKg: changes.declaredWeeklyKg,
    });
  });
  return { household: await loadHousehold(caller, householdId) };
}

const alreadyKnown = () =>
  conflict(
    "This address already has a Hearthloop account or invitation. Ask a coordinator to add that person to your household.",
    {
      email: "This address already has an account or an invitation.",
    },
  );

/**
 * Invites someone to join the caller's household as a resident: an invited person row, a
 * one-time link (only its hash stored) and the e-mail in the outbox, in one transaction. Unlike
 * a coordinator's invitation it never touches an existing account or invitation, so a resident
 * cannot change anyone else's roles or household.
 */
export async function addMember(caller: Caller, input: Required<AddMember>, now = new Date()): Promise<MemberAdded> {
  if (caller.householdId === null) throw noHousehold();
  const householdId = caller.householdId;
  const { token, hash } = newOneTimeToken();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  try {
    const personId = await sequelize().transaction(async (t) => {
      await people.lockInvitationAddress(t, input.email);
      if (await people.lockPerson(t, { email: input.email })) throw alreadyKnown();
      if ((await people.countMembers(t, householdId)) >= MAX_HOUSEHOLD_MEMBERS) {
        throw conflict(
          `A household has at most ${MAX_HOUSEHOLD_MEMBERS} members. Ask a coordinator if yours needs more.`,
        );
      }
      const id = await people.insertInvitedPerson(t, {
        email: input.email,
        name: input.name || input.email.split("@")[0]!.slice(0, 120),
        roles: ["resident"],
        householdId,
      });
      await people.insertInvitation(t, {
        tokenHash: hash,
        email: input.email,
        name: input.name,
        roles: ["resident"],
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
    });
    return { personId, email: input.email, expiresAt: expiresAt.toISOString() };
  } catch (err) {
    // Two invitations of one address at once: the unique e-mail index lets only one through.
    if (err instanceof UniqueConstraintError) throw alreadyKnown();
    throw err;
  }
}

/** Coordinators see every household; everyone else only their own (or none). */
export async function listHouseholds(caller: Caller): Promise<HouseholdRow[]> {
  const coordinator = caller.roles.includes("coordinator");
  if (!coordinator && caller.householdId === null) return [];
  const rows = await repo.listHouseholds(coordinator ? null : caller.householdId);
  return rows.map((h) => ({
    id: h.id,
    name: h.name,
    addressText: h.addressText,
    location: h.lat !== null && h.lng !== null ? { lat: h.lat, lng: h.lng } : null,
    declaredWeeklyKg: h.declaredWeeklyKg,
    assignedDigesterId: h.assignedDigesterId,
    assignedDigesterName: h.assignedDigesterName,
    memberCount: h.memberCount,
    isMine: h.id === caller.householdId,
  }));
}

const round = (v: number, places: number) => Math.round(v * 10 ** places) / 10 ** places;

/** Before a household has a drop-off. */
const NO_TOTALS: ImpactTotals = {
  dropOffCount: 0,
  pending: 0,
  accepted: 0,
  fed: 0,
  turnedAway: 0,
  cancelled: 0,
  fedFreshKg: 0,
  fedKgVs: 0,
  waterLitres: 0,
  firstFedOn: null,
  lastFedOn: null,
};

/** `GET /api/households/mine/impact`: what the household's fed scraps became (shared/domain/impact.ts, upper estimates). */
export async function householdImpact(caller: Caller): Promise<HouseholdImpact> {
  const totals = caller.householdId === null ? NO_TOTALS : await impactTotals(caller.householdId);
  const impact = fedScrapsImpact(totals);
  const f = DEFAULT_IMPACT_FACTORS;
  return {
    dropOffCount: totals.dropOffCount,
    counts: {
      pending: totals.pending,
      accepted: totals.accepted,
      fed: totals.fed,
      turnedAway: totals.turnedAway,
      cancelled: totals.cancelled,
    },
    fedFreshKg: round(totals.fedFreshKg, 2),
    fedKgVs: round(totals.fedKgVs, 3),
    methaneM3: round(impact.methaneM3, 3),
    biogasM3: round(impact.biogasM3, 3),
    cookingMinutes: Math.round(impact.cookingMinutes),
    dilutionWaterLitres: round(totals.waterLitres, 1),
    digestateLitres: round(impact.digestateLitres, 1),
    firstFedOn: totals.firstFedOn,
    lastFedOn: totals.lastFedOn,
    method: {
      b0M3PerKgVs: f.b0M3PerKgVs,
      methaneFraction: f.methaneFraction,
      burnerLitresPerHour: f.burnerLitresPerHour,
      digestateOutFraction: f.digestateOutFraction,
      sentence: impactMethodSentence(f),
    },
  };
}
