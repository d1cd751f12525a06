/** Starts maildev (SMTP fake + web inbox) on loopback as a child process and waits for it. */
import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";

export interface MailDevHandle {
  child: ChildProcess;
  stop: () => Promise<void>;
}

async function healthy(webPort: number) {
  try {
    const res = await fetch(`http://127.0.0.1:${webPort}/api/healthz`);
    return res.ok;
  } catch {
    return false;
  }
}

/** Returns undefined when a maildev already answers on the web port (reused, not ours to stop). */
export async function startMailDev(
  smtpPort: number,
  webPort: number,
  root: string,
): Promise<MailDevHandle | undefined> {
  if (await healthy(webPort)) return undefined;
  const pkgFile = path.join(root, "node_modules", "maildev", "package.json");
  const pkg = JSON.parse(readFileSync(pkgFile, "utf8")) as { bin: Record<string, string> };
  const bin = path.join(path.dirname(pkgFile), pkg.bin.maildev!);
  const child = spawn(
    process.execPath,
    [
      bin,
      "--smtp",
      String(smtpPort),
      "--web",
      String(webPort),
      "--ip",
      "127.0.0.1",
      "--web-ip",
      "127.0.0.1",
      "--silent",
    ],
    { cwd: root, stdio: ["ignore", "ignore", "pipe"] },
  );
  let stderr = "";
  child.stderr?.on("data", (d) => (stderr += String(d)));
  const deadline = Date.now() + 15_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`maildev exited: ${stderr.trim().split("\n").slice(-2).join(" ")}`);
    if (await healthy(webPort)) break;
    await new Promise((r) => setTimeout(r, 150));
  }
  if (!(await healthy(webPort))) {
    child.kill("SIGTERM");
    throw new Error(`maildev did not answer on port ${webPort} within 15 s`);
  }
  return {
    child,
    stop: () =>
      new Promise<void>((resolve) => {
        // Already gone (Ctrl-C reaches maildev too): exitCode stays null when a signal ended it.
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once("exit", () => resolve());
        child.kill("SIGTERM");
        setTimeout(() => child.kill("SIGKILL"), 3_000).unref();
      }),
  };
}
