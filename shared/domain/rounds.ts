/**
 * Collection rounds for volunteers with cargo bikes (PRODUCT.md §6).
 *
 * Model. Stops (households that asked for a collection) each carry a load
 * in kg. A round starts at a volunteer's start point, visits some stops and
 * ends at a digester, which must have room for the round's load; rooms are
 * shared by all rounds ending there. A round's load must fit the bike of the
 * volunteer who rides it. A volunteer may ride several rounds, each from
 * their start point (they go home in between; the way home is not counted).
 * Length = start → first stop → … → last stop → digester, straight-line
 * haversine metres (streets add a detour the model does not know).
 *
 * Method (a heuristic, checked against {@link exactCollectionRounds} in the
 * tests):
 * 1. Savings construction with capacity [Clarke & Wright 1964, "Scheduling
 *    of vehicles from a central depot to a number of delivery points",
 *    Operations Research 12(4):568–581, memory], generalised to open routes
 *    with many origins and ends: joining a route ending at i to one starting
 *    at j saves end(i) + start(j) − λ·d(i, j), where start/end are the
 *    nearest volunteer start / digester; λ is the shape parameter of the
 *    parametric savings [Yellow 1970, Oper. Res. Q. 21:281, memory]. A join
 *    is made only if the true cost falls and the load fits some bike.
 *    Each round is then ordered by 2-opt [Croes 1958, "A method for solving
 *    traveling-salesman problems", Operations Research 6(6):791–812, memory].
 * 2. Ends: rounds are given digesters by regret [Martello & Toth 1981,
 *    memory] so that no digester receives more than its room; stops no
 *    digester can take are re-inserted where room is left, or reported.
 * 3. Local search across rounds with shared rooms (relocate, swap, or-opt,
 *    2-opt*, split; 2-opt inside rounds) and ruin-and-recreate iterations,
 *    seeded so the plan is reproducible.
 * 4. Each round gets the nearest volunteer whose bike fits.
 * Several λ are tried and the shortest plan kept. Measured against the
 * exact optimum on random 1–9-stop cases: see tests/shared/rounds.test.ts.
 */
import { type Kg, type Metres, kg, metres } from "../units";
import { type LatLng, haversineM, isValidLatLng } from "./geo";

/** A household that asked for a collection on the date planned. */
export interface CollectionStop {
  readonly householdId: string;
  readonly lat: number | null;
  readonly lng: number | null;
  /** Load to collect, kg (buckets × kg per bucket, computed by the caller). */
  readonly loadKg: number;
}

/** A volunteer with a cargo bike. */
export interface CollectionVolunteer {
  readonly id: string;
  /** Where the volunteer's rounds start. */
  readonly lat: number;
  readonly lng: number;
  /** Most the cargo bike may carry, kg. */
  readonly bikeLoadKg: number;
}

/** A digester a round may end at. */
export interface CollectionDigester {
  readonly id: string;
  readonly lat: number;
  readonly lng: number;
  /** Scraps it may still take on the collection date, kg (from its feed budget). */
  readonly roomKg: number;
}

/** Input of {@link planCollectionRounds}, {@link exactCollectionRounds} and {@link collectionRoundsLowerBoundM}. */
export interface CollectionRoundsInput {
  readonly stops: readonly CollectionStop[];
  readonly volunteers: readonly CollectionVolunteer[];
  readonly digesters: readonly CollectionDigester[];
}

/** Tuning of {@link planCollectionRounds}; the defaults suit the product. */
export interface CollectionRoundsOptions {
  /** Savings shape parameters λ to try; default [1, 0.6, 1.4]. */
  readonly savingsShapes?: readonly number[];
  /**
   * Randomised restarts for benchmarking: multiplies each saving by
   * (1 + noise·(u − 0.5)), u from a seeded generator. Default none.
   */
  readonly perturbation?: { readonly seed: number; readonly noise: number };
  /** Ruin-and-recreate iterations after construction; default {@link defaultImprovementIterations}. */
  readonly improvementIterations?: number;
  /**
   * Longest ride from a round's last stop to the digester it ends at,
   * metres; a digester further away is not used. Default
   * {@link DEFAULT_MAX_END_LEG_M}.
   */
  readonly maxEndLegM?: number;
  /**
   * Longest ride from a volunteer's start to a first stop, or between two
   * stops, metres; longer legs are never ridden. Default
   * {@link DEFAULT_MAX_LEG_M}.
   */
  readonly maxLegM?: number;
}

/**
 * Default cap on the other legs of a round, metres [judgement: the same
 * neighbourhood scale as {@link DEFAULT_MAX_END_LEG_M}; stops further apart
 * belong to different rounds, or to another day].
 */
export const DEFAULT_MAX_LEG_M = 5000;

/**
 * Default cap on the ride from the last stop to the digester, metres
 * [judgement: with a loaded cargo bike, more than about 5 km after the last
 * stop is longer than a whole neighbourhood round; such a collection is
 * better moved to another day than ridden across town].
 */
export const DEFAULT_MAX_END_LEG_M = 5000;

/** One stop of a round, in riding order. */
export interface RoundStop {
  readonly householdId: string;
  readonly loadKg: Kg;
  readonly lat: number;
  readonly lng: number;
  /** Distance from the previous point (start or stop), metres. */
  readonly legM: Metres;
}

