/**
 * A lower bound on the length of any plan, for reporting how far a plan may
 * be from the optimum where the exact solver cannot run.
 */
import { type Metres, metres } from "../../units";
import type { CollectionRoundsInput, CollectionRoundsOptions } from "./model";
import { endLeg, prepareNetwork, startLeg } from "./network";

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
