/**
 * The solution reader: primal values and capacity multipliers from a HiGHS answer to the
 * model writer's text, and the rounding of a fractional LP point to a plan.
 */
import type { AssignmentModel, OptionSubset } from "./model";
import { uName, xName } from "./model-writer";
import type { HighsSolutionLike } from "./solver-seam";

/** What {@link readAssignmentSolution} extracts from a HiGHS answer. */
export interface ReadSolution {
  /** Whether the status says a usable primal point exists. */
  readonly hasPoint: boolean;
  /** Per item: value of each option in the subset order; last entry is u (unplaced). */
  readonly values: readonly Float64Array[];
  /** Capacity multipliers v_d = max(0, −dual of c_d) ≥ 0 by digester index; 0 where unknown. */
  readonly capacityMultipliers: Float64Array;
  readonly status: string;
}

const STATUSES_WITH_POINT = new Set([
  "Optimal",
  "Time limit reached",
  "Iteration limit reached",
  "Bound on objective reached",
  "Target for objective reached",
]);

/**
 * Reads primal values (by column name; a column without `Primal` counts as
 * 0) and capacity-row duals (by row name, falling back to model order) from
 * a HiGHS solution of {@link buildAssignmentLp}'s text. HiGHS reports a
 * ≤ row's dual as ≤ 0 when minimising (the objective falls as room grows),
 * so the Lagrange multiplier is its negation, clipped at 0 to stay valid.
 */
export function readAssignmentSolution(
  model: AssignmentModel,
  solution: HighsSolutionLike,
  subset?: OptionSubset,
): ReadSolution {
  const hasPoint =
    STATUSES_WITH_POINT.has(solution.Status) &&
    Object.values(solution.Columns).some((c) => typeof c.Primal === "number");
  const values = model.items.map((item, i) => {
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    const out = new Float64Array(positions.length + 1);
    positions.forEach((p, k) => {
      const v = solution.Columns[xName(i, item.digesters[p]!)]?.Primal;
      out[k] = typeof v === "number" && Number.isFinite(v) ? v : 0;
    });
    const u = solution.Columns[uName(i)]?.Primal;
    out[positions.length] = typeof u === "number" && Number.isFinite(u) ? u : 0;
    return out;
  });
  const multipliers = new Float64Array(model.roomKg.length);
  const rows = solution.Rows ?? [];
  const capacityDigesters = new Set<number>();
  model.items.forEach((item, i) => {
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    if (item.kg > 0) for (const p of positions) capacityDigesters.add(item.digesters[p]!);
  });
  const ordered = [...capacityDigesters].sort((a, b) => a - b);
  rows.forEach((row, r) => {
    let d: number | undefined;
    if (row.Name && /^c\d+$/.test(row.Name)) d = Number(row.Name.slice(1));
    else if (!row.Name && r >= model.items.length) d = ordered[r - model.items.length];
    if (d !== undefined && typeof row.Dual === "number" && Number.isFinite(row.Dual))
      multipliers[d] = Math.max(0, -row.Dual);
  });
  return { hasPoint, values, capacityMultipliers: multipliers, status: solution.Status };
}

/** Rounds an LP point: each item to its option with the largest value (ties to the cheaper). */
export function roundPoint(model: AssignmentModel, read: ReadSolution, subset?: OptionSubset): Int32Array {
  const assign = new Int32Array(model.items.length).fill(-1);
  model.items.forEach((item, i) => {
    const vals = read.values[i]!;
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    let best = vals[positions.length]! + 1e-9; // u wins only when clearly largest
    let bestD = -1;
    positions.forEach((p, k) => {
      if (vals[k]! > best + 1e-9) {
        best = vals[k]!;
        bestD = item.digesters[p]!;
      }
    });
    assign[i] = bestD;
  });
  return assign;
}
