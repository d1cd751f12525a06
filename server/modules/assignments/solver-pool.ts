/**
 * The assignment solver on its own worker thread (see solve-worker.ts): one long-lived worker
 * per process, started on first use or by {@link warmUpSolver} at boot, restarted after a crash
 * or a hard timeout. Requests queue in the worker; each answer comes back by id.
 */
import { createRequire } from "node:module";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import type { AssignmentInput, AssignmentOptions, AssignmentResult } from "../../../shared/domain/assignment";
import { AppError } from "../../lib/app-error";

export interface SolveRequest {
  readonly id: number;
  readonly input: AssignmentInput;
  readonly options: AssignmentOptions;
}

export type SolveResponse =
  | { readonly id: number; readonly ok: true; readonly result: AssignmentResult; readonly solveMs: number }
  | { readonly id: number; readonly ok: false; readonly error: string };

interface Pending {
  resolve: (answer: { result: AssignmentResult; solveMs: number }) => void;
  reject: (err: Error) => void;
  timer: NodeJS.Timeout;
  /** The worker the request went to: only its failure fails the request. */
  worker: Worker;
}

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, Pending>();

function failAll(w: Worker, err: Error) {
  for (const [id, p] of pending) {
    if (p.worker !== w) continue;
    clearTimeout(p.timer);
    p.reject(err);
    pending.delete(id);
  }
}

/** tsx's ESM API, resolved from this file (an eval'd worker would resolve bare names from the cwd). */
function tsxApiUrl(): string {
  const tsxRoot = path.dirname(createRequire(import.meta.url).resolve("tsx/package.json"));
  return pathToFileURL(path.join(tsxRoot, "dist/esm/api/index.mjs")).href;
}

function getWorker(): Worker {
  if (worker) return worker;
  // The server runs TypeScript through tsx, whose loader hooks are per thread: the worker registers
  // them itself before importing the TypeScript file (also under vitest, which uses its own loader).
  const file = new URL("./solve-worker.ts", import.meta.url).href;
  const bootstrap = `import(${JSON.stringify(tsxApiUrl())}).then((tsx) => { tsx.register(); return import(${JSON.stringify(file)}); })`;
  const w = new Worker(bootstrap, { eval: true });
  w.on("message", (answer: SolveResponse) => {
    const p = pending.get(answer.id);
    if (!p) return;
    pending.delete(answer.id);
    clearTimeout(p.timer);
    if (answer.ok) p.resolve({ result: answer.result, solveMs: answer.solveMs });
    else p.reject(new Error(`the scheduler failed: ${answer.error}`));
  });
  w.on("error", (err) => {
    if (worker === w) worker = null;
    failAll(w, err);
  });
  w.on("exit", (code) => {
    if (worker === w) worker = null;
    failAll(w, new Error(`the scheduler's worker stopped (exit code ${code})`));
  });
  // An idle worker must not keep the process alive at shutdown; a request in flight keeps it alive anyway.
  w.unref();
  worker = w;
  return w;
}

/**
 * Solves an assignment on the worker thread. Rejects with a 503 when the worker does not answer
 * within `hardLimitMs` (the worker is then stopped and a fresh one serves the next request).
 */
export function solveOffThread(
  input: AssignmentInput,
  options: AssignmentOptions,
  hardLimitMs = 120_000,
): Promise<{ result: AssignmentResult; solveMs: number }> {
  const w = getWorker();
  const id = nextId++;
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      pending.delete(id);
      reject(
        new AppError(
          503,
          "scheduler_timeout",
          "The scheduler took too long for this network. Try again, or exclude digesters or set a walking limit to make the problem smaller.",
        ),
      );
      if (worker === w) worker = null;
      void w.terminate();
    }, hardLimitMs);
    pending.set(id, { resolve, reject, timer, worker: w });
    w.postMessage({ id, input, options } satisfies SolveRequest);
  });
}

/**
 * One untimed solve of a small tight instance at boot: HiGHS's first solves in a process are
 * several times slower than later ones (WebAssembly compilation and warm-up), and the first
 * coordinator of the day should not pay for that. Failures are only reported.
 */
export async function warmUpSolver(): Promise<number> {
  const households = Array.from({ length: 60 }, (_, i) => ({
    id: `h${i}`,
    lat: 52 + ((i * 37) % 60) * 0.0003,
    lng: 5 + ((i * 53) % 60) * 0.0005,
    weeklyKg: 1 + ((i * 7) % 10) * 0.5,
  }));
  const total = households.reduce((s, h) => s + h.weeklyKg, 0);
  const digesters = Array.from({ length: 4 }, (_, j) => ({
    id: `d${j}`,
    lat: 52 + j * 0.005,
    lng: 5 + ((j * 3) % 4) * 0.007,
    weeklyRoomKg: (total * 1.1) / 4,
    available: true,
  }));
  const { solveMs } = await solveOffThread({ households, digesters }, { timeLimitS: 10 });
  return solveMs;
}

/** Stops the worker (graceful shutdown, tests). */
export async function stopSolver(): Promise<void> {
  const w = worker;
  worker = null;
  if (w) await w.terminate();
}
