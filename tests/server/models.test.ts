import { describe, expect, it } from "vitest";
import type { ModelAttributeColumnOptions } from "sequelize";
import { models } from "../../server/db/models";
import { sql } from "../helpers/db";

/** umzug's own bookkeeping table: not the app's data, so it has no model. */
const NOT_APP_TABLES = new Set(["schema_migrations"]);

interface DbColumn {
  table_name: string;
  column_name: string;
  data_type: string;
  udt_name: string;
  is_nullable: "YES" | "NO";
  numeric_precision: number | null;
  numeric_scale: number | null;
  character_maximum_length: number | null;
}

/** The column's type as PostgreSQL names it (`format_type` style), from information_schema. */
function dbType(c: DbColumn): string {
  if (c.data_type === "USER-DEFINED") return c.udt_name;
  if (c.data_type === "ARRAY") return `${c.udt_name.replace(/^_/, "")}[]`;
  if (c.data_type === "numeric") return `numeric(${c.numeric_precision},${c.numeric_scale})`;
  if (c.data_type === "character varying" && c.character_maximum_length !== null)
    return `character varying(${c.character_maximum_length})`;
  return c.data_type;
}

/** The same name for a model attribute's Sequelize type. */
function modelType(type: ModelAttributeColumnOptions["type"]): string {
  if (typeof type === "string") {
    const t = type.toLowerCase().replace(/\(6\)/, "");
    return t === "varchar" ? "character varying" : t;
  }
  const dt = type as unknown as {
    key: string;
    options?: { precision?: number; scale?: number; length?: number };
    type?: ModelAttributeColumnOptions["type"];
  };
  switch (dt.key) {
    case "INTEGER":
      return "integer";
    case "BIGINT":
      return "bigint";
    case "TEXT":
      return "text";
    case "STRING":
      return `character varying(${dt.options?.length ?? 255})`;
    case "DOUBLE PRECISION":
      return "double precision";
    case "DECIMAL":
      return `numeric(${dt.options?.precision},${dt.options?.scale})`;
    case "DATEONLY":
      return "date";
    case "DATE":
      return "timestamp with time zone";
    case "BOOLEAN":
      return "boolean";
    case "CITEXT":
      return "citext";
    case "JSON":
      return "json";
    case "JSONB":
      return "jsonb";
    case "ARRAY":
      return `${modelType(dt.type!)}[]`;
    default:
      return `unknown Sequelize type ${dt.key}`;
  }
}

async function dbColumns(): Promise<Map<string, DbColumn[]>> {
  const rows = await sql<DbColumn>(
    `SELECT table_name, column_name, data_type, udt_name, is_nullable, numeric_precision, numeric_scale,
            character_maximum_length
       FROM information_schema.columns c
      WHERE table_schema = 'public'
        AND EXISTS (SELECT 1 FROM information_schema.tables t
                     WHERE t.table_schema = 'public' AND t.table_name = c.table_name AND t.table_type = 'BASE TABLE')
      ORDER BY table_name, ordinal_position`,
  );
  const byTable = new Map<string, DbColumn[]>();
  for (const r of rows) {
    if (NOT_APP_TABLES.has(r.table_name)) continue;
    byTable.set(r.table_name, [...(byTable.get(r.table_name) ?? []), r]);
  }
  return byTable;
}

/** Each model with its table name and attributes (a plain view, the same for every model class). */
const all = Object.entries(models()).map(
  ([name, model]) =>
    [
      name,
      model.getTableName() as string,
      (
        model as unknown as { getAttributes(): Record<string, ModelAttributeColumnOptions & { field: string }> }
      ).getAttributes(),
    ] as const,
);

describe("models against the migrated database", () => {
  it("when the migrated tables are listed, then each has exactly one model", async () => {
    const tables = [...(await dbColumns()).keys()].sort();
    const modelled = all.map(([, table]) => table).sort();
    expect(new Set(modelled).size).toBe(modelled.length);
    expect(modelled).toEqual(tables);
    // 19 tables from migrations 0001–0007 (README, "Who owns which table").
    expect(tables).toHaveLength(19);
  });

  it.each(all)(
    "when the %s model is compared with information_schema, then its columns, types and nullability match",
    async (_name, table, attributes) => {
      const db = (await dbColumns()).get(table) ?? [];
      const fromDb = Object.fromEntries(
        db.map((c) => [c.column_name, { type: dbType(c), nullable: c.is_nullable === "YES" }]),
      );
      const fromModel = Object.fromEntries(
        Object.values(attributes).map((a) => [
          a.field,
          { type: modelType(a.type), nullable: !(a.allowNull === false || a.primaryKey === true) },
        ]),
      );
      expect(fromModel).toEqual(fromDb);
    },
  );
});
