#!/usr/bin/env node
// Entry point of `npm start`, `npm test` and `npm run serve`. Plain JavaScript with no
// dependencies, because it runs before node_modules exists: it installs the npm packages
// when they are missing or stale, then hands over to the TypeScript script through tsx.
import { spawnSync, spawn } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const command = process.argv[2];
const scripts = { start: "scripts/start.ts", test: "scripts/test.ts", serve: "scripts/serve.ts" };
if (!scripts[command]) {
  console.error(`Usage: node scripts/bootstrap.mjs <${Object.keys(scripts).join("|")}>`);
  process.exit(2);
}

const [major, minor] = process.versions.node.split(".").map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(`Hearthloop needs Node.js 20.19 or newer; this is ${process.version}.`);
  process.exit(1);
}

const lockFile = path.join(root, "package-lock.json");
const marker = path.join(root, "node_modules", ".hearthloop-lock-hash");
const lockHash = createHash("sha256").update(readFileSync(lockFile)).digest("hex");
const installed = existsSync(marker) ? readFileSync(marker, "utf8").trim() : "";
if (installed !== lockHash) {
  console.log("Installing npm packages (npm ci)…");
  const result = spawnSync("npm", ["ci", "--no-audit", "--no-fund"], { cwd: root, stdio: "inherit" });
  if (result.status !== 0) {
    console.error("npm ci failed: see the messages above.");
    process.exit(result.status ?? 1);
  }
  writeFileSync(marker, lockHash);
}

const child = spawn(process.execPath, ["--import", "tsx", scripts[command], ...process.argv.slice(3)], {
  cwd: root,
  stdio: "inherit",
});
// The child handles SIGINT, SIGTERM and SIGHUP itself (it stops what it started): forward
// them and wait for it, instead of dying first and leaving it to run on unseen.
process.stdout.on("error", () => undefined);
process.stderr.on("error", () => undefined);
for (const signal of ["SIGINT", "SIGTERM", "SIGHUP"]) process.on(signal, () => child.kill(signal));
child.on("exit", (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
