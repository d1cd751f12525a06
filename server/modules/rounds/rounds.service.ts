/**
 * Collection rounds: planning a date's cargo-bike rounds with shared/domain/rounds/
 * (volunteers' bike loads and start points; end digesters with room for that date from the feed
 * budget), storing them, the round sheet and its GeoJSON, and marking stops collected (which
 * creates a pending drop-off at the round's end digester for its steward to accept).
 *
 * Room on the date: today's feed budget (today) or that day of the weekly-room projection (a later
 * date; shared/domain/weekly-room.ts, day 6 beyond a week), minus what is already headed there on
 * that date: pending drop-offs, and the stops still to collect on rounds a re-plan keeps.
 */
import { performance } from "node:perf_hooks";
import type { Transaction } from "sequelize";
import { dropOffQuantities } from "../../../shared/domain/drop-offs";
import { DEFAULT_BUCKET_LITRES } from "../../../shared/domain/feed-budget";
import { haversineM, isValidLatLng } from "../../../shared/domain/geo";
import { planCollectionRounds } from "../../../shared/domain/rounds";
import { freshKgFromKgVs } from "../../../shared/domain/scraps";
import { projectWeeklyRoom } from "../../../shared/domain/weekly-room";
import {
  COLLECTION_BUCKET_KG,
  type PlanResult,
  type RoundSheet,
  type RoundSummary,
} from "../../../shared/schemas/collections";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, forbidden, notFound } from "../../lib/app-error";
import { daysBetween, localDate } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { type DigesterToday, digesterPoints, insertDropOff, loadDigestersToday, pendingKgOnDate } from "../digesters";
import { availableVolunteers } from "../people";
import * as repo from "./rounds.repository";
import { planMessageWords, unplacedStopWords } from "./rounds.words";

/** What is already headed for a digester on the date planned, fresh kg (see {@link reservedOnDate}). */
export interface ReservedKg {
  /** Drop-offs pending at the digester on that date. */
  pendingKg: number;
  /** Stops still to collect on that date's kept rounds ending there. */
  plannedKg: number;
}

/** Room for scraps at a digester on `forDate`, fresh kg, after what is already `reserved` there (see the module comment). */
export function roomOnDateKg(state: DigesterToday, forDate: string, reserved: ReservedKg): number {
  if (state.closed) return 0;
  const k = daysBetween(state.today, forDate);
  let roomKg: number;
  if (k <= 0) roomKg = state.budget.budgetKgScraps;
  else {
    const projection = projectWeeklyRoom({
      limits: state.budget.limits,
      previous7DaysKgVs: state.budget.limits.weekRamp === null ? null : state.previous7DaysKgVs,
      fedTodayKgVs: state.committedTodayKgVs,
      closed: false,
    });
    roomKg = freshKgFromKgVs(projection.dailyKgVs[Math.min(6, k)] ?? 0);
  }
  return Math.max(0, roomKg - reserved.pendingKg - reserved.plannedKg);
}

/**
 * What is already headed for each digester on a date: pending drop-offs, and the uncollected
 * stops of the date's planned rounds (after a re-plan deleted the rounds it replaces, those are
 * the rounds it keeps). Digesters with neither are left out.
 */
async function reservedOnDate(transaction: Transaction, forDate: string): Promise<Map<number, ReservedKg>> {
  const [pending, planned] = await Promise.all([
    pendingKgOnDate(transaction, forDate),
    repo.plannedKgOnDate(transaction, forDate, COLLECTION_BUCKET_KG),
  ]);
  const out = new Map<number, ReservedKg>();
  for (const p of pending) out.set(p.digesterId, { pendingKg: p.pendingKg, plannedKg: 0 });
  for (const p of planned)
    out.set(p.digesterId, { pendingKg: out.get(p.digesterId)?.pendingKg ?? 0, plannedKg: p.plannedKg });
  return out;
}

