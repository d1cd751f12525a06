/**
 * The leg network of one planning date: the stops that can be planned, the
 * haversine metres between every start, stop and digester with the caps of
 * {@link CollectionRoundsOptions} applied (a leg over its cap is Infinity),
 * and the costs every method shares.
 */
import { kg } from "../../units";
import { type LatLng, haversineM, isValidLatLng } from "../geo";
import {
  type CollectionRoundsInput,
  type CollectionRoundsOptions,
  type CollectionStop,
  DEFAULT_MAX_END_LEG_M,
  DEFAULT_MAX_LEG_M,
} from "./model";
import type { UnplacedStop, UnplacedStopReason } from "./result";

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
  /** The cap on the last leg in force, metres. */
  readonly maxEndLegM: number;
  readonly unplaced: UnplacedStop[];
  readonly messages: string[];
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
  const messages: string[] = [];
  const unplaced: UnplacedStop[] = [];
  const volunteers = input.volunteers.filter((v) => {
    const ok = isValidLatLng(v.lat, v.lng) && Number.isFinite(v.bikeLoadKg) && v.bikeLoadKg > 0;
    if (!ok) messages.push(`Volunteer ${v.id} has no valid start point or bike load; left out of the rounds.`);
    return ok;
  });
  const digesters = input.digesters.filter((d) => {
    const ok = isValidLatLng(d.lat, d.lng);
    if (!ok) messages.push(`Digester ${d.id} has no valid location; no round ends there.`);
    return ok;
  });
  const cleanInput: CollectionRoundsInput = { stops: input.stops, volunteers, digesters };
  const bikes = volunteers.map((v) => v.bikeLoadKg);
  const rooms = digesters.map((d) => (Number.isFinite(d.roomKg) ? Math.max(0, d.roomKg) : 0));
  const maxBikeKg = bikes.reduce((m, b) => Math.max(m, b), 0);
  const maxRoomKg = rooms.reduce((m, r) => Math.max(m, r), 0);
  if (volunteers.length === 0 && input.stops.length > 0)
    messages.push("No volunteer with a cargo bike is available for these collections.");
  const stopIdx: number[] = [];
  const drop = (s: CollectionStop, reason: UnplacedStopReason, message: string) =>
    unplaced.push({
      householdId: s.householdId,
      loadKg: kg(Number.isFinite(s.loadKg) ? Math.max(0, s.loadKg) : 0),
      reason,
      message,
    });
  input.stops.forEach((s, i) => {
    if (!isValidLatLng(s.lat, s.lng))
      drop(s, "noLocation", `Collection for ${s.householdId} has no location on the map; add one to plan it.`);
    else if (!Number.isFinite(s.loadKg) || s.loadKg < 0)
      drop(s, "invalidLoad", `Collection for ${s.householdId} has no valid load (${s.loadKg}).`);
    else if (volunteers.length === 0)
      drop(s, "noVolunteer", `No volunteer is available to collect from ${s.householdId}.`);
    else if (!volunteers.some((v) => v.bikeLoadKg + KG_EPS >= s.loadKg && haversineM(v, pos(s)) <= maxLegM))
      drop(
        s,
        s.loadKg > maxBikeKg + KG_EPS ? "heavierThanAnyBike" : "noVolunteer",
        s.loadKg > maxBikeKg + KG_EPS
          ? `Collection for ${s.householdId} (${round1(s.loadKg)} kg) is heavier than any cargo bike (largest ${round1(maxBikeKg)} kg); split it over two dates.`
          : `No volunteer whose bike carries ${round1(s.loadKg)} kg starts within ${round1(maxLegM / 1000)} km of ${s.householdId}.`,
      );
    else if (s.loadKg > maxBikeKg + KG_EPS)
      drop(
        s,
        "heavierThanAnyBike",
        `Collection for ${s.householdId} (${round1(s.loadKg)} kg) is heavier than any cargo bike (largest ${round1(maxBikeKg)} kg); split it over two dates.`,
      );
    else if (s.loadKg > maxRoomKg + KG_EPS)
      drop(
        s,
        "noDigesterWithRoom",
        `No digester has room for the ${round1(s.loadKg)} kg collected from ${s.householdId} on this date; collect it another day.`,
      );
    else if (!digesters.some((d, e) => rooms[e]! + KG_EPS >= s.loadKg && haversineM(pos(s), d) <= maxEndLegM))
      drop(
        s,
        "noDigesterWithinReach",
        `No digester with room for the ${round1(s.loadKg)} kg from ${s.householdId} is within ${round1(maxEndLegM / 1000)} km; collect it another day or ask a steward further away.`,
      );
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
    maxEndLegM,
    unplaced,
    messages,
  };
}

/** Rounds to 0.1 (kg or km in messages). */
export const round1 = (x: number) => Math.round(x * 10) / 10;

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
