import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";

export async function setName(personId: number, name: string): Promise<void> {
  await sequelize().query(`UPDATE people SET name = $2, updated_at = now() WHERE id = $1`, { bind: [personId, name] });
}

/** True when another person already uses this address (case-insensitive, like sign-in). */
export async function emailTaken(transaction: Transaction, email: string, exceptPersonId: number): Promise<boolean> {
  const rows = await sequelize().query(`SELECT 1 FROM people WHERE email = $1 AND id <> $2`, {
    bind: [email, exceptPersonId],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.length > 0;
}

export async function setEmail(transaction: Transaction, personId: number, email: string): Promise<void> {
  await sequelize().query(`UPDATE people SET email = $2, updated_at = now() WHERE id = $1`, {
    bind: [personId, email],
    transaction,
  });
}
