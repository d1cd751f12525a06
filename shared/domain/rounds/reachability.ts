/**
 * Which stops some round could serve at all, decided over the leg graph:
 * a round is a chain volunteer start → stop → … → stop → digester whose
 * legs are each within their cap ({@link CollectionRoundsOptions.maxLegM}
 * for the start and stop-to-stop legs, `maxEndLegM` for the last), whose
 * load fits the volunteer's bike and the digester's room. A stop far from
 * every start or digester in a straight line may still be served through
 * its neighbours, so a stop is reported out of reach only when no such
 * chain serves it (even as the only round of the date).
 *
 * Method. For every volunteer, Dijkstra over the stops with the stops'
 * loads as node weights gives the lightest chain from that start to each
 * stop (within the bike's load); for every digester, the lightest chain
 * from each stop to it (within its room) [Dijkstra 1959, "A note on two
 * problems in connexion with graphs", Numer. Math. 1:269, memory]. For a
 * stop s:
 * 1. no chain from any start: out of reach ("noVolunteer"); none to any
 *    digester: out of reach ("noDigesterWithinReach");
 * 2. no start and digester whose lightest chains fit together, in(s) +
 *    out(s) − load(s) ≤ min(bike, room), even if they share stops: out of
 *    reach;
 * 3. a start and a digester whose lightest chains fit together and share no
 *    stop form a round that serves s: in reach (a certificate); so do a
 *    chain to the digester and the lightest chain from the start that
 *    avoids its stops (or the other way round);
 * 4. otherwise a round would have to pass a stop twice, or use heavier
 *    chains: first, ignoring loads, two chains from s that share no stop,
 *    one to the starts and one to the digesters, must exist at all — a
 *    maximum flow of 2 with unit vertex capacities [Menger's theorem; Ford
 *    & Fulkerson 1956, Canad. J. Math. 8:399, memory] — else out of reach;
 * 5. then a depth-first search over simple chains through s, pruned by the
 *    lightest chains, decides; it stops after {@link REACH_SEARCH_STEPS}
 *    steps for one stop (or all stops together) and then keeps the stop (in
 *    reach, unproven).
 * So a stop reported out of reach is one no round serves, even alone; only
 * a stop whose search ran out of steps may be kept without a round that
 * serves it, and is then reported for room when the plan leaves it out.
 */
import { KG_EPS } from "./model";

/** The legs among the candidate stops, with their caps applied (a leg over its cap is Infinity). */
export interface LegGraph {
  /** Loads of the candidate stops, kg. */
  readonly load: Float64Array;
  /** Stop-to-stop metres, n × n; Infinity over the cap. */
  readonly dSS: Float64Array;
  /** Volunteer-to-stop metres, V × n; Infinity over the cap. */
  readonly dVS: Float64Array;
  /** Stop-to-digester metres, n × E; Infinity over the cap. */
  readonly dSE: Float64Array;
  /** Bike load of each volunteer, kg. */
  readonly bikes: readonly number[];
  /** Room of each digester on the date, kg. */
  readonly rooms: readonly number[];
}

/** Why no round can serve a stop: no chain from any start, or none to any digester with room. */
export type OutOfReach = "noVolunteer" | "noDigesterWithinReach";

/**
 * Steps of the depth-first search (step 5 of the module comment) allowed for
 * one stop, and for all stops of a date together [judgement: the search runs
 * only for the few stops steps 1–4 leave open; measured here, 200 stops with
 * 800 m caps needed none beyond step 4, and 20,000 steps take a few ms].
 */
export const REACH_SEARCH_STEPS = { perStop: 20_000, total: 200_000 } as const;

interface Chains {
  /** Lightest chain load from the terminal to each stop (the stop included), kg; Infinity when none. */
  readonly loadKg: Float64Array;
  /** The neighbour towards the terminal on that chain; −1 when the stop is next to the terminal. */
  readonly via: Int32Array;
}

