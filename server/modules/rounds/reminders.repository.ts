/**
 * SQL of the day-before collection reminders: the rounds of a date not reminded yet (locked,
 * skipping rows another process holds), their stops' residents, and the mark.
 */
import { QueryTypes, type Transaction, fn } from "sequelize";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

export interface RoundToRemind {
  id: number;
  forDate: string;
  volunteerEmail: string;
  volunteerName: string;
  volunteerStatus: string;
  endDigesterName: string;
  stopCount: number;
  bucketCount: number;
}

/** Planned rounds on `forDate` with no reminder yet; rows locked, those locked elsewhere skipped. */
export function roundsToRemind(transaction: Transaction, forDate: string): Promise<RoundToRemind[]> {
  // SQL: FOR UPDATE SKIP LOCKED, so two processes never remind one round; counts per round.
  return sequelize().query<RoundToRemind>(
    `SELECT r.id, to_char(r.for_date, 'YYYY-MM-DD') AS "forDate", p.email::text AS "volunteerEmail",
            p.name AS "volunteerName", p.status AS "volunteerStatus", d.name AS "endDigesterName",
            (SELECT count(*)::int FROM collection_round_stops s WHERE s.round_id = r.id) AS "stopCount",
            (SELECT coalesce(sum(c.bucket_count), 0)::int FROM collection_round_stops s
               JOIN collection_requests c ON c.id = s.request_id WHERE s.round_id = r.id) AS "bucketCount"
       FROM collection_rounds r JOIN people p ON p.id = r.volunteer_id JOIN digesters d ON d.id = r.end_digester_id
      WHERE r.for_date = $1 AND r.status = 'planned' AND r.reminded_at IS NULL
      ORDER BY r.id
      FOR UPDATE OF r SKIP LOCKED`,
    { bind: [forDate], type: QueryTypes.SELECT, transaction },
  );
}

export interface StopResident {
  roundId: number;
  seq: number;
  bucketCount: number;
  householdName: string;
  email: string;
  name: string;
}

/** Active residents of the planned stops of these rounds, in round and stop order. */
export function stopResidents(transaction: Transaction, roundIds: number[]): Promise<StopResident[]> {
  if (roundIds.length === 0) return Promise.resolve([]);
  // SQL: one read of the planned stops' active residents across four tables for the e-mails.
  return sequelize().query<StopResident>(
    `SELECT s.round_id AS "roundId", s.seq, c.bucket_count AS "bucketCount", h.name AS "householdName",
            p.email::text AS email, p.name
       FROM collection_round_stops s
       JOIN collection_requests c ON c.id = s.request_id AND c.status = 'planned'
       JOIN households h ON h.id = c.household_id
       JOIN people p ON p.household_id = h.id AND p.status = 'active'
      WHERE s.round_id = ANY($1::int[])
      ORDER BY s.round_id, s.seq, p.id`,
    { bind: [roundIds], type: QueryTypes.SELECT, transaction },
  );
}

export async function markReminded(transaction: Transaction, roundIds: number[]): Promise<void> {
  if (roundIds.length === 0) return;
  await models().CollectionRound.update(
    { remindedAt: fn("now") as unknown as Date },
    { where: { id: roundIds }, transaction, silent: true },
  );
}
