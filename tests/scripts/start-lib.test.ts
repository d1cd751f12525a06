/**
 * The pieces of the start command's supervisor that can be checked without booting the stack:
 * the restart back-off, the lock (stale, not ours, held), telling a live postmaster from a
 * stale `postmaster.pid`, and finding who listens on a port.
 */
import { afterEach, describe, expect, it } from "vitest";
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { restartDelayMs, RESTART_BACK_OFF } from "../../scripts/lib/supervisor";
import { acquireLock, isSupervisorOf, readLock, releaseLock } from "../../scripts/lib/start-lock";
import { postmasterState } from "../../scripts/lib/postgres";
import { isAlive, listeningPid } from "../../scripts/lib/processes";

const root = path.resolve(".");
const cleanups: Array<() => void> = [];
afterEach(() => {
  for (const c of cleanups.splice(0)) c();
});

function tempDir() {
  const dir = mkdtempSync(path.join(os.tmpdir(), "hearthloop-start-"));
  cleanups.push(() => rmSync(dir, { recursive: true, force: true }));
  return dir;
}

/** A pid that is certainly not running: a child that has exited and been reaped. */
async function deadPid(): Promise<number> {
  const child = spawn(process.execPath, ["-e", ""]);
  await new Promise((r) => child.once("exit", r));
  return child.pid!;
}

/** A live process whose command line names scripts/start.ts and whose working folder is the project: a supervisor to the lock. */
async function fakeSupervisor(): Promise<ChildProcess> {
  const child = spawn(process.execPath, ["-e", "setInterval(() => {}, 1000)", "scripts/start.ts"], { cwd: root });
  cleanups.push(() => child.kill("SIGKILL"));
  await new Promise((r) => child.once("spawn", r));
  return child;
}

describe("restart back-off", () => {
  it("when the server keeps dying quickly, then the waits double from 1 s and stop growing at 30 s", () => {
    const waits: number[] = [];
    let previous: number | undefined;
    for (let i = 0; i < 8; i += 1) waits.push((previous = restartDelayMs(previous, 2_000)));
    expect(waits).toEqual([1_000, 2_000, 4_000, 8_000, 16_000, 30_000, 30_000, 30_000]);
  });

  it("when the server ran a minute before dying, then the next wait is 1 s again", () => {
    expect(restartDelayMs(30_000, RESTART_BACK_OFF.stableMs)).toBe(1_000);
    expect(restartDelayMs(30_000, RESTART_BACK_OFF.stableMs - 1)).toBe(30_000);
  });
});

describe("the start lock", () => {
  it("when no lock exists, then this process takes it and removes it on release", () => {
    const file = path.join(tempDir(), "start.pid");
    expect(acquireLock(file, root)).toEqual({ acquired: true, stale: undefined });
    expect(readLock(file)).toMatchObject({ pid: process.pid, root });
    releaseLock(file);
    expect(readLock(file)).toBeUndefined();
  });

  it("when the lock names a process that is gone, then it is stale and taken over", async () => {
    const file = path.join(tempDir(), "start.pid");
    const pid = await deadPid();
    writeFileSync(file, `${pid}\n`); // the older format: only a pid
    const result = acquireLock(file, root);
    expect(result).toMatchObject({ acquired: true, stale: { pid } });
    expect(readLock(file)?.pid).toBe(process.pid);
  });

  it("when the lock names a live process that is not a supervisor (a reused pid), then it is stale and taken over", () => {
    const file = path.join(tempDir(), "start.pid");
    // The parent of this test worker runs vitest, not scripts/start.ts.
    writeFileSync(file, JSON.stringify({ pid: process.ppid, root, startedAt: "2026-01-01T00:00:00Z" }));
    expect(isAlive(process.ppid)).toBe(true);
    expect(isSupervisorOf(process.ppid, root)).toBe(false);
    expect(acquireLock(file, root)).toMatchObject({ acquired: true, stale: { pid: process.ppid } });
  });

  it("when a live supervisor of this folder holds the lock, then it is refused and the lock is left alone", async () => {
    const file = path.join(tempDir(), "start.pid");
    const other = await fakeSupervisor();
    const content = JSON.stringify({ pid: other.pid, root, startedAt: "2026-01-01T00:00:00Z" });
    writeFileSync(file, content);
    expect(acquireLock(file, root)).toMatchObject({ acquired: false, holder: { pid: other.pid } });
    releaseLock(file);
    expect(readFileSync(file, "utf8")).toBe(content);
  });

  it("when the supervisor runs from another folder, then it is not this folder's", async () => {
    const other = await fakeSupervisor();
    expect(isSupervisorOf(other.pid!, root)).toBe(true);
    expect(isSupervisorOf(other.pid!, tempDir())).toBe(false);
  });
});

describe("a cluster's postmaster.pid", () => {
  it("when it names a process that is gone or is not this folder's postgres, then it is stale; without it there is none", async () => {
    const dir = tempDir();
    expect(postmasterState(dir)).toBe("none");
    const pidFile = (pid: number) => `${pid}\n${dir}\n1767225600\n54329\n\n127.0.0.1\n  1234   5678\nready   \n`;
    writeFileSync(path.join(dir, "postmaster.pid"), pidFile(await deadPid()));
    expect(postmasterState(dir)).toBe("stale");
    writeFileSync(path.join(dir, "postmaster.pid"), pidFile(process.pid));
    expect(postmasterState(dir)).toBe("stale");
  });

  it("when it is the running test cluster's, then it is running", () => {
    // The test run's own cluster (scripts/test.ts keeps it in .data/pg-test).
    expect(postmasterState(path.join(root, ".data", "pg-test"))).toBe("running");
  });
});

describe("who listens on a port", () => {
  it("when this process listens on a port, then listeningPid names it; a closed port names nobody", async () => {
    const server = net.createServer();
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
    const { port } = server.address() as net.AddressInfo;
    expect(listeningPid(port)).toBe(process.pid);
    await new Promise<void>((resolve) => server.close(() => resolve()));
    expect(listeningPid(port)).toBeUndefined();
  });
});
