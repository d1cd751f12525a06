/**
 * The assignment board has no table of its own (it changes `households` through the households
 * module); this holds its advisory lock.
 */
import type { Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";

/** Serialises every change of assignments (apply, pin) across processes until the transaction ends. */
export async function lockAssignments(transaction: Transaction): Promise<void> {
  // SQL: a transaction-scoped advisory lock.
  await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.assignments'))`, { transaction });
}