/** Stops within the cap of each stop, nearest first. */
function neighbourLists(g: LegGraph): Int32Array[] {
  const n = g.load.length;
  return Array.from({ length: n }, (_, a) => {
    const near: number[] = [];
    for (let b = 0; b < n; b++) if (b !== a && g.dSS[a * n + b]! < Infinity) near.push(b);
    return Int32Array.from(near.sort((x, y) => g.dSS[a * n + x]! - g.dSS[a * n + y]! || x - y));
  });
}

/**
 * Dijkstra with node weights over the legs within the cap: the lightest
 * chains from a terminal whose neighbours are `first`, within `capKg`,
 * never through a `blocked` stop. A binary heap keeps it near-linear on the
 * sparse graphs of small caps.
 */
function lightestChains(
  g: LegGraph,
  adj: readonly Int32Array[],
  capKg: number,
  first: (a: number) => boolean,
  blocked?: Uint8Array,
): Chains {
  const n = g.load.length;
  const loadKg = new Float64Array(n).fill(Infinity);
  const via = new Int32Array(n).fill(-1);
  const heap: number[] = [];
  const less = (x: number, y: number) => loadKg[x]! < loadKg[y]! || (loadKg[x] === loadKg[y] && x < y);
  const push = (a: number) => {
    heap.push(a);
    for (let i = heap.length - 1; i > 0;) {
      const p = (i - 1) >> 1;
      if (!less(heap[i]!, heap[p]!)) break;
      [heap[i], heap[p]] = [heap[p]!, heap[i]!];
      i = p;
    }
  };
  const pop = () => {
    const top = heap[0]!;
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      for (let i = 0; ;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < heap.length && less(heap[l]!, heap[m]!)) m = l;
        if (r < heap.length && less(heap[r]!, heap[m]!)) m = r;
        if (m === i) break;
        [heap[i], heap[m]] = [heap[m]!, heap[i]!];
        i = m;
      }
    }
    return top;
  };
  for (let a = 0; a < n; a++)
    if (!blocked?.[a] && first(a) && g.load[a]! <= capKg + KG_EPS) {
      loadKg[a] = g.load[a]!;
      push(a);
    }
  const done = new Uint8Array(n);
  while (heap.length > 0) {
    const u = pop();
    if (done[u]) continue;
    done[u] = 1;
    for (const b of adj[u]!) {
      if (done[b] || blocked?.[b]) continue;
      const next = loadKg[u]! + g.load[b]!;
      if (next <= capKg + KG_EPS && next < loadKg[b]!) {
        loadKg[b] = next;
        via[b] = u;
        push(b);
      }
    }
  }
  return { loadKg, via };
}

/** The stops on a chain from `s` towards its terminal, `s` left out. */
function chainStops(chains: Chains, s: number): number[] {
  const out: number[] = [];
  for (let a = chains.via[s]!; a >= 0; a = chains.via[a]!) out.push(a);
  return out;
}

/**
 * True when stop `s` lies on a simple path from some start to some digester
 * over the legs within their caps, loads ignored except that a stop next to
 * a start or digester must fit that bike or room by itself: two paths from
 * `s`, one to the starts' side and one to the digesters' side, sharing no
 * stop (a maximum flow of 2 from `s`, every stop split into an in and an
 * out node of capacity 1).
 */
