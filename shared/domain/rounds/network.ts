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
} from "./model";
import type { CollectionPlanMessage, UnplacedStop } from "./result";

/** An unplaced stop's reason and parameters, without the stop's own fields. */
export type UnplacedReasonOf = UnplacedStop extends infer U
  ? U extends unknown
    ? Omit<U, "householdId" | "loadKg">
    : never
  : never;

/** Slack on kg comparisons, so that rounding never refuses a load that fits exactly. */
export const KG_EPS = 1e-9;

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
  const stopIdx: number[] = [];
  const drop = (s: CollectionStop, why: UnplacedReasonOf) =>
    unplaced.push({
      householdId: s.householdId,
      loadKg: kg(Number.isFinite(s.loadKg) ? Math.max(0, s.loadKg) : 0),
      ...why,
    });
  const heavier = { reason: "heavierThanAnyBike", largestBikeKg: kg(maxBikeKg) } as const;
  const noVolunteer = {
    reason: "noVolunteer",
    volunteersAvailable: volunteers.length,
    maxLegM: metres(maxLegM),
  } as const;
  input.stops.forEach((s, i) => {
    if (!isValidLatLng(s.lat, s.lng)) drop(s, { reason: "noLocation" });
    else if (!Number.isFinite(s.loadKg) || s.loadKg < 0) drop(s, { reason: "invalidLoad" });
    else if (volunteers.length === 0) drop(s, noVolunteer);
    else if (!volunteers.some((v) => v.bikeLoadKg + KG_EPS >= s.loadKg && haversineM(v, pos(s)) <= maxLegM))
      drop(s, s.loadKg > maxBikeKg + KG_EPS ? heavier : noVolunteer);
    else if (s.loadKg > maxBikeKg + KG_EPS) drop(s, heavier);
    else if (s.loadKg > maxRoomKg + KG_EPS)
      drop(s, {
        reason: "noDigesterWithRoom",
        takenByOtherRounds: false,
        largestRoomKg: kg(maxRoomKg),
        maxEndLegM: metres(maxEndLegM),
      });
    else if (!digesters.some((d, e) => rooms[e]! + KG_EPS >= s.loadKg && haversineM(pos(s), d) <= maxEndLegM))
      drop(s, { reason: "noDigesterWithinReach", maxLegM: metres(maxLegM), maxEndLegM: metres(maxEndLegM) });
    else stopIdx.push(i);
  });
  const n = stopIdx.length;
  const pts = stopIdx.map((i) => pos(input.stops[i]!));
  const dSS = new Float64Array(n * n);
  // Legs beyond the cap are never ridden: Infinity, like the last leg's cap below.
  const capped = (m: number) => (m <= maxLegM ? m : Infinity);
  for (let a = 0; a < n; a++)
    for (let b = a + 1; b < n; b++) dSS[a * n + b] = dSS[b * n + a] = capped(haversineM(pts[a]!, pts[b]!));
  const dVS = new Float64Array(volunteers.length * n);
  volunteers.forEach((v, k) => pts.forEach((p, a) => (dVS[k * n + a] = capped(haversineM(v, p)))));
  const E = digesters.length;
  const dSE = new Float64Array(n * E);
  // A digester beyond the cap is unreachable from that stop: every step below treats Infinity as "no end here".
  pts.forEach((p, a) =>
    digesters.forEach((d, e) => {
      const m = haversineM(p, d);
      dSE[a * E + e] = m <= maxEndLegM ? m : Infinity;
    }),
  );
  const load = Float64Array.from(stopIdx, (i) => input.stops[i]!.loadKg);
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

/** Round length with the nearest fitting volunteer and digester (rooms not shared); Infinity when none fits. */
export function routeCost(net: Network, seq: readonly number[], loadKg = loadOf(net, seq)): number {
  if (seq.length === 0) return 0;
  return startLeg(net, seq[0]!, loadKg) + pathM(net, seq) + endLeg(net, seq[seq.length - 1]!, loadKg);
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
