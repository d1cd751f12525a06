import type { LpSolver } from "../../../shared/domain/assignment";

let solverPromise: Promise<LpSolver> | null = null;

/**
 * HiGHS (WebAssembly) loaded once per process: instantiating it costs tens of milliseconds,
 * solving a neighbourhood far less. A failed load is retried on the next call.
 */
export function highsSolver(): Promise<LpSolver> {
  solverPromise ??= (async () => {
    const highs = await (await import("highs")).default();
    const solver: LpSolver = (lp, options) => highs.solve(lp, options);
    return solver;
  })().catch((err: unknown) => {
    solverPromise = null;
    throw err;
  });
  return solverPromise;
}