function onSimplePath(g: LegGraph, adj: readonly Int32Array[], s: number): boolean {
  const n = g.load.length;
  const E = g.rooms.length;
  const nearStart = (a: number) => g.bikes.some((b, k) => g.dVS[k * n + a]! < Infinity && b + KG_EPS >= g.load[a]!);
  const nearEnd = (a: number) => g.rooms.some((r, e) => g.dSE[a * E + e]! < Infinity && r + KG_EPS >= g.load[a]!);
  // Nodes: stop a in = 2a, out = 2a + 1; X (start side) = 2n, Y (digester side) = 2n + 1, sink T = 2n + 2.
  const N = 2 * n + 3;
  const X = 2 * n;
  const Y = 2 * n + 1;
  const T = 2 * n + 2;
  const cap = new Map<number, number>();
  const arcs: number[][] = Array.from({ length: N }, () => []);
  const arc = (u: number, v: number, c: number) => {
    if (!cap.has(u * N + v)) {
      arcs[u]!.push(v);
      arcs[v]!.push(u);
      cap.set(v * N + u, cap.get(v * N + u) ?? 0);
    }
    cap.set(u * N + v, c);
  };
  for (let a = 0; a < n; a++) {
    arc(2 * a, 2 * a + 1, a === s ? 2 : 1);
    for (const b of adj[a]!) arc(2 * a + 1, 2 * b, 1);
    if (nearStart(a)) arc(2 * a + 1, X, 1);
    if (nearEnd(a)) arc(2 * a + 1, Y, 1);
  }
  arc(X, T, 1);
  arc(Y, T, 1);
  const source = 2 * s + 1;
  const from = new Int32Array(N);
  let flow = 0;
  while (flow < 2) {
    from.fill(-1);
    from[source] = source;
    const queue = [source];
    for (let qi = 0; qi < queue.length && from[T]! < 0; qi++) {
      const u = queue[qi]!;
      for (const v of arcs[u]!) {
        if (from[v]! >= 0 || (cap.get(u * N + v) ?? 0) <= 0) continue;
        from[v] = u;
        queue.push(v);
      }
    }
    if (from[T]! < 0) break;
    for (let v = T; v !== source; v = from[v]!) {
      const u = from[v]!;
      cap.set(u * N + v, cap.get(u * N + v)! - 1);
      cap.set(v * N + u, (cap.get(v * N + u) ?? 0) + 1);
    }
    flow++;
  }
  return flow === 2;
}

/**
 * True when a simple chain start → … → s → … → digester exists within the
 * caps, its load within the bike and the digester's room, by depth-first
 * search pruned with the lightest chains; also true when the search used
 * up its steps first (undecided counts as in reach). `steps.left` is the
 * budget shared by all stops.
 */
function chainThrough(
  g: LegGraph,
  adj: readonly Int32Array[],
  s: number,
  starts: readonly Chains[],
  ends: readonly Chains[],
  steps: { left: number },
): boolean {
  const n = g.load.length;
  const E = g.rooms.length;
  // Lightest chain from s to each stop (both included), to prune partial chains that can no longer reach s.
  const toS = lightestChains(g, adj, Infinity, (a) => a === s);
  // Lightest load still needed from a stop (excluded) to some digester with room.
  const endRest = Float64Array.from({ length: n }, (_, a) => Math.min(...ends.map((c) => c.loadKg[a]! - g.load[a]!)));
  let budget = Math.min(REACH_SEARCH_STEPS.perStop, steps.left);
  const onPath = new Uint8Array(n);
  const search = (capKg: number, at: number, loadKg: number, seen: boolean): boolean => {
    if (--budget < 0) return true;
    if (seen) {
      for (let e = 0; e < E; e++) if (g.dSE[at * E + e]! < Infinity && loadKg <= g.rooms[e]! + KG_EPS) return true;
      if (loadKg + endRest[at]! > capKg + KG_EPS) return false;
    } else if (loadKg + toS.loadKg[at]! - g.load[at]! > capKg + KG_EPS) return false;
    for (const b of adj[at]!) {
      if (onPath[b] || loadKg + g.load[b]! > capKg + KG_EPS) continue;
      onPath[b] = 1;
      const found = search(capKg, b, loadKg + g.load[b]!, seen || b === s);
      onPath[b] = 0;
      if (found) return true;
    }
    return false;
  };
  let found = false;
  for (let k = 0; k < g.bikes.length && !found; k++) {
    if (starts[k]!.loadKg[s] === Infinity) continue;
    for (let a = 0; a < n && !found; a++) {
      if (g.dVS[k * n + a] === Infinity || g.load[a]! > g.bikes[k]! + KG_EPS) continue;
      onPath[a] = 1;
      found = search(g.bikes[k]!, a, g.load[a]!, a === s);
      onPath[a] = 0;
    }
  }
  steps.left -= Math.min(REACH_SEARCH_STEPS.perStop, steps.left) - Math.max(0, budget);
  return found;
}

