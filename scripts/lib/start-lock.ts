/**
 * The lock of `npm start` (`.data/start.pid`): which supervisor runs from this folder. Created
 * atomically, so two starts at once cannot both win; a lock whose process is gone, or is some
 * other program that got the same pid, is stale and taken over.
 */
import { readFileSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { commandLine, isAlive, workingDir } from "./processes";

export interface StartLock {
  pid: number;
  /** The project folder the supervisor runs from. */
  root: string;
  startedAt: string;
}

/** Reads the lock; an older lock holding only a pid is read too. Undefined when missing or unreadable. */
export function readLock(file: string): StartLock | undefined {
  let text: string;
  try {
    text = readFileSync(file, "utf8").trim();
  } catch {
    return undefined;
  }
  if (/^\d+$/.test(text)) return { pid: Number(text), root: "", startedAt: "" };
  try {
    const lock = JSON.parse(text) as Partial<StartLock>;
    return Number.isInteger(lock.pid) && lock.pid! > 0
      ? { pid: lock.pid!, root: lock.root ?? "", startedAt: lock.startedAt ?? "" }
      : undefined;
  } catch {
    return undefined;
  }
}

/** True when `pid` is a live `npm start` supervisor of this folder (not a process that reuses its pid). */
export function isSupervisorOf(pid: number, root: string): boolean {
  if (!isAlive(pid)) return false;
  const cmd = commandLine(pid);
  if (cmd !== undefined && !/scripts[/\\]start\.ts\b/.test(cmd)) return false;
  const cwd = workingDir(pid);
  return cwd === undefined || path.resolve(cwd) === path.resolve(root);
}

export type LockResult = { acquired: true; stale?: StartLock } | { acquired: false; holder: StartLock };

/** Takes the lock for this process, taking over a stale one; refuses while another supervisor runs. */
export function acquireLock(file: string, root: string): LockResult {
  const mine = JSON.stringify({ pid: process.pid, root, startedAt: new Date().toISOString() } satisfies StartLock);
  let stale: StartLock | undefined;
  for (let attempt = 0; attempt < 3; attempt += 1) {
    try {
      writeFileSync(file, `${mine}\n`, { flag: "wx" });
      return { acquired: true, stale };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
    }
    const holder = readLock(file);
    if (holder && holder.pid !== process.pid && isSupervisorOf(holder.pid, root)) return { acquired: false, holder };
    stale = holder ?? stale;
    rmSync(file, { force: true });
  }
  throw new Error(`could not create the lock file ${file}`);
}

/** Removes the lock when it is this process's (never another supervisor's). */
export function releaseLock(file: string) {
  if (readLock(file)?.pid === process.pid) rmSync(file, { force: true });
}
