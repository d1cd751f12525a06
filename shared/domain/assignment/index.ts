/**
 * Households → digesters: the scheduler's assignment (PRODUCT.md §5).
 *
 * The problem is a generalised assignment problem (GAP): each household h
 * brings w_h kg a week and goes to one digester d whose weekly room R_d
 * (the sum of its next 7 days' feed budgets, computed by the caller) must
 * not be exceeded; minimise total walking distance Σ c_hd x_hd. An
 * "unplaced" variable u_h with a penalty P_h larger than any distance makes
 * the model always feasible and places as many kilograms as possible:
 *
 *   min  Σ_hd c_hd x_hd + Σ_h P_h u_h
 *   s.t. Σ_d x_hd + u_h = 1          for every household h      (a_h)
 *        Σ_h w_h x_hd ≤ R_d          for every digester d       (c_d)
 *        x_hd, u_h ∈ {0, 1}; x_hd exists only for allowed pairs
 *        (digester available, within the optional walking limit).
 *
 * Sources: GAP and its Lagrangian bound — Ross & Soland 1975, "A branch
 * and bound algorithm for the generalized assignment problem", Math.
 * Programming 8:91 [memory]; regret-based construction — Martello & Toth
 * 1981, "An algorithm for the generalized assignment problem", Operational
 * Research '81, pp. 589–603 [memory]; reduced-cost fixing — standard LP
 * duality, e.g. Nemhauser & Wolsey 1988, *Integer and Combinatorial
 * Optimization*, §II.4 [memory]. The MIP and LP are solved by HiGHS
 * (Huangfu & Hall 2018, Math. Prog. Comp. 10:119 [memory]), which the
 * caller injects so that `shared/` stays free of the wasm package.
 *
 * How it is solved (both paths end with an answer that is feasible by
 * construction and checked in code):
 * 1. LP relaxation with HiGHS → fractional x and capacity duals y_d ≤ 0.
 *    Large networks first run subgradient steps on the Lagrangian bound
 *    over all pairs (cheap, in JS) and keep, per household, the k options
 *    of smallest reduced cost (default 5) plus any priced back in by the
 *    LP duals — the LP optimum lives on small reduced costs, which k
 *    nearest digesters alone miss when nearby digesters are full.
 * 2. Lagrangian bound with v_d = max(0, −y_d): for ANY v ≥ 0,
 *      LB(v) = Σ_h min(P_h, min_d (c_hd + w_h v_d)) − Σ_d v_d R_d
 *    is a valid lower bound on every feasible plan (relax the capacity
 *    rows), so the reported bound never depends on the LP being exact or on
 *    the candidate pruning. With optimal LP duals it equals the LP bound.
 * 3. Round each household to its largest x, repair overloads by regret,
 *    improve by relocate and swap moves, and keep the better of this and
 *    the nearest-with-room baseline (so the answer is never worse than it);
 *    then "polish": HiGHS solves a small MIP over the options of smallest
 *    reduced cost (a heuristic, a few seconds at most).
 * 4. Exact path only: reduced-cost fixing — a pair whose reduced cost
 *    c_hd + w_h v_d − L_h exceeds UB − LB cannot appear in any plan better
 *    than the incumbent (c·x ≥ LB + Σ reduced costs of the pairs used), so
 *    it is removed; households left with one option are fixed; the rest
 *    splits into independent parts (households linked by shared digesters)
 *    and HiGHS solves each part's MIP to a zero gap, with the incumbent as
 *    cutoff (costs are whole decimetres, so an absolute gap below 0.1 m is
 *    proof). If a time limit stops it, the best plan is returned with its
 *    gap to the bound and `provenOptimal: false`.
 * Distances are rounded to whole decimetres inside the model; reported
 * distances are the unrounded haversine metres.
 *
 * The result says what it has to say as codes with parameters (messages.ts),
 * never in sentences: each audience words them itself.
 *
 * Files: input.ts (what is given), messages.ts (codes), result.ts (what is
 * returned, and its assembly), prepare.ts (validation, pins, candidate pairs,
 * penalty), model.ts (the core GAP), model-writer.ts (CPLEX LP text),
 * solution-reader.ts (HiGHS answers), solver-seam.ts (the injected HiGHS),
 * relaxation.ts (LP with pricing), bounds.ts (Lagrangian bound, subgradient,
 * reduced costs), heuristics.ts (baseline, repair, local search),
 * restricted-mip.ts (polish and the exact core), solve.ts (the entry points),
 * audit.ts (checks a plan against its input). Import from this index.
 */

export type { HighsColumnLike, HighsOptionsLike, HighsRowLike, HighsSolutionLike, LpSolver } from "./solver-seam";
export type { AssignmentDigester, AssignmentHousehold, AssignmentInput, AssignmentOptions } from "./input";
export type {
  AssignmentMessage,
  AssignmentMessageCode,
  PinContradiction,
  PinContradictionKind,
  UnplacedHousehold,
  UnplacedReason,
  UnplacedSuggestion,
} from "./messages";
export type { AssignmentMethod, AssignmentResult, DigesterLoad, HouseholdAssignment } from "./result";
export type { AssignmentModel, ModelItem, OptionSubset } from "./model";
export { buildAssignmentLp } from "./model-writer";
export { type ReadSolution, readAssignmentSolution } from "./solution-reader";
export { improveMultipliers, lagrangianBound } from "./bounds";
export { PENALTY_FLOOR_KG, prepareAssignmentModel, unplacedPenaltyM } from "./prepare";
export { nearestWithRoomBaseline, solveAssignment } from "./solve";
export { auditAssignment } from "./audit";
