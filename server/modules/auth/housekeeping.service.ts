import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";

export interface PruneResult {
  skipped: boolean;
  sessions: number;
  rateLimitKeys: number;
  links: number;
}

/**
 * Deletes expired session rows (connect-pg-simple's own pruning timer is off), counters whose
 * window has passed, reset links and invitations that ended over 30 days ago, and reset
 * requests nobody handled within a day. One process
 * at a time (advisory lock).
 */
export async function pruneExpired(): Promise<PruneResult> {
  return sequelize().transaction(async (t) => {
    const [lock] = await sequelize().query<{ locked: boolean }>(
      `SELECT pg_try_advisory_xact_lock(hashtext('hearthloop.housekeeping')) AS locked`,
      {
        type: QueryTypes.SELECT,
        transaction: t,
      },
    );
    if (!lock?.locked) return { skipped: true, sessions: 0, rateLimitKeys: 0, links: 0 };
    const count = async (sql: string) =>
      (await sequelize().query(sql, { type: QueryTypes.SELECT, transaction: t })).length;
    const sessions = await count(`DELETE FROM sessions WHERE expire < now() RETURNING sid`);
    const rateLimitKeys = await count(`DELETE FROM rate_limit_hits WHERE reset_at < now() RETURNING key`);
    const links =
      (await count(`DELETE FROM password_resets WHERE expires_at < now() - interval '30 days' RETURNING id`)) +
      (await count(
        `DELETE FROM invitations WHERE expires_at < now() - interval '30 days' AND used_at IS NULL RETURNING id`,
      )) +
      // Left over only when no process runs the jobs; a reset link a day late helps nobody.
      (await count(`DELETE FROM password_reset_requests WHERE requested_at < now() - interval '1 day' RETURNING id`));
    return { skipped: false, sessions, rateLimitKeys, links };
  });
}
