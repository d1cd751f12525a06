/**
 * `digester_days`, the daily ledger of the digester's day (0004-steward-feed-ledger.ts): triggers
 * keep `committed_kg_vs`; the app stamps the cap and adds overrides.
 */
import { Op, QueryTypes, type Transaction } from "sequelize";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

/**
 * Stamps today's row of the ledger (0004-steward-feed-ledger.ts) before a commitment: the cap
 * is the limit just computed under the digester's lock (never below what is already committed,
 * so a lowered limit never invalidates the past), and an overridden amount widens it. The
 * trigger then adds the load; the CHECK refuses anything above cap + overrides.
 */
export async function stampLedgerDay(
  t: Transaction,
  digesterId: number,
  day: string,
  capKgVs: number,
  overrideKgVs: number,
) {
  // SQL: an ON CONFLICT upsert that must compare with the row's committed load in one statement.
  await sequelize().query(
    `INSERT INTO digester_days (digester_id, day, cap_kg_vs, override_kg_vs) VALUES ($digesterId, $day, $cap, $override)
     ON CONFLICT (digester_id, day) DO UPDATE
       SET cap_kg_vs = GREATEST(EXCLUDED.cap_kg_vs, digester_days.committed_kg_vs),
           override_kg_vs = digester_days.override_kg_vs + EXCLUDED.override_kg_vs,
           updated_at = now()`,
    { type: QueryTypes.INSERT, bind: { digesterId, day, cap: capKgVs, override: overrideKgVs }, transaction: t },
  );
}

/** A late record for an earlier day is a fact, not a new commitment: it widens that day's cap, if any. */
export async function widenLedgerDay(t: Transaction, digesterId: number, day: string, kgVs: number) {
  await models().DigesterDay.increment(
    { overrideKgVs: kgVs },
    { where: { digesterId, day, capKgVs: { [Op.ne]: null } }, transaction: t },
  );
}

/** The caps stewards' accepts recorded in the ledger, per day (only days that have one). */
export async function findLedgerCaps(
  digesterId: number,
  fromDay: string,
  toDay: string,
): Promise<{ day: string; capKgVs: number | null }[]> {
  const rows = await models().DigesterDay.findAll({
    attributes: ["day", "capKgVs"],
    where: { digesterId, day: { [Op.between]: [fromDay, toDay] }, capKgVs: { [Op.ne]: null } },
  });
  return rows.map((r) => ({ day: r.day, capKgVs: r.capKgVs }));
}

/** True when a database error is the ledger's "committed within cap" check. */
export function isLedgerViolation(err: unknown): boolean {
  const e = err as {
    parent?: { code?: string; constraint?: string };
    original?: { code?: string; constraint?: string };
  };
  const pg = e?.parent ?? e?.original;
  return pg?.code === "23514" && pg.constraint === "committed_within_cap";
}