/** One round: a volunteer, stops in order, the digester it ends at; lengths in haversine metres. */
export interface CollectionRound {
  readonly volunteerId: string;
  readonly stops: readonly RoundStop[];
  readonly endDigesterId: string;
  readonly loadKg: Kg;
  /** Start → stops → digester, metres. */
  readonly lengthM: Metres;
  readonly endLegM: Metres;
}

/** Why a stop could not be planned. */
export type UnplacedStopReason =
  "noLocation" | "invalidLoad" | "heavierThanAnyBike" | "noDigesterWithRoom" | "noDigesterWithinReach" | "noVolunteer";

/** A stop left out of every round, with the reason and a sentence for the coordinator. */
export interface UnplacedStop {
  readonly householdId: string;
  readonly loadKg: Kg;
  readonly reason: UnplacedStopReason;
  readonly message: string;
}

/** The rounds for one date, what could not be planned, and the load delivered to each digester. */
export interface CollectionPlan {
  readonly rounds: readonly CollectionRound[];
  readonly unplacedStops: readonly UnplacedStop[];
  readonly totalLengthM: Metres;
  /** Load delivered to each digester across rounds, against its room. */
  readonly digesterLoads: readonly { readonly digesterId: string; readonly loadKg: Kg; readonly roomKg: Kg }[];
  readonly messages: readonly string[];
}

const KG_EPS = 1e-9;

/**
 * Ruin-and-recreate iterations by default: 100 up to 60 stops, then fewer
 * as each iteration's local search grows about with the square of the
 * stops, never below 20 [judgement: on random 7–9-stop cases fewer than
 * about 80 left some plans several % above the optimum; on the 60-stop
 * benchmark 20 iterations left the plan 5.7 % longer than 100 did, which
 * cost about 1 s more].
 */
export function defaultImprovementIterations(stops: number): number {
  return stops <= 60 ? 100 : Math.max(20, Math.round(100 * (60 / stops) ** 2));
}

/* ------------------------------------------------------------------ */
/* Shared preparation                                                  */
/* ------------------------------------------------------------------ */

