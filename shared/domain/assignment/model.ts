/**
 * The optimisation core of the assignment, as the model writer, the bounds and the heuristics
 * see it: items (households left to optimise) with their allowed digesters by index, costs in
 * whole decimetres, and the room left per digester.
 */

/** One household in the optimisation core: options sorted by cost, ascending. */
export interface ModelItem {
  readonly kg: number;
  /** Cost of staying unplaced, decimetres. */
  readonly penaltyDm: number;
  /** Allowed digester indices, nearest first. */
  readonly digesters: Int32Array;
  /** Walking distance to each, whole decimetres. */
  readonly costsDm: Float64Array;
}

/** The core GAP: items (free households) and residual room per digester index. */
export interface AssignmentModel {
  readonly items: readonly ModelItem[];
  /** Room left per digester after kept pins, kg; 0 for digesters that take nobody. */
  readonly roomKg: readonly number[];
}

/** Options of one item chosen for an LP, as positions into `ModelItem.digesters`. */
export type OptionSubset = readonly (readonly number[])[];

/** Tolerance on kilograms when checking room, kg [judgement: far below any weighed amount]. */
export const KG_EPS = 1e-7;

/**
 * Cost of item `item` at digester index `d` (−1 = unplaced: its penalty), decimetres;
 * Infinity when the pair is not allowed. A scan of the item's options.
 */
export function costOf(item: ModelItem, d: number): number {
  if (d < 0) return item.penaltyDm;
  for (let p = 0; p < item.digesters.length; p++) if (item.digesters[p] === d) return item.costsDm[p]!;
  return Infinity;
}

/** Model objective of a plan (`assign[i]` = digester index or −1): Σ costs + penalties, decimetres. */
export function planObjectiveDm(model: AssignmentModel, assign: Int32Array): number {
  let s = 0;
  model.items.forEach((item, i) => {
    s += costOf(item, assign[i]!);
  });
  return s;
}