/** A round's end digester: name, site and place. */
async function findEndDigester(id: number, transaction?: Transaction) {
  const [end] = await digesterPoints({ id, transaction });
  return end;
}

/** Planning's density of a collected bucket, kg/L: the drop-off records what the plan reserved (the steward weighs on accepting). */
const COLLECTION_KG_PER_LITRE = COLLECTION_BUCKET_KG / DEFAULT_BUCKET_LITRES;

/** Plans (or re-plans) a date: planned rounds with nothing collected yet are replaced. */
export async function planRounds(forDate: string, now = new Date()): Promise<PlanResult> {
  const today = localDate(now);
  if (forDate < today) throw badRequest("Plan today or a later day.", { forDate: "Today or later." });
  return sequelize().transaction(async (transaction) => {
    await repo.lockDate(transaction, forDate);
    // Rounds first, then requests (as markCollected); the re-check sees collections that committed meanwhile.
    const oldIds = await repo.replaceableRoundIds(transaction, await repo.lockPlannedRounds(transaction, forDate));
    if (oldIds.length > 0) {
      await repo.reopenRequestsOf(transaction, oldIds);
      await repo.deleteRounds(transaction, oldIds);
    }
    const requests = await repo.lockOpenRequests(transaction, forDate);
    const volunteers = await availableVolunteers(transaction);
    const states = await loadDigestersToday(null, { now, transaction });
    const reserved = await reservedOnDate(transaction, forDate);
    const digesters = states
      .map((s) => ({
        id: String(s.digester.id),
        lat: s.digester.lat,
        lng: s.digester.lng,
        roomKg: roomOnDateKg(s, forDate, reserved.get(s.digester.id) ?? { pendingKg: 0, plannedKg: 0 }),
      }))
      .filter((d) => d.roomKg > 0);
    const messages: string[] = [];
    if (requests.length === 0) messages.push(`No open collection requests for ${forDate}.`);
    if (volunteers.length === 0)
      messages.push(
        "No volunteer with a cargo-bike load and a start point: mark someone as a volunteer on the people page.",
      );
    if (digesters.length === 0)
      messages.push(`No digester has room on ${forDate} (resting, offline, no temperature reading or full).`);

    const started = performance.now();
    const plan = planCollectionRounds({
      stops: requests.map((r) => ({
        householdId: String(r.id),
        lat: r.lat,
        lng: r.lng,
        loadKg: r.bucketCount * COLLECTION_BUCKET_KG,
      })),
      volunteers: volunteers.map((v) => ({ id: String(v.id), lat: v.lat, lng: v.lng, bikeLoadKg: v.bikeLoadKg })),
      digesters,
    });
    const solveMs = performance.now() - started;
    const volunteerNames = new Map(volunteers.map((v) => [String(v.id), v.name]));
    const digesterNames = new Map(states.map((s) => [String(s.digester.id), s.digester.name]));
    for (const m of plan.messages)
      messages.push(
        planMessageWords(m, { volunteer: (id) => volunteerNames.get(id), digester: (id) => digesterNames.get(id) }),
      );

    // Three statements whatever the number of rounds and stops.
    const roundIds = await repo.insertRounds(
      transaction,
      forDate,
      plan.rounds.map((round) => ({
        volunteerId: Number(round.volunteerId),
        endDigesterId: Number(round.endDigesterId),
        totalM: round.lengthM,
        loadKg: round.loadKg,
      })),
    );
    await repo.insertStops(
      transaction,
      plan.rounds.flatMap((round, r) =>
        round.stops.map((stop, i) => ({ roundId: roundIds[r]!, requestId: Number(stop.householdId), seq: i + 1 })),
      ),
    );
    await repo.markRequestsPlanned(
      transaction,
      plan.rounds.flatMap((round) => round.stops.map((s) => Number(s.householdId))),
    );
    const names = new Map(requests.map((r) => [String(r.id), r.householdName]));
    const rounds = await repo.roundSummariesOn(forDate, transaction);
    return {
      forDate,
      rounds,
      unplaced: plan.unplacedStops.map((u) => ({
        requestId: Number(u.householdId),
        householdName: names.get(u.householdId) ?? "",
        reason: u.reason,
        message: unplacedStopWords(u, names.get(u.householdId)),
      })),
      messages,
      totalM: plan.totalLengthM,
      solveMs: Math.round(solveMs * 10) / 10,
    };
  });
}