interface Network {
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

const pos = (s: CollectionStop): LatLng => ({ lat: s.lat!, lng: s.lng! });

function prepareNetwork(
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

const round1 = (x: number) => Math.round(x * 10) / 10;

/** Nearest start of a volunteer whose bike carries `loadKg` to stop a; Infinity if none. */
function startLeg(net: Network, a: number, loadKg: number): number {
  const n = net.stopIdx.length;
  let best = Infinity;
  net.bikes.forEach((b, k) => {
    if (b + KG_EPS >= loadKg) best = Math.min(best, net.dVS[k * n + a]!);
  });
  return best;
}

/** Nearest digester with room for `loadKg` from stop a (rooms not shared yet); Infinity if none. */
function endLeg(net: Network, a: number, loadKg: number): number {
  const E = net.rooms.length;
  let best = Infinity;
  net.rooms.forEach((r, e) => {
    if (r + KG_EPS >= loadKg) best = Math.min(best, net.dSE[a * E + e]!);
  });
  return best;
}

function pathM(net: Network, seq: readonly number[]): number {
  const n = net.stopIdx.length;
  let s = 0;
  for (let k = 1; k < seq.length; k++) s += net.dSS[seq[k - 1]! * n + seq[k]!]!;
  return s;
}

const loadOf = (net: Network, seq: readonly number[]) => seq.reduce((s, a) => s + net.load[a]!, 0);

/** Round length with the nearest fitting volunteer and digester (rooms not shared); Infinity when none fits. */
function routeCost(net: Network, seq: readonly number[], loadKg = loadOf(net, seq)): number {
  if (seq.length === 0) return 0;
  return startLeg(net, seq[0]!, loadKg) + pathM(net, seq) + endLeg(net, seq[seq.length - 1]!, loadKg);
}

/* ------------------------------------------------------------------ */
/* Heuristic                                                           */
/* ------------------------------------------------------------------ */

function mulberry32(seed: number): () => number {
  let a = seed | 0;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Parametric savings construction; returns routes as stop-index sequences. */
function savings(net: Network, lambda: number, noise: (() => number) | null): number[][] {
  const n = net.stopIdx.length;
  const routeOf = new Int32Array(n);
  const routes: (number[] | null)[] = [];
  for (let a = 0; a < n; a++) {
    routeOf[a] = a;
    routes.push([a]);
  }
  const single = Array.from({ length: n }, (_, a) => ({ s: startLeg(net, a, 0), e: endLeg(net, a, 0) }));
  const list: { i: number; j: number; s: number }[] = [];
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      let s = single[i]!.e + single[j]!.s - lambda * net.dSS[i * n + j]!;
      if (noise) s *= 1 + noise();
      if (s > 0) list.push({ i, j, s });
    }
  list.sort((x, y) => y.s - x.s || x.i - y.i || x.j - y.j);
  for (const { i, j } of list) {
    const ra = routeOf[i]!;
    const rb = routeOf[j]!;
    if (ra === rb) continue;
    const A = routes[ra]!;
    const B = routes[rb]!;
    const iAtTail = A[A.length - 1] === i;
    const iAtHead = A[0] === i;
    const jAtHead = B[0] === j;
    const jAtTail = B[B.length - 1] === j;
    if (!(iAtTail || iAtHead) || !(jAtHead || jAtTail)) continue;
    const loadKg = loadOf(net, A) + loadOf(net, B);
    if (loadKg > net.maxBikeKg + KG_EPS) continue;
    const a = iAtTail ? A : [...A].reverse();
    const b = jAtHead ? B : [...B].reverse();
    const merged = [...a, ...b];
    const reversed = [...merged].reverse();
    const c1 = routeCost(net, merged, loadKg);
    const c2 = routeCost(net, reversed, loadKg);
    const best = c1 <= c2 ? merged : reversed;
    if (Math.min(c1, c2) < routeCost(net, A) + routeCost(net, B) - 1e-9) {
      routes[ra] = best;
      routes[rb] = null;
      for (const x of best) routeOf[x] = ra;
    }
  }
  return routes.filter((r): r is number[] => r !== null);
}

/** 2-opt on one round (segment reversals, whole-round reversal included), first improvement until none. */
function twoOpt(net: Network, seq: number[], cost: (s: readonly number[]) => number): number[] {
  let best = seq;
  let bestCost = cost(best);
  let improved = true;
  while (improved) {
    improved = false;
    for (let i = 0; i < best.length - 1 && !improved; i++) {
      for (let j = i + 1; j < best.length && !improved; j++) {
        const cand = [...best.slice(0, i), ...best.slice(i, j + 1).reverse(), ...best.slice(j + 1)];
        const c = cost(cand);
        if (c < bestCost - 1e-9) {
          best = cand;
          bestCost = c;
          improved = true;
        }
      }
    }
  }
  return best;
}

interface Ended {
  seq: number[];
  digester: number;
}

/**
 * Gives each round a digester with room left, by regret: repeatedly the
 * round whose best and second-best feasible ends differ most is served
 * first (a round with a single option first of all). A round no digester
 * can take sets its heaviest stops aside (into `leftovers`) until one can.
 */
function assignEnds(net: Network, routes: number[][], leftovers: number[]): Ended[] {
  const E = net.rooms.length;
  const left = [...net.rooms];
  const pending = routes.map((r) => [...r]);
  const out: Ended[] = [];
  while (pending.length > 0) {
    let pick = -1;
    let pickE = -1;
    let pickRegret = -Infinity;
    for (let k = 0; k < pending.length; k++) {
      const seq = pending[k]!;
      const last = seq[seq.length - 1]!;
      const loadKg = loadOf(net, seq);
      let b1 = Infinity;
      let b2 = Infinity;
      let e1 = -1;
      for (let e = 0; e < E; e++) {
        if (left[e]! + KG_EPS < loadKg) continue;
        const c = net.dSE[last * E + e]!;
        if (c < b1) {
          b2 = b1;
          b1 = c;
          e1 = e;
        } else if (c < b2) b2 = c;
      }
      const regret = e1 < 0 ? Infinity : b2 - b1;
      if (regret > pickRegret) {
        pickRegret = regret;
        pick = k;
        pickE = e1;
      }
    }
    const seq = pending[pick]!;
    if (pickE < 0) {
      // Nothing can take this round whole: set its heaviest stop aside (re-inserted later if any room is left).
      let heaviest = 0;
      seq.forEach((a, p) => {
        if (net.load[a]! > net.load[seq[heaviest]!]!) heaviest = p;
      });
      leftovers.push(seq[heaviest]!);
      seq.splice(heaviest, 1);
      if (seq.length === 0) pending.splice(pick, 1);
      continue;
    }
    pending.splice(pick, 1);
    left[pickE] = left[pickE]! - loadOf(net, seq);
    out.push({ seq, digester: pickE });
  }
  return out;
}

/** Final 2-opt with the end fixed at the round's digester. */
function fixedEndCost(net: Network, seq: readonly number[], digester: number): number {
  const E = net.rooms.length;
  return startLeg(net, seq[0]!, loadOf(net, seq)) + pathM(net, seq) + net.dSE[seq[seq.length - 1]! * E + digester]!;
}

/** Room left per digester after the given rounds. */
function roomsLeft(net: Network, ended: readonly Ended[]): number[] {
  const left = [...net.rooms];
  for (const r of ended) left[r.digester] = left[r.digester]! - loadOf(net, r.seq);
  return left;
}

/**
 * Puts set-aside stops back: cheapest insertion into a round whose bike and
 * digester still have room, else a new one-stop round to a digester with
 * room left; what still fits nowhere is returned (really no room).
 */
function insertLeftovers(net: Network, ended: Ended[], leftovers: readonly number[]): number[] {
  const E = net.rooms.length;
  const dropped: number[] = [];
  for (const a of leftovers) {
    const w = net.load[a]!;
    const left = roomsLeft(net, ended);
    let best = Infinity;
    let apply: (() => void) | null = null;
    ended.forEach((r, k) => {
      if (left[r.digester]! + KG_EPS < w || loadOf(net, r.seq) + w > net.maxBikeKg + KG_EPS) return;
      const before = fixedEndCost(net, r.seq, r.digester);
      for (let q = 0; q <= r.seq.length; q++) {
        const seq = [...r.seq.slice(0, q), a, ...r.seq.slice(q)];
        const delta = fixedEndCost(net, seq, r.digester) - before;
        if (delta < best) {
          best = delta;
          apply = () => (ended[k] = { seq, digester: r.digester });
        }
      }
    });
    for (let e = 0; e < E; e++) {
      if (left[e]! + KG_EPS < w) continue;
      const c = fixedEndCost(net, [a], e);
      if (c < best) {
        best = c;
        apply = () => ended.push({ seq: [a], digester: e });
      }
    }
    if (apply && best < Infinity) (apply as () => void)();
    else dropped.push(a);
  }
  return dropped;
}

/** Nearest digester from stop `last` whose spare room (after `taken`) takes `loadKg`; −1 when none. */
function bestEnd(
  net: Network,
  last: number,
  loadKg: number,
  spare: (e: number) => number,
  takenE = -1,
  takenKg = 0,
): { e: number; m: number } {
  const E = net.rooms.length;
  let e = -1;
  let m = Infinity;
  for (let k = 0; k < E; k++) {
    if (spare(k) - (k === takenE ? takenKg : 0) + KG_EPS < loadKg) continue;
    const d = net.dSE[last * E + k]!;
    if (d < m) {
      m = d;
      e = k;
    }
  }
  return { e, m };
}

/**
 * Best joint ends for one or two changed rounds, given the spare room the
 * other rounds leave: when both want the same digester and it cannot take
 * both, both orders of choosing are tried and the shorter kept. Returns the
 * total length and the digesters chosen (−1 for an empty round); Infinity
 * when a round fits no bike or no digester.
 */
function endPair(
  net: Network,
  seqs: readonly (readonly number[])[],
  spare: (e: number) => number,
): { cost: number; ends: number[] } {
  const parts = seqs.map((seq) => {
    if (seq.length === 0) return null;
    const load = loadOf(net, seq);
    return {
      load,
      head: load > net.maxBikeKg + KG_EPS ? Infinity : startLeg(net, seq[0]!, load) + pathM(net, seq),
      last: seq[seq.length - 1]!,
    };
  });
  const ends = seqs.map(() => -1);
  let cost = 0;
  const chosen: { e: number; m: number }[] = [];
  parts.forEach((p, k) => {
    if (!p) return;
    const end = bestEnd(net, p.last, p.load, spare);
    chosen[k] = end;
    ends[k] = end.e;
    cost += p.head + (end.e < 0 ? Infinity : end.m);
  });
  const [p0, p1] = parts;
  if (seqs.length < 2 || !p0 || !p1 || ends[0]! < 0 || ends[1]! < 0 || ends[0] !== ends[1]) return { cost, ends };
  const e = ends[0]!;
  if (spare(e) + KG_EPS >= p0.load + p1.load) return { cost, ends };
  // Both want e and it cannot take both: one keeps it, the other takes its next best.
  const alt1 = bestEnd(net, p1.last, p1.load, spare, e, p0.load);
  const alt0 = bestEnd(net, p0.last, p0.load, spare, e, p1.load);
  const c1 = p0.head + chosen[0]!.m + p1.head + (alt1.e < 0 ? Infinity : alt1.m);
  const c0 = p0.head + (alt0.e < 0 ? Infinity : alt0.m) + p1.head + chosen[1]!.m;
  return c1 <= c0 ? { cost: c1, ends: [e, alt1.e] } : { cost: c0, ends: [alt0.e, e] };
}

/**
 * Local search with rooms shared across rounds. Moves: relocate or swap
 * stops between rounds, move segments of 2–3 stops (or-opt [Or 1976, PhD
 * thesis, Northwestern Univ., memory]), exchange tails (2-opt* [Potvin &
 * Rousseau 1995, J. Oper. Res. Soc. 46:1433, memory]; also joins two
 * rounds), split a round in two; after each candidate move the changed
 * rounds pick their digesters again from the room the others leave, and
 * 2-opt runs inside rounds after each accepted move. Bike loads and rooms
 * hold after every move; best improvement until none.
 */
function endAwareSearch(net: Network, start: Ended[]): Ended[] {
  const n = net.stopIdx.length;
  const near = neighbours(net);
  let rs = start.map((r) => ({ seq: [...r.seq], digester: r.digester }));
  const lengthOf = (r: Ended) => fixedEndCost(net, r.seq, r.digester);
  for (let guard = 0; guard < 500; guard++) {
    const costs = rs.map(lengthOf);
    const loads = rs.map((r) => loadOf(net, r.seq));
    const left = roomsLeft(net, rs);
    const routeOf = new Int32Array(n).fill(-1);
    const posOf = new Int32Array(n);
    rs.forEach((r, k) =>
      r.seq.forEach((a, p) => {
        routeOf[a] = k;
        posOf[a] = p;
      }),
    );
    let bestDelta = -1e-9;
    let apply: (() => void) | null = null;
    /** Evaluates replacing rounds `idx` by `seqs` (a new round where idx is −1). */
    const consider = (idx: readonly number[], seqs: readonly (readonly number[])[]) => {
      const k0 = idx[0]!;
      const k1 = idx.length > 1 ? idx[1]! : -1;
      const e0 = k0 >= 0 ? rs[k0]!.digester : -1;
      const e1 = k1 >= 0 ? rs[k1]!.digester : -1;
      const before = (k0 >= 0 ? costs[k0]! : 0) + (k1 >= 0 ? costs[k1]! : 0);
      const spare = (e: number) => left[e]! + (e === e0 ? loads[k0]! : 0) + (e === e1 ? loads[k1]! : 0);
      const after = endPair(net, seqs, spare);
      const delta = after.cost - before;
      if (delta < bestDelta) {
        bestDelta = delta;
        apply = () => {
          idx.forEach((k, m) => {
            const r = { seq: [...seqs[m]!], digester: after.ends[m]! };
            if (k < 0) rs.push(r);
            else rs[k] = r;
          });
        };
      }
    };
    for (let a = 0; a < rs.length; a++) {
      const A = rs[a]!.seq;
      consider([a], [A]);
      // Relocate / or-opt: a segment goes next to one of its ends' near neighbours in another round.
      for (let len = 1; len <= 3; len++) {
        for (let p = 0; p + len <= A.length; p++) {
          const seg = A.slice(p, p + len);
          const without = [...A.slice(0, p), ...A.slice(p + len)];
          const w = loadOf(net, seg);
          const tried = new Set<number>();
          for (const end of [seg[0]!, seg[len - 1]!]) {
            for (const nb of near[end]!) {
              const b = routeOf[nb]!;
              if (b === a || b < 0 || loads[b]! + w > net.maxBikeKg + KG_EPS) continue;
              const B = rs[b]!.seq;
              for (const q of [posOf[nb]!, posOf[nb]! + 1]) {
                if (tried.has(b * 1000 + q)) continue;
                tried.add(b * 1000 + q);
                for (const piece of len === 1 ? [seg] : [seg, [...seg].reverse()]) {
                  consider([a, b], [without, [...B.slice(0, q), ...piece, ...B.slice(q)]]);
                }
              }
            }
          }
          // …or becomes a round of its own.
          if (without.length > 0) consider([a, -1], [without, seg]);
        }
      }
      // Swap two stops of different rounds when one is near the other.
      for (let p = 0; p < A.length; p++) {
        for (const nb of near[A[p]!]!) {
          const b = routeOf[nb]!;
          if (b <= a) continue;
          const B = rs[b]!.seq;
          const q = posOf[nb]!;
          consider([a, b], [A.map((x, i) => (i === p ? B[q]! : x)), B.map((x, i) => (i === q ? A[p]! : x))]);
        }
      }
      // Tail exchange (2-opt*): the new edge A[i−1] → B[j] joins near neighbours; also joins whole rounds.
      for (let b = 0; b < rs.length; b++) {
        if (b === a) continue;
        const B = rs[b]!.seq;
        for (let i = 0; i <= A.length; i++) {
          for (let j = 0; j <= B.length; j++) {
            if ((i === 0 && j === 0) || (i === A.length && j === B.length)) continue;
            const joinsNear = i === 0 || j === B.length || near[A[i - 1]!]!.includes(B[j]!);
            if (!joinsNear) continue;
            consider(
              [a, b],
              [
                [...A.slice(0, i), ...B.slice(j)],
                [...B.slice(0, j), ...A.slice(i)],
              ],
            );
          }
        }
      }
      for (let i = 1; i < A.length; i++) consider([a, -1], [A.slice(0, i), A.slice(i)]);
    }
    if (!apply) break;
    (apply as () => void)();
    rs = rs.filter((r) => r.seq.length > 0 && r.digester >= 0);
    // Re-optimise each round's order and end in turn, each against the room the others leave.
    const spare = roomsLeft(net, rs);
    rs = rs.map((r) => {
      const own = loadOf(net, r.seq);
      spare[r.digester] = spare[r.digester]! + own;
      const room = (e: number) => spare[e]!;
      const seq = twoOpt(net, r.seq, (sq) => endPair(net, [sq], room).cost);
      const e = endPair(net, [seq], room).ends[0]!;
      spare[e] = spare[e]! - own;
      return { seq, digester: e };
    });
  }
  return rs;
}

/** Granular neighbourhoods: each stop's nearest stops [Toth & Vigo 2003, INFORMS J. Comput. 15:333, memory]. */
const NEAR_STOPS = 10;
const neighbourCache = new WeakMap<Network, number[][]>();
function neighbours(net: Network): number[][] {
  let lists = neighbourCache.get(net);
  if (!lists) {
    const n = net.stopIdx.length;
    lists = Array.from({ length: n }, (_, a) =>
      Array.from({ length: n }, (_, b) => b)
        .filter((b) => b !== a)
        .sort((x, y) => net.dSS[a * n + x]! - net.dSS[a * n + y]! || x - y)
        .slice(0, NEAR_STOPS),
    );
    neighbourCache.set(net, lists);
  }
  return lists;
}

/**
 * Ruin and recreate [Schrimpf, Schneider, Stamm-Wilbrandt & Dueck 2000,
 * J. Comput. Phys. 159:139, memory]: take out a few stops (near a random
 * one, or at random), put them back by cheapest feasible insertion, run the
 * local search; keep the best plan seen. Seeded, so reproducible.
 */
function ruinAndRecreate(
  net: Network,
  start: Ended[],
  dropped: number[],
  iterations: number,
  seed: number,
): { ended: Ended[]; dropped: number[] } {
  const n = net.stopIdx.length;
  const rng = mulberry32(seed);
  const total = (rs: readonly Ended[]) => rs.reduce((s, r) => s + fixedEndCost(net, r.seq, r.digester), 0);
  let best = start;
  let bestDropped = dropped;
  let bestLen = total(best);
  let cur = best;
  let curDropped = bestDropped;
  let curLen = bestLen;
  for (let it = 0; it < iterations && n > 1; it++) {
    const size = Math.min(n, 2 + Math.floor(rng() * Math.max(1, Math.ceil(n / 3))));
    let out: number[];
    if (rng() < 0.5) {
      const centre = Math.floor(rng() * n);
      out = Array.from({ length: n }, (_, a) => a)
        .sort((x, y) => net.dSS[centre * n + x]! - net.dSS[centre * n + y]! || x - y)
        .slice(0, size);
    } else {
      out = Array.from({ length: n }, (_, a) => a)
        .map((a) => ({ a, r: rng() }))
        .sort((x, y) => x.r - y.r)
        .slice(0, size)
        .map((x) => x.a);
    }
    const gone = new Set(out);
    const kept: Ended[] = cur
      .map((r) => ({ seq: r.seq.filter((a) => !gone.has(a)), digester: r.digester }))
      .filter((r) => r.seq.length > 0);
    const order = [...new Set([...out, ...curDropped])]
      .map((a) => ({ a, r: rng() }))
      .sort((x, y) => x.r - y.r)
      .map((x) => x.a);
    const stillDropped = insertLeftovers(net, kept, order);
    const searched = endAwareSearch(net, kept);
    const len = total(searched);
    // Threshold accepting [Dueck & Scheuer 1990, J. Comput. Phys. 90:161, memory]: a slightly longer plan may be kept for a while.
    const threshold = 0.02 * bestLen * (1 - it / iterations);
    if (
      stillDropped.length < curDropped.length ||
      (stillDropped.length === curDropped.length && len < curLen + threshold)
    ) {
      cur = searched;
      curDropped = stillDropped;
      curLen = len;
    }
    if (
      stillDropped.length < bestDropped.length ||
      (stillDropped.length === bestDropped.length && len < bestLen - 1e-9)
    ) {
      best = searched;
      bestDropped = stillDropped;
      bestLen = len;
    }
  }
  return { ended: best, dropped: bestDropped };
}

function buildPlan(net: Network, ended: Ended[], dropped: number[]): CollectionPlan {
  const n = net.stopIdx.length;
  const E = net.rooms.length;
  const { volunteers, digesters, stops } = net.input;
  const unplaced = [...net.unplaced];
  for (const a of dropped) {
    const s = stops[net.stopIdx[a]!]!;
    unplaced.push({
      householdId: s.householdId,
      loadKg: kg(s.loadKg),
      reason: "noDigesterWithRoom",
      message: `The room of the digesters within ${round1(net.maxEndLegM / 1000)} km is used by other rounds on this date; the ${round1(s.loadKg)} kg from ${s.householdId} should be collected another day.`,
    });
  }
  const delivered = new Float64Array(E);
  const rounds: CollectionRound[] = ended.map(({ seq, digester }) => {
    const loadKg = loadOf(net, seq);
    let v = -1;
    net.bikes.forEach((b, k) => {
      if (b + KG_EPS >= loadKg && (v < 0 || net.dVS[k * n + seq[0]!]! < net.dVS[v * n + seq[0]!]!)) v = k;
    });
    const roundStops: RoundStop[] = seq.map((a, k) => {
      const s = stops[net.stopIdx[a]!]!;
      const legM = k === 0 ? net.dVS[v * n + a]! : net.dSS[seq[k - 1]! * n + a]!;
      return { householdId: s.householdId, loadKg: kg(s.loadKg), lat: s.lat!, lng: s.lng!, legM: metres(legM) };
    });
    const endLegM = net.dSE[seq[seq.length - 1]! * E + digester]!;
    delivered[digester] = delivered[digester]! + loadKg;
    return {
      volunteerId: volunteers[v]!.id,
      stops: roundStops,
      endDigesterId: digesters[digester]!.id,
      loadKg: kg(loadKg),
      lengthM: metres(roundStops.reduce((s, x) => s + x.legM, 0) + endLegM),
      endLegM: metres(endLegM),
    };
  });
  const messages = [...net.messages];
  if (unplaced.length > 0)
    messages.push(`${unplaced.length} collection(s) could not be planned; see the list for reasons.`);
  return {
    rounds,
    unplacedStops: unplaced,
    totalLengthM: metres(rounds.reduce((s, r) => s + r.lengthM, 0)),
    digesterLoads: digesters.map((d, e) => ({
      digesterId: d.id,
      loadKg: kg(delivered[e]!),
      roomKg: kg(net.rooms[e]!),
    })),
    messages,
  };
}

/**
 * Plans collection rounds (see the module comment for model and method):
 * every round's load fits its volunteer's bike, the rounds ending at a
 * digester together stay within its room, and stops that cannot be planned
 * are listed with the reason. Deterministic for a given input and options.
 */
export function planCollectionRounds(
  input: CollectionRoundsInput,
  options: CollectionRoundsOptions = {},
): CollectionPlan {
  const net = prepareNetwork(input, options);
  if (net.stopIdx.length === 0) return buildPlan(net, [], []);
  const shapes = options.savingsShapes ?? [1, 0.6, 1.4];
  const rng = options.perturbation ? mulberry32(options.perturbation.seed) : null;
  const noise = rng && options.perturbation ? () => options.perturbation!.noise * (rng() - 0.5) : null;
  let best: { ended: Ended[]; dropped: number[]; length: number } | null = null;
  for (const lambda of shapes) {
    let routes = savings(net, lambda, noise);
    routes = routes.map((r) => twoOpt(net, r, (s) => routeCost(net, s)));
    const leftovers: number[] = [];
    const assigned = assignEnds(net, routes, leftovers);
    const dropped = insertLeftovers(
      net,
      assigned,
      [...leftovers].sort((x, y) => net.load[y]! - net.load[x]! || x - y),
    );
    const ended = endAwareSearch(
      net,
      assigned.map(({ seq, digester }) => ({ seq: twoOpt(net, seq, (s) => fixedEndCost(net, s, digester)), digester })),
    );
    const length = ended.reduce((s, r) => s + fixedEndCost(net, r.seq, r.digester), 0);
    // Fewer dropped stops first, then shorter.
    if (
      !best ||
      dropped.length < best.dropped.length ||
      (dropped.length === best.dropped.length && length < best.length - 1e-9)
    ) {
      best = { ended, dropped, length };
    }
  }
  const iterations = options.improvementIterations ?? defaultImprovementIterations(net.stopIdx.length);
  const improved = ruinAndRecreate(net, best!.ended, best!.dropped, iterations, options.perturbation?.seed ?? 1);
  return buildPlan(net, improved.ended, improved.dropped);
}

/* ------------------------------------------------------------------ */
/* Exact optimum for small cases                                       */
/* ------------------------------------------------------------------ */

/** Largest number of plannable stops {@link exactCollectionRounds} accepts. */
export const EXACT_ROUNDS_MAX_STOPS = 9;

/**
 * The shortest plan that serves every plannable stop, by exhaustion, for
 * checking the heuristic: (1) for every subset of stops and every first
 * stop, shortest paths by the Held–Karp recursion [Held & Karp 1962, J.
 * SIAM 10:196, memory], giving each subset's best round to each digester;
 * (2) all partitions of the stops into rounds, each round given a digester,
 * rooms tracked across rounds, with branch and bound. Same model as
 * {@link planCollectionRounds}. Returns null when more than
 * {@link EXACT_ROUNDS_MAX_STOPS} stops remain or no plan serves them all.
 */
export function exactCollectionRounds(
  input: CollectionRoundsInput,
  options: Pick<CollectionRoundsOptions, "maxEndLegM" | "maxLegM"> = {},
): CollectionPlan | null {
  const net = prepareNetwork(input, options);
  const n = net.stopIdx.length;
  if (n > EXACT_ROUNDS_MAX_STOPS) return null;
  if (n === 0) return buildPlan(net, [], []);
  const E = net.rooms.length;
  const full = (1 << n) - 1;
  const loadMask = new Float64Array(full + 1);
  for (let m = 1; m <= full; m++) {
    const low = 31 - Math.clz32(m & -m);
    loadMask[m] = loadMask[m & (m - 1)]! + net.load[low]!;
  }
  // dp[(f * (full+1) + mask) * n + j]: shortest path starting at f, visiting mask, ending at j.
  const dp = new Float64Array(n * (full + 1) * n).fill(Infinity);
  const at = (f: number, m: number, j: number) => (f * (full + 1) + m) * n + j;
  for (let f = 0; f < n; f++) {
    dp[at(f, 1 << f, f)] = 0;
    for (let m = 1; m <= full; m++) {
      if (!(m & (1 << f))) continue;
      for (let j = 0; j < n; j++) {
        const base = dp[at(f, m, j)]!;
        if (base === Infinity) continue;
        for (let k = 0; k < n; k++) {
          if (m & (1 << k)) continue;
          const idx = at(f, m | (1 << k), k);
          const c = base + net.dSS[j * n + k]!;
          if (c < dp[idx]!) dp[idx] = c;
        }
      }
    }
  }
  // best[m * E + e]: shortest round over exactly mask m ending at digester e (ignoring other rounds).
  const best = new Float64Array((full + 1) * E).fill(Infinity);
  const bestFL = new Int32Array((full + 1) * E * 2);
  for (let m = 1; m <= full; m++) {
    const L = loadMask[m]!;
    if (L > net.maxBikeKg + KG_EPS) continue;
    for (let f = 0; f < n; f++) {
      if (!(m & (1 << f))) continue;
      const s = startLeg(net, f, L);
      if (s === Infinity) continue;
      for (let l = 0; l < n; l++) {
        const p = dp[at(f, m, l)]!;
        if (p === Infinity) continue;
        for (let e = 0; e < E; e++) {
          if (net.rooms[e]! + KG_EPS < L) continue;
          const c = s + p + net.dSE[l * E + e]!;
          if (c < best[m * E + e]!) {
            best[m * E + e] = c;
            bestFL[(m * E + e) * 2] = f;
            bestFL[(m * E + e) * 2 + 1] = l;
          }
        }
      }
    }
  }
  const left = [...net.rooms];
  let bestTotal = Infinity;
  let bestBlocks: { m: number; e: number }[] = [];
  const chosen: { m: number; e: number }[] = [];
  const search = (rem: number, cost: number) => {
    if (cost >= bestTotal - 1e-9) return;
    if (rem === 0) {
      bestTotal = cost;
      bestBlocks = [...chosen];
      return;
    }
    const low = rem & -rem;
    const rest = rem ^ low;
    // Every subset of `rest`, joined with the lowest remaining stop, is a candidate round.
    for (let sub = rest; ; sub = (sub - 1) & rest) {
      const m = sub | low;
      const L = loadMask[m]!;
      if (L <= net.maxBikeKg + KG_EPS) {
        for (let e = 0; e < E; e++) {
          const c = best[m * E + e]!;
          if (c === Infinity || left[e]! + KG_EPS < L) continue;
          left[e] = left[e]! - L;
          chosen.push({ m, e });
          search(rem ^ m, cost + c);
          chosen.pop();
          left[e] = left[e]! + L;
        }
      }
      if (sub === 0) break;
    }
  };
  search(full, 0);
  if (bestTotal === Infinity) return null;
  const ended: Ended[] = bestBlocks.map(({ m, e }) => {
    const f = bestFL[(m * E + e) * 2]!;
    let l = bestFL[(m * E + e) * 2 + 1]!;
    // Walk the Held–Karp table back from l to f.
    const seq = [l];
    let mask = m;
    while (mask !== 1 << f) {
      const here = dp[at(f, mask, l)]!;
      const prevMask = mask ^ (1 << l);
      let prev = -1;
      for (let k = 0; k < n; k++) {
        if (!(prevMask & (1 << k))) continue;
        if (Math.abs(dp[at(f, prevMask, k)]! + net.dSS[k * n + l]! - here) <= 1e-6) {
          prev = k;
          break;
        }
      }
      mask = prevMask;
      l = prev;
      seq.push(l);
    }
    return { seq: seq.reverse(), digester: e };
  });
  return buildPlan(net, ended, []);
}

/* ------------------------------------------------------------------ */
/* Lower bound                                                         */
/* ------------------------------------------------------------------ */

/**
 * Minimum-cost assignment (Hungarian method with potentials), square cost
 * matrix; returns the optimal total [Kuhn 1955, Naval Res. Logist. Q. 2:83,
 * memory]. Infinity entries are forbidden.
 */
function assignmentMin(cost: Float64Array, size: number): number {
  const BIG = 1e15;
  const u = new Float64Array(size + 1);
  const v = new Float64Array(size + 1);
  const p = new Int32Array(size + 1);
  const way = new Int32Array(size + 1);
  for (let i = 1; i <= size; i++) {
    p[0] = i;
    let j0 = 0;
    const minv = new Float64Array(size + 1).fill(Infinity);
    const used = new Uint8Array(size + 1);
    do {
      used[j0] = 1;
      const i0 = p[j0]!;
      let delta = Infinity;
      let j1 = 0;
      for (let j = 1; j <= size; j++) {
        if (used[j]) continue;
        const c = Math.min(cost[(i0 - 1) * size + (j - 1)]!, BIG);
        const cur = c - u[i0]! - v[j]!;
        if (cur < minv[j]!) {
          minv[j] = cur;
          way[j] = j0;
        }
        if (minv[j]! < delta) {
          delta = minv[j]!;
          j1 = j;
        }
      }
      for (let j = 0; j <= size; j++) {
        if (used[j]) {
          u[p[j]!] = u[p[j]!]! + delta;
          v[j] = v[j]! - delta;
        } else minv[j] = minv[j]! - delta;
      }
      j0 = j1;
    } while (p[j0] !== 0);
    do {
      const j1 = way[j0]!;
      p[j0] = p[j1]!;
      j0 = j1;
    } while (j0 !== 0);
  }
  let total = 0;
  for (let j = 1; j <= size; j++) total += Math.min(cost[(p[j]! - 1) * size + (j - 1)]!, BIG);
  return total;
}

/**
 * A lower bound on the total length of any plan serving all plannable
 * stops, metres: the assignment relaxation of vehicle routing [e.g. Toth &
 * Vigo 2002, *The Vehicle Routing Problem*, SIAM, ch. 2, memory]. With R
 * rounds, every stop has one successor (a stop or a digester) and one
 * predecessor (a stop or a volunteer start); dropping "no subtours", loads
 * and shared rooms leaves a minimum-cost assignment between
 * {stops + R starts} and {stops + R ends}. The bound is the minimum over
 * R = ⌈Σ load / largest bike⌉ … number of stops. Legs use the nearest
 * volunteer whose bike carries the stop and the nearest digester with room
 * for it, so every real plan is at least this long.
 */
export function collectionRoundsLowerBoundM(
  input: CollectionRoundsInput,
  options: Pick<CollectionRoundsOptions, "maxEndLegM" | "maxLegM"> = {},
): Metres {
  const net = prepareNetwork(input, options);
  const n = net.stopIdx.length;
  if (n === 0) return metres(0);
  const total = net.load.reduce((s, x) => s + x, 0);
  const rMin = Math.max(1, Math.ceil(total / net.maxBikeKg - 1e-9));
  const start = Array.from({ length: n }, (_, a) => startLeg(net, a, net.load[a]!));
  const end = Array.from({ length: n }, (_, a) => endLeg(net, a, net.load[a]!));
  let bound = Infinity;
  for (let R = rMin; R <= n; R++) {
    const size = n + R;
    const cost = new Float64Array(size * size).fill(Infinity);
    // Rows: stops 0..n−1, then R starts. Columns: stops 0..n−1 (as successors), then R ends.
    for (let a = 0; a < n; a++) {
      for (let b = 0; b < n; b++) if (a !== b) cost[a * size + b] = net.dSS[a * n + b]!;
      for (let r = 0; r < R; r++) cost[a * size + n + r] = end[a]!;
    }
    for (let r = 0; r < R; r++) for (let b = 0; b < n; b++) cost[(n + r) * size + b] = start[b]!;
    bound = Math.min(bound, assignmentMin(cost, size));
  }
  return metres(bound);
}
