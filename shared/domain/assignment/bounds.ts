/**
 * Bounds: the Lagrangian lower bound of the assignment GAP, subgradient steps that tighten it,
 * the reduced costs it implies, and the large-network candidates chosen by them. Costs and
 * bounds in decimetres, multipliers in decimetres per kg.
 * Sources: Ross & Soland 1975, Math. Programming 8:91 [memory]; Held, Wolfe & Crowder 1974,
 * Math. Programming 6:62 [memory].
 */
import type { AssignmentModel } from "./model";

/**
 * Lagrangian lower bound (capacity rows relaxed with multipliers v ≥ 0):
 *   LB(v) = Σ_i min(P_i, min_d (c_id + w_i v_d)) − Σ_d v_d R_d.
 * Valid for every v ≥ 0 [Ross & Soland 1975, memory]. Also returns each
 * item's inner minimum L_i, used for reduced costs c_id + w_i v_d − L_i ≥ 0.
 */
export function lagrangianBound(model: AssignmentModel, v: Float64Array): { boundDm: number; itemMinDm: Float64Array } {
  const itemMin = new Float64Array(model.items.length);
  let sum = 0;
  model.items.forEach((item, i) => {
    let best = item.penaltyDm;
    const { digesters, costsDm, kg: w } = item;
    // Options are sorted by cost and w·v ≥ 0, so nothing beyond the first cost ≥ best can win.
    for (let p = 0; p < digesters.length && costsDm[p]! < best; p++) {
      const c = costsDm[p]! + w * (v[digesters[p]!] ?? 0);
      if (c < best) best = c;
    }
    itemMin[i] = best;
    sum += best;
  });
  model.roomKg.forEach((r, d) => {
    sum -= (v[d] ?? 0) * Math.max(0, r);
  });
  return { boundDm: sum, itemMinDm: itemMin };
}

/** Subgradient steps on the Lagrangian bound (a fixed count, so results are reproducible). */
const SUBGRADIENT_STEPS = 120;
/** Subgradient steps that choose the large-network candidates [judgement: 60 left enough negative reduced costs to force a second LP solve on the benchmark; 120 did not]. */
export const CANDIDATE_SUBGRADIENT_STEPS = 120;

/**
 * Improves capacity multipliers v by projected subgradient ascent on
 * LB(v) (see {@link lagrangianBound}): g_d = R_d − Σ_{i choosing d} w_i,
 * v ← max(0, v − t·g) with Polyak's step t = λ (UB − LB)/‖g‖², λ from 2,
 * halved after 8 steps without a better bound [Held, Wolfe & Crowder 1974,
 * Math. Programming 6:62, memory]. Returns the best v seen and its bound;
 * the bound is valid whatever v is, so this only ever tightens it.
 */
export function improveMultipliers(
  model: AssignmentModel,
  start: Float64Array,
  upperBoundDm: number,
  steps = SUBGRADIENT_STEPS,
): { multipliers: Float64Array; boundDm: number } {
  let v = Float64Array.from(start);
  let best = Float64Array.from(v);
  let bestLb = -Infinity;
  let lambda = 2;
  let stall = 0;
  const g = new Float64Array(v.length);
  for (let it = 0; it <= steps; it++) {
    g.fill(0);
    model.roomKg.forEach((r, d) => {
      g[d] = Math.max(0, r);
    });
    let lb = 0;
    for (const item of model.items) {
      let bestCost = item.penaltyDm;
      let bestD = -1;
      const { digesters, costsDm, kg: w } = item;
      for (let p = 0; p < digesters.length && costsDm[p]! < bestCost; p++) {
        const d = digesters[p]!;
        const c = costsDm[p]! + w * v[d]!;
        if (c < bestCost) {
          bestCost = c;
          bestD = d;
        }
      }
      lb += bestCost;
      if (bestD >= 0) g[bestD] = g[bestD]! - item.kg;
    }
    model.roomKg.forEach((r, d) => {
      lb -= v[d]! * Math.max(0, r);
    });
    if (lb > bestLb + 1e-9) {
      bestLb = lb;
      best = Float64Array.from(v);
      stall = 0;
    } else if (++stall >= 8) {
      lambda /= 2;
      stall = 0;
    }
    if (it === steps) break;
    let norm = 0;
    g.forEach((x, d) => {
      // Projection: a multiplier at 0 with spare room cannot go lower.
      if (!(v[d]! <= 0 && x > 0)) norm += x * x;
    });
    if (norm <= 1e-12 || upperBoundDm - lb <= 1e-9 || lambda < 1e-4) break;
    const t = (lambda * (upperBoundDm - lb)) / norm;
    v = v.map((x, d) => Math.max(0, x - t * g[d]!));
  }
  return { multipliers: best, boundDm: bestLb };
}

/** Per item, the positions of its `k` options with the smallest reduced cost c + w·v (ties to the nearer). */
export function candidatesByReducedCost(model: AssignmentModel, v: Float64Array, k: number): number[][] {
  return model.items.map((item) => {
    const m = item.digesters.length;
    if (m <= k) return [...Array(m).keys()];
    // Keep the k best seen; options are sorted by cost and w·v ≥ 0, so scanning stops once a cost alone exceeds the k-th best.
    const best: { p: number; rc: number }[] = [];
    for (let p = 0; p < m; p++) {
      const c = item.costsDm[p]!;
      if (best.length === k && c >= best[k - 1]!.rc) break;
      const rc = c + item.kg * v[item.digesters[p]!]!;
      if (best.length < k || rc < best[k - 1]!.rc) {
        best.push({ p, rc });
        best.sort((a, b) => a.rc - b.rc || a.p - b.p);
        if (best.length > k) best.pop();
      }
    }
    return best.map((b) => b.p).sort((a, b) => a - b);
  });
}

/** Reduced costs under multipliers v (see {@link lagrangianBound}): option p of item i, and "unplaced". */
export interface ReducedCosts {
  option(i: number, p: number): number;
  unplaced(i: number): number;
  /** L_i, item i's smallest c + w·v (or P). A lower bound on the reduced cost of option p is c_p − L_i. */
  readonly itemMin: Float64Array;
}
