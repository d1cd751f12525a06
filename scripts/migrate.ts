/** `npm run db:migrate`: applies pending migrations to DATABASE_URL. */
import { loadDotEnv, log } from "./lib/project";

loadDotEnv();
const { migrateUp } = await import("../server/db/migrator");
const { closeDatabase } = await import("../server/db/sequelize");
const applied = await migrateUp();
log(applied.length ? `Applied: ${applied.map((m) => m.name).join(", ")}` : "Nothing to apply.");
await closeDatabase();
