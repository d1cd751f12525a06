/**
 * The restricted MIP: the model over each item's kept options only (those of small reduced
 * cost), split into independent parts and solved by HiGHS with the incumbent as cutoff. Used
 * by the polish step (a heuristic) and by the exact path after reduced-cost fixing.
 * Sources: reduced-cost fixing — Nemhauser & Wolsey 1988, *Integer and Combinatorial
 * Optimization*, §II.4 [memory]; HiGHS — Huangfu & Hall 2018, Math. Prog. Comp. 10:119 [memory].
 */
import type { ReducedCosts } from "./bounds";
import { type AssignmentModel, KG_EPS, costOf, planObjectiveDm } from "./model";
import { buildAssignmentLp } from "./model-writer";
import { readAssignmentSolution, roundPoint } from "./solution-reader";
import { type LpSolver, callSolver } from "./solver-seam";

/** Extra columns (beyond each household's best option) a polish MIP may hold. */
export const POLISH_EXTRA_COLUMNS = 800;
/** Time limit of each polish MIP, seconds. */
export const POLISH_TIME_LIMIT_S = 3;

/** Largest reduced cost t ≤ slack such that about `extra` options with 0 < rc ≤ t exist. */
export function polishThreshold(model: AssignmentModel, rc: ReducedCosts, slack: number, extra: number): number {
  const values: number[] = [];
  model.items.forEach((item, i) => {
    for (let p = 0; p < item.digesters.length && item.costsDm[p]! - rc.itemMin[i]! <= slack; p++) {
      const x = rc.option(i, p);
      if (x > 1e-9 && x <= slack) values.push(x);
    }
  });
  if (values.length <= extra) return slack;
  return Float64Array.from(values).sort()[extra - 1]!;
}

/**
 * Per item, the option positions with reduced cost ≤ `limit`, always
 * including the incumbent's option; `u[i]` tells whether "unplaced" stays
 * (its reduced cost ≤ limit, or the incumbent leaves the item unplaced).
 */
export function optionsWithin(
  model: AssignmentModel,
  assign: Int32Array,
  rc: ReducedCosts,
  limit: number,
): { pos: number[][]; u: boolean[] } {
  const pos: number[][] = [];
  const u: boolean[] = [];
  model.items.forEach((item, i) => {
    const keep: number[] = [];
    let hasIncumbent = assign[i] === -1;
    // Options are sorted by cost and rc(p) ≥ c_p − L_i, so the scan stops once that alone exceeds the limit.
    for (let p = 0; p < item.digesters.length && item.costsDm[p]! - rc.itemMin[i]! <= limit; p++) {
      if (rc.option(i, p) <= limit) {
        keep.push(p);
        if (item.digesters[p] === assign[i]) hasIncumbent = true;
      }
    }
    if (!hasIncumbent) {
      const p = item.digesters.indexOf(assign[i]!);
      if (p >= 0) keep.push(p);
      keep.sort((a, b) => a - b);
    }
    pos.push(keep);
    u.push(assign[i] === -1 || rc.unplaced(i) <= limit);
  });
  return { pos, u };
}

interface RestrictedResult {
  assign: Int32Array;
  objectiveDm: number;
  allOptimal: boolean;
  statuses: string[];
  variables: number;
  error?: string;
}

/**
 * Minimises the model over the kept options only, starting from a feasible
 * incumbent whose options are all kept: items left with one option are
 * fixed; the rest splits into independent parts (items linked through
 * shared digesters, found by union–find); a part with one item takes its
 * cheapest option with room; every other part is a HiGHS MIP with the
 * incumbent's cost as cutoff (zero gap: costs are whole decimetres). A part
 * keeps the incumbent unless HiGHS returns a feasible plan at least as good.
 */
