import { afterAll, beforeAll } from "vitest";
import { migrateUp } from "../../server/db/migrator";
import { closeDatabase } from "../../server/db/sequelize";

// Each server test file gets the migrated schema (idempotent: pending migrations only).
beforeAll(async () => {
  await migrateUp();
});

afterAll(async () => {
  await closeDatabase();
});
