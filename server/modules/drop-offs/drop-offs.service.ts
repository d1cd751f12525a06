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
  DEFAULT_B0_M3_PER_KG_VS,
  DEFAULT_BURNER_LITRES_PER_HOUR,
  DEFAULT_DIGESTATE_OUT_FRACTION,
  DEFAULT_KG_VS_PER_FRESH_KG,
  DEFAULT_METHANE_FRACTION,
  cookingMinutes,
  digestateLitresFromFed,
  dropOffQuantities,
} from "../../../shared/domain";
import { haversineM } from "../../../shared/domain/geo";
import {
  DROP_OFF_STATUS_LABELS,
  type CreateDropOffParsed,
  type CreatedDropOff,
  type DropOff,
  type Welcome,
  type WelcomeSuggestion,
} from "../../../shared/schemas/drop-offs";
import type { HouseholdImpact } from "../../../shared/schemas/households";
import { loadDigestersToday, type DigesterToday } from "../digesters/digester-state.service";
import { findHousehold } from "../households/households.repository";
import * as repo from "./drop-offs.repository";
import * as idempotency from "./idempotency.repository";

export const CREATE_ROUTE = "POST /api/drop-offs";

/** kg VS compared with a tolerance, so a drop-off that exactly fills the room is welcome despite rounding. */
const KG_VS_TOLERANCE = 1e-6;

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

/** Room at a digester today before a new drop-off: budget (fed and accepted already off) minus what is waiting, kg VS. */
export function roomTodayKgVs(state: DigesterToday): number {
  if (state.closed) return 0;
  return Math.max(0, state.budget.budgetKgVs - state.pendingTodayKgVs);
}

/**
 * Whether the chosen digester welcomes `dropOffKgVs` today, and if not, the nearest other active
 * digester with room for it (straight-line distance from the household, or from the chosen
 * digester when the household has no location), else tomorrow at the same digester.
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
  const { chosen, dropOffKgVs } = input;
  const name = chosen.digester.name;
  if (input.forDate !== input.today) {
    return {
      welcomed: true,
      basis: "tomorrow",
      roomKgScraps: null,
      message: `Logged for tomorrow at ${name}. Tomorrow's room depends on tomorrow's readings; the steward will confirm when you bring it.`,
    };
  }
  const roomKgVs = roomTodayKgVs(chosen);
  const roomKgScraps = round(roomKgVs / DEFAULT_KG_VS_PER_FRESH_KG, 1);
  if (dropOffKgVs <= roomKgVs + KG_VS_TOLERANCE) {
    return {
      welcomed: true,
      basis: "today",
      roomKgScraps,
      message: `Welcome at ${name} today: it had room for about ${kgText(roomKgScraps)} of scraps before yours (${kgText(input.dropOffFreshKg)}).`,
    };
  }
  const origin = input.from ?? { lat: chosen.digester.lat, lng: chosen.digester.lng };
  const alternatives = input.all
    .filter(
      (s) => s.digester.id !== chosen.digester.id && !s.closed && dropOffKgVs <= roomTodayKgVs(s) + KG_VS_TOLERANCE,
    )
    .map((s) => ({ s, distanceM: haversineM(origin, s.digester) as number }))
    .sort((a, b) => a.distanceM - b.distanceM);
  const why =
    roomKgVs <= KG_VS_TOLERANCE
      ? `${name} has no room left today. ${chosen.budget.explanation}`
      : `${name} has room for only about ${kgText(roomKgScraps)} today, less than your ${kgText(input.dropOffFreshKg)}.`;
  const best = alternatives[0];
  let suggestion: WelcomeSuggestion;
  let advice: string;
  if (best) {
    suggestion = {
      kind: "digester",
      digesterId: best.s.digester.id,
      digesterName: best.s.digester.name,
      distanceM: input.from ? Math.round(best.distanceM) : null,
      roomKgScraps: round(roomTodayKgVs(best.s) / DEFAULT_KG_VS_PER_FRESH_KG, 1),
    };
    advice = `${best.s.digester.name} has room today${input.from ? ` (about ${Math.round(best.distanceM)} m from your home)` : ""}.`;
  } else {
    const tomorrow = addDays(input.today, 1);
    suggestion = { kind: "tomorrow", forDate: tomorrow, digesterId: chosen.digester.id, digesterName: name };
    advice = `No digester has room for it today: bring it to ${name} tomorrow, or compost it.`;
  }
  return { welcomed: false, basis: "today", roomKgScraps, message: `${why} ${advice}`, suggestion };
}

function closedMessage(
  state: DigesterToday,
  all: readonly DigesterToday[],
  from: { lat: number; lng: number } | null,
): string {
  const d = state.digester;
  const origin = from ?? { lat: d.lat, lng: d.lng };
  const open = all
    .filter((s) => !s.closed && roomTodayKgVs(s) > KG_VS_TOLERANCE)
    .sort((a, b) => (haversineM(origin, a.digester) as number) - (haversineM(origin, b.digester) as number));
  const reason = d.statusReason ? ` (${d.statusReason})` : "";
  const next = open[0] ? ` ${open[0].digester.name} has room today.` : "";
  return `${d.name} is ${d.status}${reason}: it takes no drop-offs until a steward sets it active again.${next}`;
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

/**
 * What the household's fed scraps became (estimates):
 * methane m³ = kg VS fed × B0 (0.40 m³ CH4/kg VS, the ultimate yield [judgement in 0.348–0.435,
 * read: Zhang et al. 2007]); biogas m³ = methane ÷ 0.60 CH4 share [read: FAO/CMS 1996 Table 1];
 * cooking minutes = biogas L ÷ 350 L/h × 60 [read: Tilley et al. 2014, D.7]; digestate L =
 * 0.92 × (fresh kg ≈ L + dilution water the steward recorded) [read: NNFCC]. B0 is what the
 * scraps could give at most: an unheated digester in a cold month gives less, so the figures are
 * labelled "up to".
 */
