/**
 * The solver seam: the structural part of highs-js the assignment model needs, so that
 * `shared/` stays free of the wasm package (the caller injects HiGHS; README decision 22).
 */

/** One column of a HiGHS solution; `Primal` is missing when the solve produced no point. */
export interface HighsColumnLike {
  readonly Primal?: number;
  readonly Index?: number;
}

/** One row of a HiGHS solution (model order); `Dual` is present for LP solves. */
export interface HighsRowLike {
  readonly Dual?: number;
  readonly Name?: string;
  readonly Primal?: number;
  readonly Index?: number;
}

/**
 * The part of highs-js's `HighsSolution` (`highs.solve(lpText, options)`)
 * read here: status text, objective, columns by name, rows in model order.
 */
export interface HighsSolutionLike {
  readonly Status: string;
  readonly ObjectiveValue: number;
  readonly Columns: Readonly<Record<string, HighsColumnLike>>;
  readonly Rows?: readonly HighsRowLike[];
}

/** HiGHS options this module sets (names as in HiGHS; see highs-js `types.d.ts`). */
export interface HighsOptionsLike {
  readonly output_flag?: boolean;
  readonly time_limit?: number;
  readonly mip_rel_gap?: number;
  readonly mip_abs_gap?: number;
  readonly presolve?: "off" | "choose" | "on";
  readonly solver?: "choose" | "simplex" | "ipm";
  /** For a MIP, HiGHS's upper limit on the objective: only better plans are searched for. */
  readonly objective_bound?: number;
}

/**
 * Solves CPLEX-LP text. The caller builds it from highs-js, e.g.
 * `const highs = await (await import("highs")).default();
 *  const solver: LpSolver = (lp, o) => highs.solve(lp, o);`
 * It may throw; `solveAssignment` then falls back and says so (code `solverGaveNoPlan`).
 */
export type LpSolver = (lpText: string, options?: HighsOptionsLike) => HighsSolutionLike;

/**
 * Calls the injected solver, turning a throw into `{ error }` (the exception's own text, kept
 * as a parameter), so a failing HiGHS never ends a solve: the caller falls back.
 */
export function callSolver(
  solver: LpSolver,
  lp: string,
  options: HighsOptionsLike,
): HighsSolutionLike | { error: string } {
  try {
    return solver(lp, options);
  } catch (e) {
    return { error: e instanceof Error ? e.message : String(e) };
  }
}