export function solveRestricted(
  model: AssignmentModel,
  incumbent: Int32Array,
  keep: { pos: number[][]; u: boolean[] },
  solver: LpSolver,
  timeLimitS: number,
): RestrictedResult {
  const D = model.roomKg.length;
  const assign = Int32Array.from(incumbent);
  const room = [...model.roomKg];
  const free: number[] = [];
  model.items.forEach((item, i) => {
    const options = keep.pos[i]!.length + (keep.u[i] ? 1 : 0);
    if (options <= 1) {
      if (assign[i]! >= 0) room[assign[i]!] = room[assign[i]!]! - item.kg;
    } else free.push(i);
  });
  // Union–find over digesters: items sharing a digester belong to one part.
  const parent = Int32Array.from({ length: D }, (_, d) => d);
  const find = (d: number): number => {
    while (parent[d] !== d) {
      parent[d] = parent[parent[d]!]!;
      d = parent[d]!;
    }
    return d;
  };
  for (const i of free) {
    const item = model.items[i]!;
    const ds = keep.pos[i]!.map((p) => item.digesters[p]!);
    for (let k = 1; k < ds.length; k++) parent[find(ds[k]!)] = find(ds[0]!);
  }
  const parts = new Map<number, number[]>();
  for (const i of free) {
    const item = model.items[i]!;
    const first = keep.pos[i]![0];
    const key = first === undefined ? -1 - i : find(item.digesters[first]!);
    let list = parts.get(key);
    if (!list) parts.set(key, (list = []));
    list.push(i);
  }
  const statuses: string[] = [];
  let allOptimal = true;
  let variables = 0;
  let error: string | undefined;
  for (const items of parts.values()) {
    if (items.length === 1) {
      const i = items[0]!;
      const item = model.items[i]!;
      let best = keep.u[i] ? -1 : assign[i]!;
      let bestCost = costOf(item, best);
      for (const p of keep.pos[i]!) {
        const d = item.digesters[p]!;
        if (room[d]! + KG_EPS >= item.kg && item.costsDm[p]! < bestCost) {
          best = d;
          bestCost = item.costsDm[p]!;
        }
      }
      assign[i] = best;
      continue;
    }
    const sub: AssignmentModel = {
      items: items.map((i) => {
        const item = model.items[i]!;
        const pos = keep.pos[i]!;
        return {
          kg: item.kg,
          penaltyDm: item.penaltyDm,
          digesters: Int32Array.from(pos, (p) => item.digesters[p]!),
          costsDm: Float64Array.from(pos, (p) => item.costsDm[p]!),
        };
      }),
      roomKg: room.map((r) => Math.max(0, r)),
    };
    variables += sub.items.reduce((sum, it) => sum + it.digesters.length, 0) + items.filter((i) => keep.u[i]).length;
    const incumbentDm = items.reduce((sum, i) => sum + costOf(model.items[i]!, assign[i]!), 0);
    const sol = callSolver(
      solver,
      buildAssignmentLp(
        sub,
        true,
        undefined,
        items.map((i) => keep.u[i]!),
      ),
      {
        output_flag: false,
        time_limit: timeLimitS,
        mip_rel_gap: 0,
        mip_abs_gap: 0.05,
        objective_bound: incumbentDm + 0.5,
      },
    );
    if ("error" in sol) {
      error = sol.error;
      allOptimal = false;
      continue;
    }
    statuses.push(sol.Status);
    if (sol.Status !== "Optimal") allOptimal = false;
    const read = readAssignmentSolution(sub, sol);
    if (!read.hasPoint) continue;
    const subAssign = roundPoint(sub, read);
    const load = new Float64Array(D);
    let cost = 0;
    let ok = true;
    items.forEach((i, s) => {
      const d = subAssign[s]!;
      cost += costOf(model.items[i]!, d);
      if (d >= 0) load[d] = load[d]! + model.items[i]!.kg;
    });
    load.forEach((l, d) => {
      if (l > sub.roomKg[d]! + KG_EPS) ok = false;
    });
    if (ok && cost <= incumbentDm + 1e-9) items.forEach((i, s) => (assign[i] = subAssign[s]!));
  }
  return { assign, objectiveDm: planObjectiveDm(model, assign), allOptimal, statuses, variables, error };
}
