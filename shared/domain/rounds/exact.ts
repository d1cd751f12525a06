/**
 * Exact optimum for small cases: Held–Karp paths over every subset of stops,
 * then branch and bound over partitions into rounds with shared rooms.
 */
import { buildPlan } from "./assemble";
import { type CollectionRoundsInput, type CollectionRoundsOptions, KG_EPS } from "./model";
import { type Ended, type Network, prepareNetwork, startLeg } from "./network";
import type { CollectionPlan } from "./result";

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
  return exactOnNetwork(prepareNetwork(input, options));
}

/** {@link exactCollectionRounds} on a network already prepared. */
export function exactOnNetwork(net: Network): CollectionPlan | null {
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
