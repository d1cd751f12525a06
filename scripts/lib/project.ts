import { existsSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..", "..");

/** Reads `.env` once when present (Node's own parser); real environment variables win. */
export function loadDotEnv() {
  const file = path.join(root, ".env");
  if (existsSync(file)) process.loadEnvFile(file);
}

export const demoSignIns = [
  { role: "resident", email: "resident@example.org" },
  { role: "steward", email: "steward@example.org" },
  { role: "coordinator", email: "coordinator@example.org" },
  { role: "gardener", email: "gardener@example.org" },
] as const;
export const demoPassword = "hearthloop-demo";

export function log(line: string) {
  console.log(`[hearthloop] ${line}`);
}
