/**
 * Drop-offs from residents: logged for the caller's own household (taken from the session,
 * never from the body), turned into fresh kg and kg VS by shared/domain, and checked at once
 * against the digester's feed budget today (digester-state.service: the one place the budget is
 * computed). A drop-off is a request; a steward accepts it, and the hard capacity check happens
 * there. So logging takes no lock: the welcome is advice, and a drop-off that does not fit is
 * still recorded, with a suggestion of where or when it would fit.
 */
import { createHash } from "node:crypto";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, notFound } from "../../lib/app-error";
import { addDays, localDate } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import {
  DEFAULT_KG_VS_PER_FRESH_KG,
  closedPhrase,
  closedReason,
  decideWelcome,
  dropOffQuantities,
  nearestWithRoom,
  roomTodayKgVs as roomToday,
} from "../../../shared/domain";
import {
  DROP_OFF_STATUS_LABELS,
  type CreateDropOffParsed,
  type CreatedDropOff,
  type DropOff,
  type Welcome,
  type WelcomeSuggestion,
} from "../../../shared/schemas/drop-offs";
import * as repo from "../digesters";
import { loadDigestersToday, type DigesterToday } from "../digesters";
import { findHousehold } from "../households";
import * as idempotency from "./idempotency.repository";

export const CREATE_ROUTE = "POST /api/drop-offs";

const noHousehold = () =>
  new AppError(409, "household_required", "Register your household first: drop-offs belong to a household.");

const round = (v: number, places: number) => Math.round(v * 10 ** places) / 10 ** places;
const kgText = (v: number) => `${round(v, 1).toLocaleString("en-GB")} kg`;

/** JSON with object keys sorted at every level, so equal bodies hash equally whatever their key order. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (value && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value ?? null);
}

/** SHA-256 of the route and the parsed (defaults filled in) body. */
export function requestHash(route: string, body: unknown): string {
  return createHash("sha256")
    .update(`${route}\n${canonicalJson(body)}`, "utf8")
    .digest("hex");
}

/** Room at a digester today before a new drop-off, kg VS (shared/domain/room.ts). */
export function roomTodayKgVs(state: DigesterToday): number {
  return roomToday({
    closed: state.closed,
    budgetKgVs: state.budget.budgetKgVs,
    pendingKgVs: state.pendingTodayKgVs,
  });
}

/** A digester's state as a candidate for shared/domain/room.ts. */
const candidate = (s: DigesterToday) => ({
  id: s.digester.id,
  lat: s.digester.lat,
  lng: s.digester.lng,
  closed: s.closed,
  roomKgVs: roomTodayKgVs(s),
  state: s,
});

/**
 * Whether the chosen digester welcomes `dropOffKgVs` today, and if not, the nearest other active
 * digester with room for it (straight-line distance from the household, or from the chosen
 * digester when the household has no location), else tomorrow at the same digester. The
 * decision is shared/domain/room.ts's; this puts it in the resident's words.
 */
