/**
 * Worker thread that runs the assignment solver (HiGHS, WebAssembly) off the request thread: a
 * large or tight neighbourhood can keep HiGHS busy for seconds, and the event loop must keep
 * answering everyone else meanwhile. One message in, one answer out, one solve at a time.
 */
import { parentPort } from "node:worker_threads";
import { type LpSolver, solveAssignment } from "../../../shared/domain/assignment";
import type { SolveRequest, SolveResponse } from "./solver-pool";

const port = parentPort;
if (!port) throw new Error("solve-worker.ts runs only as a worker thread");

// Loaded once, on the first message (no top-level await: tsx may load this file as CommonJS).
let solverReady: Promise<LpSolver> | null = null;
function loadSolver(): Promise<LpSolver> {
  solverReady ??= import("highs").then(async (m) => {
    const highs = await m.default();
    const solver: LpSolver = (lp, options) => highs.solve(lp, options);
    return solver;
  });
  return solverReady;
}

// Messages are handled one after another: each waits for the previous answer.
let queue: Promise<void> = Promise.resolve();
port.on("message", (message: SolveRequest) => {
  queue = queue.then(() => answer(message));
});

async function answer(message: SolveRequest): Promise<void> {
  let answer: SolveResponse;
  const started = performance.now();
  try {
    const solver = await loadSolver();
    const result = solveAssignment(message.input, solver, message.options);
    answer = { id: message.id, ok: true, result, solveMs: performance.now() - started };
  } catch (err) {
    answer = { id: message.id, ok: false, error: err instanceof Error ? err.message : String(err) };
  }
  port!.postMessage(answer);
  // solveAssignment catches HiGHS's own failures; anything that still escaped may have left the
  // WebAssembly instance in a bad state, so this worker ends and the pool starts a fresh one.
  if (!answer.ok) process.exit(1);
}