/**
 * For each candidate stop, null when some round could serve it (see the
 * module comment), else why not: "noVolunteer" when no chain from any start
 * reaches it, or it reaches a digester directly and no chain from a start
 * fits with that; "noDigesterWithinReach" otherwise (no chain from it to a
 * digester with room, or none that fits with a chain from a start).
 */
export function outOfReach(g: LegGraph): (OutOfReach | null)[] {
  const n = g.load.length;
  const E = g.rooms.length;
  const adj = neighbourLists(g);
  const fromStart = (k: number) => (a: number) => g.dVS[k * n + a]! < Infinity;
  const toEnd = (e: number) => (a: number) => g.dSE[a * E + e]! < Infinity;
  const starts = g.bikes.map((b, k) => lightestChains(g, adj, b, fromStart(k)));
  const ends = g.rooms.map((r, e) => lightestChains(g, adj, r, toEnd(e)));
  const steps = { left: REACH_SEARCH_STEPS.total };
  const blockedBy = (stops: readonly number[]) => {
    const mask = new Uint8Array(n);
    for (const a of stops) mask[a] = 1;
    return mask;
  };
  return Array.from({ length: n }, (_, s) => {
    const w = g.load[s]!;
    if (!starts.some((c) => c.loadKg[s]! < Infinity)) return "noVolunteer";
    if (!ends.some((c) => c.loadKg[s]! < Infinity)) return "noDigesterWithinReach";
    const pairs: { k: number; e: number; kg: number }[] = [];
    starts.forEach((c, k) =>
      ends.forEach((d, e) => {
        const kg = c.loadKg[s]! + d.loadKg[s]! - w;
        if (kg <= Math.min(g.bikes[k]!, g.rooms[e]!) + KG_EPS) pairs.push({ k, e, kg });
      }),
    );
    const directEnd = g.rooms.some((r, e) => g.dSE[s * E + e]! < Infinity && r + KG_EPS >= w);
    const verdict = directEnd ? "noVolunteer" : "noDigesterWithinReach";
    if (pairs.length === 0) return verdict;
    pairs.sort((x, y) => x.kg - y.kg || x.k - y.k || x.e - y.e);
    for (const { k, e } of pairs) {
      const before = chainStops(starts[k]!, s);
      const after = chainStops(ends[e]!, s);
      const inBefore = new Set(before);
      // Disjoint chains: start → … → s → … → digester is a round that serves s.
      if (!after.some((a) => inBefore.has(a))) return null;
    }
    // Overlapping lightest chains: the lightest chain on one side that avoids the other side's stops.
    const capOf = (k: number, e: number) => Math.min(g.bikes[k]!, g.rooms[e]!);
    for (const { k, e } of pairs.slice(0, 4)) {
      const after = chainStops(ends[e]!, s);
      const inAvoiding = lightestChains(g, adj, g.bikes[k]!, fromStart(k), blockedBy(after));
      if (inAvoiding.loadKg[s]! + ends[e]!.loadKg[s]! - w <= capOf(k, e) + KG_EPS) return null;
      const before = chainStops(starts[k]!, s);
      const outAvoiding = lightestChains(g, adj, g.rooms[e]!, toEnd(e), blockedBy(before));
      if (starts[k]!.loadKg[s]! + outAvoiding.loadKg[s]! - w <= capOf(k, e) + KG_EPS) return null;
    }
    if (!onSimplePath(g, adj, s)) return verdict;
    return chainThrough(g, adj, s, starts, ends, steps) ? null : verdict;
  });
}
