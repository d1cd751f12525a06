/**
 * The leg network of one planning date: the stops that can be planned, the
 * haversine metres between every start, stop and digester with the caps of
 * {@link CollectionRoundsOptions} applied (a leg over its cap is Infinity),
 * and the costs every method shares.
 */
import { kg, metres } from "../../units";
import { type LatLng, haversineM, isValidLatLng } from "../geo";
import {
  type CollectionRoundsInput,
  type CollectionRoundsOptions,
  type CollectionStop,
  DEFAULT_MAX_END_LEG_M,
  DEFAULT_MAX_LEG_M,
  KG_EPS,
} from "./model";
import { outOfReach } from "./reachability";
import type { CollectionPlanMessage, UnplacedStop } from "./result";

/** Each member of a union without the stop's own fields. */
type WithoutStop<U> = U extends unknown ? Omit<U, "householdId" | "loadKg"> : never;

/** An unplaced stop's reason and parameters, without the stop's own fields. */
export type UnplacedReasonOf = WithoutStop<UnplacedStop>;

/** The plannable stops and every leg between them, volunteers and digesters, with the caps applied. */
export interface Network {
  readonly input: CollectionRoundsInput;
  /** Input indices of the stops that can be planned. */
  readonly stopIdx: readonly number[];
  readonly load: Float64Array;
  /** Stop-to-stop metres, n × n. */
  readonly dSS: Float64Array;
  /** Volunteer-to-stop metres, V × n. */
  readonly dVS: Float64Array;
  /** Stop-to-digester metres, n × E. */
  readonly dSE: Float64Array;
  readonly bikes: readonly number[];
  readonly rooms: readonly number[];
  readonly maxBikeKg: number;
  readonly maxRoomKg: number;
  /** The caps in force, metres. */
  readonly maxLegM: number;
  readonly maxEndLegM: number;
  readonly unplaced: UnplacedStop[];
  readonly messages: CollectionPlanMessage[];
}

/** A stop's position (the caller has checked it is valid). */
const pos = (s: CollectionStop): LatLng => ({ lat: s.lat!, lng: s.lng! });

/**
 * Checks the input, lists the stops that cannot be planned with their
 * reason, and measures every leg of the rest (haversine metres; a leg over
 * its cap is Infinity, never ridden).
 */
