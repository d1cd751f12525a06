/**
 * Improving a plan with rooms shared across rounds: local search (relocate,
 * swap, or-opt, 2-opt*, split; 2-opt inside rounds) and seeded ruin and
 * recreate with threshold accepting.
 */
import { KG_EPS } from "./model";
import { mulberry32 } from "../../random";
import { breakInfeasible, insertLeftovers, twoOpt } from "./construction";
import { type Ended, type Network, fixedEndCost, loadOf, pathM, roomsLeft, startLeg } from "./network";

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
export function endAwareSearch(net: Network, start: Ended[]): Ended[] {
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
export function ruinAndRecreate(
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
    let stillDropped = insertLeftovers(net, kept, order);
    let searched = endAwareSearch(net, kept);
    // Taking stops out may leave a round that cannot be ridden (a link of its chain gone); putting stops back and
    // the search usually mend it (any mending move is an improvement). What is left is cut, and its stops put back.
    const mended = breakInfeasible(net, searched);
    if (mended.aside.length > 0) {
      stillDropped = [...stillDropped, ...insertLeftovers(net, mended.ended, mended.aside)];
      searched = endAwareSearch(net, mended.ended);
    }
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