export function assessWelcome(input: {
  chosen: DigesterToday;
  all: readonly DigesterToday[];
  dropOffKgVs: number;
  dropOffFreshKg: number;
  from: { lat: number; lng: number } | null;
  forDate: string;
  today: string;
}): Welcome {
  const { chosen } = input;
  const name = chosen.digester.name;
  const decision = decideWelcome({
    chosen: candidate(chosen),
    all: input.all.map(candidate),
    loadKgVs: input.dropOffKgVs,
    from: input.from,
    forTomorrow: input.forDate !== input.today,
  });
  if (decision.basis === "tomorrow") {
    return {
      welcomed: true,
      basis: "tomorrow",
      roomKgScraps: null,
      message: `Logged for tomorrow at ${name}. Tomorrow's room depends on tomorrow's readings; the steward will confirm when you bring it.`,
    };
  }
  const roomKgScraps = round(decision.roomKgVs / DEFAULT_KG_VS_PER_FRESH_KG, 1);
  if (decision.welcomed) {
    return {
      welcomed: true,
      basis: "today",
      roomKgScraps,
      message: `Welcome at ${name} today: it had room for about ${kgText(roomKgScraps)} of scraps before yours (${kgText(input.dropOffFreshKg)}).`,
    };
  }
  const why =
    decision.reason === "notEnoughRoom"
      ? `${name} has room for only about ${kgText(roomKgScraps)} today, less than your ${kgText(input.dropOffFreshKg)}.`
      : `${name} has no room left today. ${chosen.budget.explanation}`;
  const best = decision.alternative;
  let suggestion: WelcomeSuggestion;
  let advice: string;
  if (best) {
    suggestion = {
      kind: "digester",
      digesterId: best.digester.id,
      digesterName: best.digester.state.digester.name,
      distanceM: input.from ? Math.round(best.distanceM) : null,
      roomKgScraps: round(best.digester.roomKgVs / DEFAULT_KG_VS_PER_FRESH_KG, 1),
    };
    advice = `${best.digester.state.digester.name} has room today${input.from ? ` (about ${Math.round(best.distanceM)} m from your home)` : ""}.`;
  } else {
    const tomorrow = addDays(input.today, 1);
    suggestion = { kind: "tomorrow", forDate: tomorrow, digesterId: chosen.digester.id, digesterName: name };
    advice = `No digester has room for it today: bring it to ${name} tomorrow, or compost it.`;
  }
  return { welcomed: false, basis: "today", roomKgScraps, message: `${why} ${advice}`, suggestion };
}

/** Why a closed digester takes no drop-off, and the nearest open digester with any room today. */
function closedMessage(
  state: DigesterToday,
  all: readonly DigesterToday[],
  from: { lat: number; lng: number } | null,
): string {
  const open = nearestWithRoom(candidate(state), all.map(candidate), 0, from);
  const next = open ? ` ${open.digester.state.digester.name} has room today.` : "";
  return `${closedPhrase(state.digester.name, closedReason(state.digester)!)}: it takes no drop-offs until a steward sets it active again.${next}`;
}

export interface CreateResult {
  status: number;
  /** The answer's JSON text: the same bytes on a replay. */
  bodyText: string;
  replayed: boolean;
}

/**
 * Logs a drop-off for the caller's household. With an idempotency key the key is claimed first
 * and the answer stored in the same transaction as the drop-off: the same key and body again
 * replays the stored answer; the same key with another body is a 422. Refusals (400, 409) roll
 * the claim back, so a corrected retry with the same key can still succeed.
 */