export function prepareNetwork(
  input: CollectionRoundsInput,
  options: Pick<CollectionRoundsOptions, "maxEndLegM" | "maxLegM"> = {},
): Network {
  const positive = (x: number | undefined, fallback: number) =>
    x !== undefined && Number.isFinite(x) && x > 0 ? x : fallback;
  const maxEndLegM = positive(options.maxEndLegM, DEFAULT_MAX_END_LEG_M);
  const maxLegM = positive(options.maxLegM, DEFAULT_MAX_LEG_M);
  const messages: CollectionPlanMessage[] = [];
  const unplaced: UnplacedStop[] = [];
  const volunteers = input.volunteers.filter((v) => {
    const ok = isValidLatLng(v.lat, v.lng) && Number.isFinite(v.bikeLoadKg) && v.bikeLoadKg > 0;
    if (!ok) messages.push({ code: "volunteerLeftOut", volunteerId: v.id });
    return ok;
  });
  const digesters = input.digesters.filter((d) => {
    const ok = isValidLatLng(d.lat, d.lng);
    if (!ok) messages.push({ code: "digesterLeftOut", digesterId: d.id });
    return ok;
  });
  const cleanInput: CollectionRoundsInput = { stops: input.stops, volunteers, digesters };
  const bikes = volunteers.map((v) => v.bikeLoadKg);
  const rooms = digesters.map((d) => (Number.isFinite(d.roomKg) ? Math.max(0, d.roomKg) : 0));
  const maxBikeKg = bikes.reduce((m, b) => Math.max(m, b), 0);
  const maxRoomKg = rooms.reduce((m, r) => Math.max(m, r), 0);
  if (volunteers.length === 0 && input.stops.length > 0) messages.push({ code: "noVolunteers" });
  const drop = (s: CollectionStop, why: UnplacedReasonOf) =>
    unplaced.push({
      householdId: s.householdId,
      loadKg: kg(Number.isFinite(s.loadKg) ? Math.max(0, s.loadKg) : 0),
      ...why,
    });
  const noVolunteer = {
    reason: "noVolunteer",
    volunteersAvailable: volunteers.length,
    maxLegM: metres(maxLegM),
  } as const;
  const noDigester = {
    reason: "noDigesterWithinReach",
    maxLegM: metres(maxLegM),
    maxEndLegM: metres(maxEndLegM),
  } as const;
  // First what each stop shows by itself; then, for the rest, whether any chain of legs reaches it.
  const verdicts: (UnplacedReasonOf | null)[] = input.stops.map((s) => {
    if (!isValidLatLng(s.lat, s.lng)) return { reason: "noLocation" };
    if (!Number.isFinite(s.loadKg) || s.loadKg < 0) return { reason: "invalidLoad" };
    if (volunteers.length === 0) return noVolunteer;
    if (s.loadKg > maxBikeKg + KG_EPS) return { reason: "heavierThanAnyBike", largestBikeKg: kg(maxBikeKg) };
    if (s.loadKg > maxRoomKg + KG_EPS)
      return {
        reason: "noDigesterWithRoom",
        takenByOtherRounds: false,
        largestRoomKg: kg(maxRoomKg),
        maxEndLegM: metres(maxEndLegM),
      };
    return null;
  });
  const candidates = verdicts.flatMap((v, i) => (v === null ? [i] : []));
  const all = measureLegs(
    candidates.map((i) => pos(input.stops[i]!)),
    volunteers,
    digesters,
    maxLegM,
    maxEndLegM,
  );
  const allLoad = Float64Array.from(candidates, (i) => input.stops[i]!.loadKg);
  const reach = outOfReach({ ...all, load: allLoad, bikes, rooms });
  candidates.forEach((i, c) => {
    if (reach[c] === "noVolunteer") verdicts[i] = noVolunteer;
    else if (reach[c] === "noDigesterWithinReach") verdicts[i] = noDigester;
  });
  input.stops.forEach((s, i) => {
    const v = verdicts[i];
    if (v) drop(s, v);
  });
  const kept = candidates.flatMap((i, c) => (reach[c] === null ? [c] : []));
  const stopIdx = kept.map((c) => candidates[c]!);
  const { dSS, dVS, dSE } = keepStops(all, kept, candidates.length, volunteers.length, digesters.length);
  const load = Float64Array.from(kept, (c) => allLoad[c]!);
  return {
    input: cleanInput,
    stopIdx,
    load,
    dSS,
    dVS,
    dSE,
    bikes,
    rooms,
    maxBikeKg,
    maxRoomKg,
    maxLegM,
    maxEndLegM,
    unplaced,
    messages,
  };
}

/**
 * Haversine metres between every start, stop and digester, n stops: a start
 * or stop-to-stop leg over `maxLegM`, or a last leg over `maxEndLegM`, is
 * Infinity (never ridden).
 */
function measureLegs(
  pts: readonly LatLng[],
  volunteers: readonly LatLng[],
  digesters: readonly LatLng[],
  maxLegM: number,
  maxEndLegM: number,
): { dSS: Float64Array; dVS: Float64Array; dSE: Float64Array } {
  const n = pts.length;
  const dSS = new Float64Array(n * n);
  // Legs beyond the cap are never ridden: Infinity, like the last leg's cap below.
  const capped = (m: number) => (m <= maxLegM ? m : Infinity);
  for (let a = 0; a < n; a++)
    for (let b = a + 1; b < n; b++) dSS[a * n + b] = dSS[b * n + a] = capped(haversineM(pts[a]!, pts[b]!));
  const dVS = new Float64Array(volunteers.length * n);
  volunteers.forEach((v, k) => pts.forEach((p, a) => (dVS[k * n + a] = capped(haversineM(v, p)))));
  const E = digesters.length;
  const dSE = new Float64Array(n * E);
  // A digester beyond the cap is unreachable from that stop: every step treats Infinity as "no end here".
  pts.forEach((p, a) =>
    digesters.forEach((d, e) => {
      const m = haversineM(p, d);
      dSE[a * E + e] = m <= maxEndLegM ? m : Infinity;
    }),
  );
  return { dSS, dVS, dSE };
}

