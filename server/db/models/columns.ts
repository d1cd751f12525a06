import type { Model, ModelAttributeColumnOptions, ModelAttributes } from "sequelize";

/**
 * The one row-mapping rule of the models: PostgreSQL's NUMERIC and BIGINT arrive from the driver
 * as strings (to keep their precision); every model reads them back as numbers, so
 * `instance.get({ plain: true })` — what repositories return — carries numbers. Our NUMERIC
 * columns hold at most 12 digits and our BIGINT ids stay far below 2^53, so nothing is lost.
 */
export function withNumbers<M extends Model, A extends ModelAttributes<M>>(attributes: A): A {
  for (const [name, attribute] of Object.entries(attributes)) {
    const column = attribute as ModelAttributeColumnOptions<M>;
    const key = (column.type as { key?: string } | undefined)?.key;
    if (key !== "DECIMAL" && key !== "BIGINT") continue;
    column.get = function (this: M) {
      const value = this.getDataValue(name as keyof M & string) as unknown;
      return value === null || value === undefined ? value : Number(value);
    };
  }
  return attributes;
}