export async function householdImpact(caller: Caller): Promise<HouseholdImpact> {
  const totals: repo.ImpactTotals =
    caller.householdId === null
      ? {
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
        }
      : await repo.impactTotals(caller.householdId);
  const methaneM3 = totals.fedKgVs * DEFAULT_B0_M3_PER_KG_VS;
  const biogasM3 = methaneM3 / DEFAULT_METHANE_FRACTION;
  const digestateLitres = digestateLitresFromFed(
    totals.fedFreshKg + totals.waterLitres,
    DEFAULT_DIGESTATE_OUT_FRACTION,
  ) as number;
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
    methaneM3: round(methaneM3, 3),
    biogasM3: round(biogasM3, 3),
    cookingMinutes: Math.round(cookingMinutes(biogasM3 * 1000, DEFAULT_BURNER_LITRES_PER_HOUR)),
    dilutionWaterLitres: round(totals.waterLitres, 1),
    digestateLitres: round(digestateLitres, 1),
    firstFedOn: totals.firstFedOn,
    lastFedOn: totals.lastFedOn,
    method: {
      b0M3PerKgVs: DEFAULT_B0_M3_PER_KG_VS,
      methaneFraction: DEFAULT_METHANE_FRACTION,
      burnerLitresPerHour: DEFAULT_BURNER_LITRES_PER_HOUR,
      digestateOutFraction: DEFAULT_DIGESTATE_OUT_FRACTION,
      sentence:
        `Gas is an upper estimate: the volatile solids of your fed scraps × ${DEFAULT_B0_M3_PER_KG_VS} m³ of methane per kg (the most food scraps give), ` +
        `as biogas with ${Math.round(DEFAULT_METHANE_FRACTION * 100)} % methane, cooking at ${DEFAULT_BURNER_LITRES_PER_HOUR} litres an hour; ` +
        `fertiliser is ${Math.round(DEFAULT_DIGESTATE_OUT_FRACTION * 100)} % of the scraps plus the water they were mixed with.`,
    },
  };
}
