/**
 * The real server as a child process (`node --import tsx server/index.ts`), for tests of what
 * only a process shows: signals, shutdown, the database going away. It inherits the test
 * environment (DATABASE_URL, SMTP_URL …) and listens on an ephemeral port on loopback.
 */
import { fork, type ChildProcess } from "node:child_process";
import path from "node:path";

const children: ChildProcess[] = [];

/** Starts server/index.ts; resolves with the child and its port once it listens. */
export async function startServerProcess(
  env: Record<string, string> = {},
): Promise<{ child: ChildProcess; port: number }> {
  const child = fork(path.resolve("server/index.ts"), [], {
    execArgv: ["--import", "tsx"],
    env: {
      ...process.env,
      PORT: "0",
      HOST: "127.0.0.1",
      JOBS_ENABLED: "false",
      LOG_LEVEL: "silent",
      CLIENT_DIST: "no-client",
      ...env,
    },
    stdio: ["ignore", "ignore", "inherit", "ipc"],
  });
  children.push(child);
  const port = await new Promise<number>((resolve, reject) => {
    child.on("message", (m: { type?: string; port?: number }) => m?.type === "listening" && resolve(m.port!));
    child.once("exit", (code) => reject(new Error(`server exited early with ${code}`)));
  });
  return { child, port };
}

/** Kills every server child still running (call from afterEach). */
export function killServerProcesses() {
  for (const c of children.splice(0)) if (c.exitCode === null && c.signalCode === null) c.kill("SIGKILL");
}

/** Resolves with the exit code and the milliseconds from `since` to the exit. */
export function exitOf(child: ChildProcess, since = Date.now()): Promise<{ code: number | null; ms: number }> {
  return new Promise((resolve) => {
    if (child.exitCode !== null) return resolve({ code: child.exitCode, ms: 0 });
    child.once("exit", (code) => resolve({ code, ms: Date.now() - since }));
  });
}
