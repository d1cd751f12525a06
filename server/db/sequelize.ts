import { Sequelize } from "sequelize";
import type pg from "pg";
import { env } from "../config/env";
import { logger } from "../lib/logger";

// Sequelize returns NUMERIC columns as strings: repositories cast to float8 in SQL or Number() them.

let instance: Sequelize | undefined;

/** The process's single Sequelize instance (created on first use). */
export function sequelize(): Sequelize {
  if (instance) return instance;
  const e = env();
  instance = new Sequelize(e.DATABASE_URL, {
    dialect: "postgres",
    logging: false,
    pool: { max: e.DATABASE_POOL_MAX, min: 0, idle: 10_000, acquire: 5_000 },
    dialectOptions: {
      // Fail fast while the database is down rather than hanging requests.
      connectionTimeoutMillis: 3_000,
      statement_timeout: 15_000,
    },
    hooks: {
      afterConnect(connection) {
        // Without an error listener a database restart would crash the process.
        (connection as unknown as pg.Client).on("error", (err) =>
          logger.warn({ err: err.message }, "database connection error"),
        );
      },
    },
  });
  return instance;
}

export async function closeDatabase() {
  if (!instance) return;
  const s = instance;
  instance = undefined;
  await s.close();
}