/** The legs among the `kept` stops (indices into the n measured), in that order. */
function keepStops(
  all: { dSS: Float64Array; dVS: Float64Array; dSE: Float64Array },
  kept: readonly number[],
  n: number,
  V: number,
  E: number,
): { dSS: Float64Array; dVS: Float64Array; dSE: Float64Array } {
  const m = kept.length;
  const dSS = new Float64Array(m * m);
  for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) dSS[a * m + b] = all.dSS[kept[a]! * n + kept[b]!]!;
  const dVS = new Float64Array(V * m);
  for (let k = 0; k < V; k++) for (let a = 0; a < m; a++) dVS[k * m + a] = all.dVS[k * n + kept[a]!]!;
  const dSE = new Float64Array(m * E);
  for (let a = 0; a < m; a++) for (let e = 0; e < E; e++) dSE[a * E + e] = all.dSE[kept[a]! * E + e]!;
  return { dSS, dVS, dSE };
}

/** Nearest start of a volunteer whose bike carries `loadKg` to stop a; Infinity if none. */
export function startLeg(net: Network, a: number, loadKg: number): number {
  const n = net.stopIdx.length;
  let best = Infinity;
  net.bikes.forEach((b, k) => {
    if (b + KG_EPS >= loadKg) best = Math.min(best, net.dVS[k * n + a]!);
  });
  return best;
}

/** Nearest digester with room for `loadKg` from stop a (rooms not shared yet); Infinity if none. */
export function endLeg(net: Network, a: number, loadKg: number): number {
  const E = net.rooms.length;
  let best = Infinity;
  net.rooms.forEach((r, e) => {
    if (r + KG_EPS >= loadKg) best = Math.min(best, net.dSE[a * E + e]!);
  });
  return best;
}

/** Length of the stop-to-stop part of a round, metres (Infinity when a leg is over the cap). */
export function pathM(net: Network, seq: readonly number[]): number {
  const n = net.stopIdx.length;
  let s = 0;
  for (let k = 1; k < seq.length; k++) s += net.dSS[seq[k - 1]! * n + seq[k]!]!;
  return s;
}

/** Load of a round, kg. */
export const loadOf = (net: Network, seq: readonly number[]) => seq.reduce((s, a) => s + net.load[a]!, 0);

/**
 * What the construction counts for a start or last leg that does not exist
 * (no start, or no digester, within its cap), metres: more than any plan's
 * length (10⁵ km), so that a join giving a stop its missing leg always pays.
 */
export const MISSING_LEG_PENALTY_M = 1e8;

/** A start or last leg for the construction: the leg, or {@link MISSING_LEG_PENALTY_M} when there is none. */
export const softLegM = (m: number) => (m === Infinity ? MISSING_LEG_PENALTY_M : m);

/**
 * Round length for the construction, with the nearest volunteer whose bike
 * carries `loadKg` and the nearest digester with room for it (rooms not
 * shared yet), metres. A missing start or last leg counts
 * {@link MISSING_LEG_PENALTY_M} instead of Infinity, so rounds still waiting
 * for a neighbour can be compared and joined; a stop-to-stop leg over the
 * cap stays Infinity.
 */
export function constructionCost(net: Network, seq: readonly number[], loadKg = loadOf(net, seq)): number {
  if (seq.length === 0) return 0;
  return (
    softLegM(startLeg(net, seq[0]!, loadKg)) + pathM(net, seq) + softLegM(endLeg(net, seq[seq.length - 1]!, loadKg))
  );
}

/** A round as stop indices in riding order and the index of the digester it ends at. */
export interface Ended {
  seq: number[];
  digester: number;
}

/** Round length with its end fixed at `digester` and the nearest fitting volunteer, metres; Infinity when none fits. */
export function fixedEndCost(net: Network, seq: readonly number[], digester: number): number {
  const E = net.rooms.length;
  return startLeg(net, seq[0]!, loadOf(net, seq)) + pathM(net, seq) + net.dSE[seq[seq.length - 1]! * E + digester]!;
}

/** Room left per digester after the given rounds, kg. */
export function roomsLeft(net: Network, ended: readonly Ended[]): number[] {
  const left = [...net.rooms];
  for (const r of ended) left[r.digester] = left[r.digester]! - loadOf(net, r.seq);
  return left;
}
