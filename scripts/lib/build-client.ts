/** Builds the client with Vite when its sources changed since the last build (warm starts stay fast). */
import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import path from "node:path";
import { root } from "./project";

const inputs = ["src", "shared", "public", "index.html", "vite.config.ts", "tailwind.config.ts", "package-lock.json"];

function hashTree(hash: ReturnType<typeof createHash>, p: string) {
  if (!existsSync(p)) return;
  const st = statSync(p);
  if (st.isDirectory()) {
    for (const name of readdirSync(p).sort()) hashTree(hash, path.join(p, name));
  } else {
    hash.update(path.relative(root, p));
    hash.update(readFileSync(p));
  }
}

export function sourceHash(extra: Record<string, string | undefined> = {}) {
  const hash = createHash("sha256");
  for (const input of inputs) hashTree(hash, path.join(root, input));
  hash.update(JSON.stringify(extra));
  return hash.digest("hex");
}

export function buildClientIfStale(log: (line: string) => void, outDir = "dist") {
  const marker = path.join(root, outDir, ".source-hash");
  const hash = sourceHash({ tiles: process.env.VITE_TILE_URL });
  if (existsSync(marker) && readFileSync(marker, "utf8") === hash) return false;
  log("Building the client (vite build)…");
  const result = spawnSync(
    process.execPath,
    [path.join(root, "node_modules", "vite", "bin", "vite.js"), "build", "--outDir", outDir, "--emptyOutDir"],
    {
      cwd: root,
      stdio: ["ignore", "inherit", "inherit"],
      env: process.env,
    },
  );
  if (result.status !== 0) throw new Error("The client build failed (see above).");
  writeFileSync(marker, hash);
  return true;
}