async function isVolunteerOnly(caller: Caller): Promise<boolean> {
  return !caller.roles.includes("coordinator");
}

/** Rounds of a date (or all upcoming): coordinators see all, anyone else their own. */
export async function listRounds(
  caller: Caller,
  date: string | undefined,
  now = new Date(),
): Promise<{ rounds: RoundSummary[] }> {
  const rounds = await repo.listRoundSummaries({
    ...(date ? { forDate: date } : { fromDate: localDate(now) }),
    volunteerId: (await isVolunteerOnly(caller)) ? caller.id : undefined,
  });
  return { rounds };
}

async function loadRound(caller: Caller, id: number, transaction?: Transaction, lock = false) {
  const round = await repo.findRound(id, { transaction, lock });
  if (!round) throw notFound("The round");
  if (!caller.roles.includes("coordinator") && round.volunteerId !== caller.id)
    throw forbidden("This is another volunteer's round.");
  return round;
}

/**
 * Re-measures a round after a stop left it (a cancelled request): load and length from the stops
 * that remain, in their order; "cancelled" when none remain, "done" when all remaining are collected.
 */
export async function refreshRound(transaction: Transaction, roundId: number): Promise<void> {
  const round = await repo.findRound(roundId, { transaction, lock: true });
  if (!round || round.status === "cancelled") return;
  const stops = await repo.roundStops(roundId, transaction);
  const end = await findEndDigester(round.endDigesterId, transaction);
  let previous = isValidLatLng(round.startLat, round.startLng) ? { lat: round.startLat!, lng: round.startLng! } : null;
  let totalM = 0;
  for (const s of stops) {
    if (previous) totalM += haversineM(previous, s);
    previous = { lat: s.lat, lng: s.lng };
  }
  if (previous && end && stops.length > 0) totalM += haversineM(previous, end);
  const status =
    stops.length === 0 ? "cancelled" : stops.every((s) => s.status === "collected") ? "done" : round.status;
  await repo.updateRoundTotals(transaction, roundId, {
    totalM: Math.round(totalM * 10) / 10,
    loadKg: stops.reduce((sum, s) => sum + s.bucketCount * COLLECTION_BUCKET_KG, 0),
    status,
  });
}

/** The round sheet: stops in order with address, buckets and legs, start and end. */
export async function roundSheet(caller: Caller, id: number, transaction?: Transaction): Promise<RoundSheet> {
  const round = await loadRound(caller, id, transaction);
  const end = await findEndDigester(round.endDigesterId, transaction);
  const stops = await repo.roundStops(id, transaction);
  const start = isValidLatLng(round.startLat, round.startLng) ? { lat: round.startLat!, lng: round.startLng! } : null;
  let previous = start;
  const withLegs = stops.map((s) => {
    const here = { lat: s.lat, lng: s.lng };
    const legM = previous ? Math.round(haversineM(previous, here)) : 0;
    previous = here;
    return { ...s, loadKg: s.bucketCount * COLLECTION_BUCKET_KG, legM };
  });
  const { startLat: _lat, startLng: _lng, ...summary } = round;
  return {
    ...summary,
    start,
    endDigester: end!,
    endLegM: previous ? Math.round(haversineM(previous, end!)) : 0,
    stops: withLegs,
  };
}

