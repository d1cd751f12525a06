/**
 * Building a first plan: savings construction [Clarke & Wright 1964;
 * parametric, Yellow 1970], 2-opt inside each round [Croes 1958], ends given
 * by regret with rooms shared [Martello & Toth 1981], and cheapest insertion
 * of stops set aside (see index.ts for the full references).
 */
import { KG_EPS } from "./model";
import {
  type Ended,
  type Network,
  constructionCost,
  endLeg,
  fixedEndCost,
  loadOf,
  pathM,
  roomsLeft,
  softLegM,
  startLeg,
} from "./network";

/**
 * Parametric savings construction with shape λ (and optional noise); returns
 * routes as stop-index sequences. A stop with no start or no digester within
 * its cap counts that leg at {@link MISSING_LEG_PENALTY_M}, so the joins that
 * give it a neighbour on the way in or out come first: that is how chains of
 * legs within the cap are built.
 */
export function savings(net: Network, lambda: number, noise: (() => number) | null): number[][] {
  const n = net.stopIdx.length;
  const routeOf = new Int32Array(n);
  const routes: (number[] | null)[] = [];
  for (let a = 0; a < n; a++) {
    routeOf[a] = a;
    routes.push([a]);
  }
  const single = Array.from({ length: n }, (_, a) => ({
    s: softLegM(startLeg(net, a, 0)),
    e: softLegM(endLeg(net, a, 0)),
  }));
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
    const c1 = constructionCost(net, merged, loadKg);
    const c2 = constructionCost(net, reversed, loadKg);
    const best = c1 <= c2 ? merged : reversed;
    if (Math.min(c1, c2) < constructionCost(net, A) + constructionCost(net, B) - 1e-9) {
      routes[ra] = best;
      routes[rb] = null;
      for (const x of best) routeOf[x] = ra;
    }
  }
  return routes.filter((r): r is number[] => r !== null);
}

/** 2-opt on one round (segment reversals, whole-round reversal included), first improvement until none. */
export function twoOpt(net: Network, seq: number[], cost: (s: readonly number[]) => number): number[] {
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

/**
 * Gives each round a digester with room left, by regret: repeatedly the
 * round whose best and second-best feasible ends differ most is served
 * first (a round with a single option first of all). A round no digester
 * can take sets its heaviest stops aside (into `leftovers`) until one can;
 * so does one no volunteer's bike within reach carries. A round that cannot
 * be ridden at all is mended first: split at a leg over the cap, or its
 * first (last) stop set aside when no start (digester) is within its reach.
 */
export function assignEnds(net: Network, routes: number[][], leftovers: number[]): Ended[] {
  const n = net.stopIdx.length;
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
    const setAside = (p: number) => {
      leftovers.push(seq[p]!);
      seq.splice(p, 1);
      if (seq.length === 0) pending.splice(pick, 1);
    };
    const heaviest = () => {
      let h = 0;
      seq.forEach((a, p) => {
        if (net.load[a]! > net.load[seq[h]!]!) h = p;
      });
      return h;
    };
    const broken = seq.findIndex((a, p) => p > 0 && net.dSS[seq[p - 1]! * n + a]! === Infinity);
    if (broken > 0) {
      // A leg over the cap (a chain the construction could not close): ride the two parts as two rounds.
      pending.splice(pick, 1, seq.slice(0, broken), seq.slice(broken));
      continue;
    }
    if (pickE < 0) {
      // Nothing can take this round whole: set its heaviest stop aside (re-inserted later if any room is left);
      // its last stop, when no digester at all is within reach of it.
      const last = seq[seq.length - 1]!;
      const anyEnd = net.rooms.some((_, e) => net.dSE[last * E + e]! < Infinity);
      setAside(anyEnd ? heaviest() : seq.length - 1);
      continue;
    }
    if (startLeg(net, seq[0]!, loadOf(net, seq)) === Infinity) {
      // No bike within reach carries it: lighten it, or drop a first stop that no start reaches.
      setAside(startLeg(net, seq[0]!, net.load[seq[0]!]!) === Infinity ? 0 : heaviest());
      continue;
    }
    pending.splice(pick, 1);
    left[pickE] = left[pickE]! - loadOf(net, seq);
    out.push({ seq, digester: pickE });
  }
  return out;
}

/**
 * Puts set-aside stops back: cheapest insertion into a round whose bike and
 * digester still have room, else a new one-stop round to a digester with
 * room left; what still fits nowhere is returned (really no room). Stops
 * that fit nowhere are tried again while others went in, since a stop
 * reached only through a neighbour fits once that neighbour is on a round.
 */
export function insertLeftovers(net: Network, ended: Ended[], leftovers: readonly number[]): number[] {
  let waiting = insertOnce(net, ended, leftovers);
  for (let before = leftovers.length; waiting.length > 0 && waiting.length < before;) {
    before = waiting.length;
    waiting = insertOnce(net, ended, waiting);
  }
  return waiting;
}

/** One pass of {@link insertLeftovers}, in the order given. */
function insertOnce(net: Network, ended: Ended[], leftovers: readonly number[]): number[] {
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

/**
 * Mends rounds that can no longer be ridden after stops were taken out of
 * them (a leg over the cap, or a first or last stop that only reached a
 * start or the digester through a stop now gone): each is cut at its legs
 * over the cap, the pieces that can be ridden to the same digester are kept,
 * the stops of the others are returned to be put back.
 */
export function breakInfeasible(net: Network, ended: readonly Ended[]): { ended: Ended[]; aside: number[] } {
  const n = net.stopIdx.length;
  const kept: Ended[] = [];
  const aside: number[] = [];
  for (const r of ended) {
    if (r.digester < 0) {
      aside.push(...r.seq);
      continue;
    }
    if (fixedEndCost(net, r.seq, r.digester) < Infinity) {
      kept.push(r);
      continue;
    }
    let from = 0;
    for (let p = 1; p <= r.seq.length; p++) {
      if (p < r.seq.length && net.dSS[r.seq[p - 1]! * n + r.seq[p]!]! < Infinity) continue;
      const piece = r.seq.slice(from, p);
      if (pathM(net, piece) < Infinity && fixedEndCost(net, piece, r.digester) < Infinity)
        kept.push({ seq: piece, digester: r.digester });
      else aside.push(...piece);
      from = p;
    }
  }
  return { ended: kept, aside };
}
