import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { mailReachable } from "../../lib/mailer";
import type { Health } from "../../../shared/schemas/health";

async function databaseUp(): Promise<boolean> {
  try {
    await Promise.race([
      sequelize().query("SELECT 1", { type: QueryTypes.SELECT }),
      new Promise((_, reject) => setTimeout(() => reject(new Error("timeout")), 2_000).unref()),
    ]);
    return true;
  } catch {
    return false;
  }
}

/** Database and mail reachability; mail being down is reported, not fatal (mail waits in the outbox). */
export async function checkHealth(now = new Date()): Promise<{ ok: boolean; health: Health }> {
  const [database, mail] = await Promise.all([databaseUp(), mailReachable()]);
  return {
    ok: database,
    health: {
      status: database ? (mail ? "ok" : "degraded") : "down",
      database: database ? "up" : "down",
      mail: mail ? "up" : "down",
      checkedAt: now.toISOString(),
    },
  };
}