/** RFC 7946 FeatureCollection: the route as a LineString, a Point per stop and one for the end digester ([lng, lat]). */
export async function roundGeoJson(caller: Caller, id: number): Promise<string> {
  const sheet = await roundSheet(caller, id);
  const line: number[][] = [
    ...(sheet.start ? [[sheet.start.lng, sheet.start.lat]] : []),
    ...sheet.stops.map((s) => [s.lng, s.lat]),
    [sheet.endDigester.lng, sheet.endDigester.lat],
  ];
  const collection = {
    type: "FeatureCollection",
    features: [
      // RFC 7946 §3.1.4: a LineString has two or more positions; a round left with fewer has no route.
      ...(line.length >= 2
        ? [
            {
              type: "Feature",
              geometry: { type: "LineString", coordinates: line },
              properties: {
                kind: "route",
                roundId: sheet.id,
                forDate: sheet.forDate,
                volunteer: sheet.volunteerName,
                totalM: sheet.totalM,
              },
            },
          ]
        : []),
      ...sheet.stops.map((s) => ({
        type: "Feature",
        geometry: { type: "Point", coordinates: [s.lng, s.lat] },
        properties: {
          kind: "stop",
          seq: s.seq,
          household: s.householdName,
          address: s.addressText,
          buckets: s.bucketCount,
          status: s.status,
        },
      })),
      {
        type: "Feature",
        geometry: { type: "Point", coordinates: [sheet.endDigester.lng, sheet.endDigester.lat] },
        properties: { kind: "endDigester", name: sheet.endDigester.name, loadKg: sheet.loadKg },
      },
    ],
  };
  return JSON.stringify(collection);
}

/**
 * Marks a stop collected: creates a pending drop-off (buckets of 10 L at planning's 0.5 kg/L,
 * estimated mass, mixed scraps) at the round's end digester for the steward to accept, and marks
 * the request collected, in one transaction. A second call, a round of a later day or an end
 * digester now resting or offline is a 409.
 */
export async function markCollected(
  caller: Caller,
  roundId: number,
  requestId: number,
  now = new Date(),
): Promise<RoundSheet> {
  return sequelize().transaction(async (transaction) => {
    const round = await loadRound(caller, roundId, transaction, true);
    if (round.status === "cancelled") throw conflict("This round was cancelled.");
    const stop = await repo.lockStop(transaction, roundId, requestId);
    if (!stop) throw notFound("That stop on this round");
    if (stop.status === "collected") throw conflict("This stop is already marked collected.");
    if (stop.status !== "planned")
      throw new AppError(409, "not_collectable", `This request is ${stop.status}; it cannot be collected.`);
    if (round.forDate > localDate(now)) {
      throw new AppError(409, "not_yet", `This round is on ${round.forDate}; mark its stops collected on that day.`);
    }
    if (stop.endDigesterStatus !== "active") {
      throw new AppError(
        409,
        "end_digester_closed",
        `${round.endDigesterName} is ${stop.endDigesterStatus} now and takes no scraps; ask the coordinator to re-plan this round.`,
      );
    }
    const quantities = dropOffQuantities({
      bucketCount: stop.bucketCount,
      bucketLitres: DEFAULT_BUCKET_LITRES,
      kgPerLitre: COLLECTION_KG_PER_LITRE,
      mix: "mixed",
    });
    // The same pending drop-off a resident logs (defaults for what a collection does not ask: no citrus, no refuse check).
    const { id: dropOffId } = await insertDropOff(transaction, {
      householdId: stop.householdId,
      digesterId: round.endDigesterId,
      personId: caller.id,
      forDate: round.forDate,
      bucketCount: stop.bucketCount,
      bucketLitres: DEFAULT_BUCKET_LITRES,
      weightKg: null,
      massSource: quantities.massSource,
      freshKg: quantities.freshKg,
      kgVs: quantities.kgVs,
      mix: "mixed",
      citrusPercent: 0,
      noRefuseConfirmed: false,
      note: `Collected by cargo bike on round ${roundId}.`,
    });
    await repo.setStopDropOff(transaction, roundId, requestId, dropOffId);
    await repo.markRequestCollected(transaction, requestId);
    await repo.finishRoundIfDone(transaction, roundId);
    return roundSheet(caller, roundId, transaction);
  });
}
