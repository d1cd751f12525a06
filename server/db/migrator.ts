import { Umzug, SequelizeStorage } from "umzug";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import type { QueryInterface } from "sequelize";
import { sequelize } from "./sequelize";

const here = path.dirname(fileURLToPath(import.meta.url));

export interface Migration {
  up: (ctx: { context: QueryInterface }) => Promise<void>;
  down: (ctx: { context: QueryInterface }) => Promise<void>;
}

/** Umzug over server/db/migrations; the import() happens here so Vitest and tsx both load .ts files. */
export function migrator() {
  const db = sequelize();
  return new Umzug({
    migrations: {
      glob: ["migrations/*.ts", { cwd: here }],
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () =>
          ((await import(pathToFileURL(file!).href)) as { migration: Migration }).migration.up({ context }),
        down: async () =>
          ((await import(pathToFileURL(file!).href)) as { migration: Migration }).migration.down({ context }),
      }),
    },
    context: db.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize: db, tableName: "schema_migrations" }),
    logger: undefined,
  });
}

export async function migrateUp() {
  return migrator().up();
}
