/**
 * `npm run serve`: production start. Uses the configured DATABASE_URL and SMTP_URL, applies
 * migrations, builds the client when stale and serves it. Never creates accounts or demo data.
 */
import { loadDotEnv, log } from "./lib/project";
import { buildClientIfStale } from "./lib/build-client";

loadDotEnv();
process.env.NODE_ENV ??= "production";
process.env.DEMO_MODE = "false";

const { parseEnv, EnvError } = await import("../server/config/env");
try {
  parseEnv();
} catch (err) {
  console.error(err instanceof EnvError ? err.message : err);
  process.exit(1);
}
const { migrateUp } = await import("../server/db/migrator");
const { closeDatabase } = await import("../server/db/sequelize");
await migrateUp();
await closeDatabase();
buildClientIfStale(log);
await import("../server/index");
