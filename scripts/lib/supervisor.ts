/**
 * Keeps the server process of `npm start` running: when it dies unexpectedly it is started
 * again after a back-off that doubles with each quick crash (1 s, 2 s, 4 s … 30 s) and goes
 * back to 1 s once the server has run a minute. Each restart is logged.
 */
import type { ChildProcess } from "node:child_process";

export interface BackOff {
  /** The first wait, and the wait after a server that ran at least `stableMs`. */
  firstMs: number;
  /** The longest wait. */
  maxMs: number;
  /** A run this long counts as healthy: the next crash starts the back-off again. */
  stableMs: number;
}

export const RESTART_BACK_OFF: BackOff = { firstMs: 1_000, maxMs: 30_000, stableMs: 60_000 };

/** The wait before the next restart, given the previous wait (none before the first crash) and how long the server ran. */
export function restartDelayMs(
  previousMs: number | undefined,
  uptimeMs: number,
  b: BackOff = RESTART_BACK_OFF,
): number {
  if (previousMs === undefined || uptimeMs >= b.stableMs) return b.firstMs;
  return Math.min(previousMs * 2, b.maxMs);
}

export function describeExit(code: number | null, signal: NodeJS.Signals | null): string {
  return signal ? `killed by ${signal}` : `exit code ${code}`;
}

export interface SupervisorOptions {
  /** Starts one server process with an IPC channel; it sends `{ type: "listening" }` when ready. */
  spawn: () => ChildProcess;
  log: (line: string) => void;
  backOff?: BackOff;
  /** How long a stopping server may take before it is killed (its own deadline is 10 s). */
  stopGraceMs?: number;
}

export class ServerSupervisor {
  private child: ChildProcess | undefined;
  private timer: NodeJS.Timeout | undefined;
  private stopping = false;
  private listenedOnce = false;
  private lastDelayMs: number | undefined;
  private restarts = 0;

  constructor(private readonly options: SupervisorOptions) {}

  /** The running server's pid, if one runs. */
  get pid(): number | undefined {
    return this.child?.pid;
  }

  /** Starts the first server; resolves once it listens, rejects when it exits before (no restart then). */
  start(): Promise<void> {
    return new Promise((resolve, reject) => {
      const child = this.launch();
      const early = (code: number | null, signal: NodeJS.Signals | null) =>
        reject(new Error(`the server exited (${describeExit(code, signal)}) before listening`));
      child.once("exit", early);
      child.on("message", (m: { type?: string }) => {
        if (m?.type !== "listening") return;
        child.off("exit", early);
        resolve();
      });
    });
  }

  private launch(): ChildProcess {
    const { log } = this.options;
    const child = this.options.spawn();
    const startedAt = Date.now();
    this.child = child;
    child.on("message", (m: { type?: string }) => {
      if (m?.type !== "listening") return;
      if (this.listenedOnce) log(`The server is back (process ${child.pid}).`);
      this.listenedOnce = true;
    });
    child.once("exit", (code, signal) => {
      if (this.child === child) this.child = undefined;
      if (this.stopping || !this.listenedOnce) return;
      const uptimeMs = Date.now() - startedAt;
      const delayMs = restartDelayMs(this.lastDelayMs, uptimeMs, this.options.backOff);
      this.lastDelayMs = delayMs;
      this.restarts += 1;
      log(
        `The server stopped unexpectedly (${describeExit(code, signal)}) after ${(uptimeMs / 1000).toFixed(1)} s; ` +
          `restart ${this.restarts} in ${delayMs / 1000} s (PostgreSQL and maildev keep running).`,
      );
      this.timer = setTimeout(() => {
        this.timer = undefined;
        if (!this.stopping) this.launch();
      }, delayMs);
    });
    return child;
  }

  /** Stops restarting, then stops the server (SIGTERM, SIGKILL after the grace period). */
  async stop(): Promise<void> {
    this.stopping = true;
    clearTimeout(this.timer);
    const child = this.child;
    if (!child || child.exitCode !== null || child.signalCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
      setTimeout(() => child.kill("SIGKILL"), this.options.stopGraceMs ?? 12_000).unref();
    });
  }
}