export async function createDropOff(
  caller: Caller,
  input: CreateDropOffParsed,
  options: { idempotencyKey?: string; now?: Date } = {},
): Promise<CreateResult> {
  const householdId = caller.householdId;
  if (householdId === null) throw noHousehold();
  const now = options.now ?? new Date();
  const today = localDate(now);
  const tomorrow = addDays(today, 1);
  const forDate = input.forDate ?? today;
  if (forDate !== today && forDate !== tomorrow) {
    throw badRequest("Please check the day.", {
      forDate: `Log a drop-off for today (${today}) or tomorrow (${tomorrow}).`,
    });
  }
  const key = options.idempotencyKey;
  const hash = requestHash(CREATE_ROUTE, input);

  return sequelize().transaction(async (transaction) => {
    if (key !== undefined) {
      const claimed = await idempotency.claimKey(transaction, {
        personId: caller.id,
        key,
        route: CREATE_ROUTE,
        requestHash: hash,
      });
      if (!claimed) {
        const stored = await idempotency.findKey(transaction, caller.id, key);
        if (!stored || stored.route !== CREATE_ROUTE || stored.requestHash !== hash) {
          throw new AppError(
            422,
            "idempotency_key_reused",
            "This Idempotency-Key was already used for a different request. Send a new key for a new drop-off.",
          );
        }
        return { status: stored.statusCode, bodyText: stored.responseText, replayed: true };
      }
    }

    const household = await findHousehold(householdId, transaction);
    if (!household) throw noHousehold();
    const states = await loadDigestersToday(null, { now, transaction });
    const chosen = states.find((s) => s.digester.id === input.digesterId);
    if (!chosen) throw badRequest("Please check the digester.", { digesterId: "There is no digester with this id." });
    const from = household.lat !== null && household.lng !== null ? { lat: household.lat, lng: household.lng } : null;
    if (chosen.closed)
      throw new AppError(409, "digester_closed", closedMessage(chosen, states, from), {
        digesterId: `${chosen.digester.name} takes no drop-offs now.`,
      });

    const q = dropOffQuantities({
      bucketCount: input.bucketCount,
      bucketLitres: input.bucketLitres,
      weightKg: input.weightKg,
      mix: input.mix,
      citrusPercent: input.citrusPercent,
      kgPerLitre: chosen.digester.bucketKgPerLitre,
    });
    const freshKg = round(q.freshKg, 3);
    const kgVs = round(q.kgVs, 4);
    const welcome = assessWelcome({
      chosen,
      all: states,
      dropOffKgVs: kgVs,
      dropOffFreshKg: freshKg,
      from,
      forDate,
      today,
    });

    const row: repo.NewDropOff = {
      householdId,
      digesterId: chosen.digester.id,
      personId: caller.id,
      forDate,
      bucketCount: input.bucketCount ?? null,
      bucketLitres: input.bucketLitres ?? null,
      weightKg: input.weightKg ?? null,
      massSource: q.massSource,
      freshKg,
      kgVs,
      mix: input.mix,
      citrusPercent: input.citrusPercent,
      noRefuseConfirmed: input.noRefuseConfirmed === true,
      note: input.note ?? null,
    };
    const inserted = await repo.insertDropOff(transaction, row);
    const body: CreatedDropOff = {
      id: inserted.id,
      householdId,
      digesterId: chosen.digester.id,
      digesterName: chosen.digester.name,
      loggedBy: caller.name,
      forDate,
      bucketCount: row.bucketCount,
      bucketLitres: row.bucketLitres,
      weightKg: row.weightKg,
      massSource: row.massSource,
      freshKg,
      kgVs,
      mix: input.mix,
      citrusPercent: input.citrusPercent,
      noRefuseConfirmed: row.noRefuseConfirmed,
      status: "pending",
      turnedAwayReason: null,
      note: row.note,
      fedOn: null,
      createdAt: new Date(inserted.createdAt).toISOString(),
      welcome,
    };
    const bodyText = JSON.stringify(body);
    if (key !== undefined) await idempotency.completeKey(transaction, caller.id, key, 201, bodyText);
    return { status: 201, bodyText, replayed: false };
  });
}

/** The caller's household's drop-offs, newest first; none before they register a household. */
export async function listMine(caller: Caller): Promise<DropOff[]> {
  if (caller.householdId === null) return [];
  return repo.findHouseholdDropOffs(caller.householdId);
}

/** Cancels one of the household's own drop-offs while it still waits for a steward. Others' are "not found". */
export async function cancelMine(caller: Caller, id: number): Promise<DropOff> {
  const householdId = caller.householdId;
  if (householdId === null) throw notFound("This drop-off");
  if (!(await repo.cancelIfPending(id, householdId))) {
    const [existing] = await repo.findHouseholdDropOffs(householdId, { id });
    if (!existing) throw notFound("This drop-off");
    throw conflict(
      `This drop-off is already "${DROP_OFF_STATUS_LABELS[existing.status].toLowerCase()}": only drop-offs still waiting for the steward can be cancelled.`,
    );
  }
  const [row] = await repo.findHouseholdDropOffs(householdId, { id });
  return row!;
}
