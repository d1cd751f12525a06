/**
 * The LP relaxation of the assignment, over all pairs or a subset, with pricing rounds that
 * add back pruned pairs of negative reduced cost under the LP's capacity duals.
 */
import type { AssignmentModel } from "./model";
import { buildAssignmentLp } from "./model-writer";
import { type ReadSolution, readAssignmentSolution } from "./solution-reader";
import { type HighsOptionsLike, type LpSolver, callSolver } from "./solver-seam";

/**
 * LP relaxation over a subset, with optional pricing rounds that add pairs of negative reduced
 * cost c + w·v − L_i(subset) < 0 under the LP's capacity duals v (decimetres; LP duality). After
 * the last allowed solve the pairs are only counted; `complete` says none was left.
 */
export function relax(
  model: AssignmentModel,
  solver: LpSolver,
  subset: number[][] | undefined,
  pricingRounds: number,
  options: HighsOptionsLike,
): {
  read: ReadSolution | null;
  status: string;
  added: number;
  complete: boolean;
  variables: number;
  subset: number[][] | undefined;
} {
  let added = 0;
  let read: ReadSolution | null = null;
  let status = "Not run";
  let variables = 0;
  let complete = subset === undefined;
  for (let round = 0; ; round++) {
    const lp = buildAssignmentLp(model, false, subset);
    variables = Math.max(
      variables,
      model.items.reduce((s, it, i) => s + (subset?.[i]?.length ?? it.digesters.length) + 1, 0),
    );
    const sol = callSolver(solver, lp, options);
    if ("error" in sol)
      return { read, status: `Solver error: ${sol.error}`, added, complete: false, variables, subset };
    status = sol.Status;
    read = readAssignmentSolution(model, sol, subset);
    if (!read.hasPoint || !subset) break;
    // Price every pruned pair: reduced cost c + w·v − L_i(subset) < 0 means the LP over all pairs is better.
    // After the last allowed solve the pairs are only counted (the subset must keep matching the LP point).
    const v = read.capacityMultipliers;
    const grow = round < pricingRounds;
    let addedNow = 0;
    model.items.forEach((item, i) => {
      const pos = subset[i]!;
      let li = item.penaltyDm;
      for (const p of pos) li = Math.min(li, item.costsDm[p]! + item.kg * v[item.digesters[p]!]!);
      const inSet = new Set(pos);
      const extra: number[] = [];
      for (let p = 0; p < item.digesters.length && item.costsDm[p]! < li - 1e-6; p++) {
        if (!inSet.has(p) && item.costsDm[p]! + item.kg * v[item.digesters[p]!]! < li - 1e-6) extra.push(p);
      }
      addedNow += extra.length;
      if (grow && extra.length > 0) {
        pos.push(...extra);
        pos.sort((a, b) => a - b);
      }
    });
    complete = addedNow === 0;
    if (!grow || complete) break;
    added += addedNow;
  }
  return { read, status, added, complete, variables, subset };
}
