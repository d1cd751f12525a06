/**
 * Telling which processes are still around from an earlier `npm start`, and stopping them.
 * Reads Linux's /proc (the start command runs on Debian); where /proc is missing each helper
 * degrades to what `process.kill(pid, 0)` can tell.
 */
import { existsSync, readdirSync, readFileSync, readlinkSync } from "node:fs";

/** True while the process exists and is not a zombie (an exited child nobody has reaped yet). */
export function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
  } catch (err) {
    // EPERM: it exists but belongs to someone else.
    if ((err as NodeJS.ErrnoException).code !== "EPERM") return false;
  }
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    return stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3) !== "Z";
  } catch {
    return true;
  }
}

/** The process's command line with arguments separated by spaces (undefined when unknown). */
export function commandLine(pid: number): string | undefined {
  try {
    return readFileSync(`/proc/${pid}/cmdline`, "utf8").split("\0").join(" ").trim();
  } catch {
    return undefined;
  }
}

/** The process's working directory (undefined when unknown). */
export function workingDir(pid: number): string | undefined {
  try {
    return readlinkSync(`/proc/${pid}/cwd`);
  } catch {
    return undefined;
  }
}

/** The process listening on this TCP port on this machine, from /proc/net/tcp{,6} and the processes' open sockets. */
export function listeningPid(port: number): number | undefined {
  const inodes = new Set<string>();
  for (const table of ["/proc/net/tcp", "/proc/net/tcp6"]) {
    if (!existsSync(table)) continue;
    for (const line of readFileSync(table, "utf8").split("\n").slice(1)) {
      // sl local_address rem_address st … inode: "0: 0100007F:0BB8 00000000:0000 0A … 123456"
      const cols = line.trim().split(/\s+/);
      if (cols.length < 10 || cols[3] !== "0A") continue;
      if (parseInt(cols[1]!.split(":")[1]!, 16) === port) inodes.add(cols[9]!);
    }
  }
  if (inodes.size === 0 || !existsSync("/proc")) return undefined;
  for (const entry of readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    let fds: string[];
    try {
      fds = readdirSync(`/proc/${entry}/fd`);
    } catch {
      continue;
    }
    for (const fd of fds) {
      try {
        const match = /^socket:\[(\d+)\]$/.exec(readlinkSync(`/proc/${entry}/fd/${fd}`));
        if (match && inodes.has(match[1]!)) return Number(entry);
      } catch {
        // The descriptor closed while we looked.
      }
    }
  }
  return undefined;
}

/** Resolves true once the process is gone, false when it is still there after `timeoutMs`. */
export async function waitForExit(pid: number, timeoutMs: number): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (isAlive(pid)) {
    if (Date.now() >= deadline) return false;
    await new Promise((r) => setTimeout(r, 100));
  }
  return true;
}

/** Asks a process to stop (SIGTERM), then kills it (SIGKILL) when it is still there after `graceMs`. */
export async function stopProcess(pid: number, graceMs = 5_000): Promise<void> {
  try {
    process.kill(pid, "SIGTERM");
  } catch {
    return;
  }
  if (await waitForExit(pid, graceMs)) return;
  try {
    process.kill(pid, "SIGKILL");
  } catch {
    return;
  }
  await waitForExit(pid, 2_000);
}
