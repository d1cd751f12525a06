import { afterAll, beforeAll, beforeEach } from "vitest";
import { migrateUp } from "../../server/db/migrator";
import { closeDatabase, sequelize } from "../../server/db/sequelize";

// Each server test file gets the migrated schema (idempotent: pending migrations only).
beforeAll(async () => {
  await migrateUp();
});

// Every supertest request comes from 127.0.0.1, so per-IP throttle counts (failed sign-ins, reset
// requests) would carry from one test into the next: each test starts without any, as it starts
// with fresh rows. Tests of the limits themselves count within one test, from their own addresses.
beforeEach(async () => {
  await sequelize().query(`DELETE FROM rate_limit_hits`);
});

afterAll(async () => {
  await closeDatabase();
});
