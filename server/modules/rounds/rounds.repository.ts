/**
 * `collection_rounds` and `collection_round_stops`, owned by the rounds module: plain reads and
 * writes through the models, plain objects out; named SQL for the locks, the counts and the
 * batch insert, each saying why. The service owns the transactions and the order of the locks (planning: the date's advisory lock, then the date's
 * planned rounds, then the requests; marking collected: the round row, then its stop's request).
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { CollectionRequestStatus, RoundSummary } from "../../../shared/schemas/collections";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";

const q = <T extends object>(sql: string, bind: unknown[], transaction?: Transaction) =>
  sequelize().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction });

// NUMERIC columns are cast to float8 (the driver returns NUMERIC as strings); dates as text.
const summaryColumns = `
  r.id, to_char(r.for_date, 'YYYY-MM-DD') AS "forDate", r.volunteer_id AS "volunteerId", p.name AS "volunteerName",
  r.end_digester_id AS "endDigesterId", d.name AS "endDigesterName", r.total_m::float8 AS "totalM",
  r.load_kg::float8 AS "loadKg", r.status,
  (SELECT count(*)::int FROM collection_round_stops s WHERE s.round_id = r.id) AS "stopCount",
  (SELECT count(*)::int FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
    WHERE s.round_id = r.id AND c.status = 'collected') AS "collectedCount"`;
const summaryFrom = `FROM collection_rounds r JOIN people p ON p.id = r.volunteer_id JOIN digesters d ON d.id = r.end_digester_id`;

/** Most rounds one list returns. */
export const ROUND_LIST_LIMIT = 200;

/** Serialises planning of one date (YYYY-MM-DD) across processes until the transaction ends. */
export async function lockDate(transaction: Transaction, forDate: string): Promise<void> {
  // SQL: a transaction-scoped advisory lock.
  await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.rounds:' || $1))`, {
    bind: [forDate],
    transaction,
  });
}

/**
 * Locks the date's planned rounds (after the date's advisory lock, before any request: the same
 * order as marking a stop collected, round then request); returns their ids. A collection in
 * flight holds its round's row, so this waits for it to commit.
 */
export async function lockPlannedRounds(transaction: Transaction, forDate: string): Promise<number[]> {
  // SQL: row locks, in id order.
  const rows = await q<{ id: number }>(
    `SELECT id FROM collection_rounds WHERE for_date = $1 AND status = 'planned' ORDER BY id FOR UPDATE`,
    [forDate],
    transaction,
  );
  return rows.map((r) => r.id);
}

/**
 * Of these (locked) rounds, those with nothing collected yet (a re-plan replaces them). Run after
 * {@link lockPlannedRounds}: under READ COMMITTED this statement's snapshot sees collections that
 * committed while the locks were awaited.
 */
export async function replaceableRoundIds(transaction: Transaction, lockedIds: number[]): Promise<number[]> {
  if (lockedIds.length === 0) return [];
  // SQL: an anti-join (NOT EXISTS over stops and requests) read after the locks were granted.
  const rows = await q<{ id: number }>(
    `SELECT r.id FROM collection_rounds r WHERE r.id = ANY($1::int[]) AND r.status = 'planned'
       AND NOT EXISTS (SELECT 1 FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
                        WHERE s.round_id = r.id AND (s.drop_off_id IS NOT NULL OR c.status = 'collected'))
     ORDER BY r.id`,
    [lockedIds],
    transaction,
  );
  return rows.map((r) => r.id);
}

/** Fresh kg still to collect on a date's planned rounds, per end digester (planning's kg per bucket). */
export function plannedKgOnDate(
  transaction: Transaction,
  forDate: string,
  kgPerBucket: number,
): Promise<{ digesterId: number; plannedKg: number }[]> {
  // SQL: an aggregate (sum per end digester) over rounds, stops and requests.
  return q(
    `SELECT r.end_digester_id AS "digesterId", sum(c.bucket_count * $2::numeric)::float8 AS "plannedKg"
       FROM collection_rounds r JOIN collection_round_stops s ON s.round_id = r.id JOIN collection_requests c ON c.id = s.request_id
      WHERE r.for_date = $1 AND r.status = 'planned' AND c.status = 'planned'
      GROUP BY r.end_digester_id`,
    [forDate, kgPerBucket],
    transaction,
  );
}

/** Puts the planned requests on these rounds back to open. */
export async function reopenRequestsOf(transaction: Transaction, roundIds: number[]): Promise<void> {
  const stops = await models().CollectionRoundStop.findAll({
    attributes: ["requestId"],
    where: { roundId: roundIds },
    transaction,
  });
  if (stops.length === 0) return;
  await models().CollectionRequest.update(
    { status: "open" },
    { where: { id: stops.map((s) => s.requestId), status: "planned" }, transaction },
  );
}

/** Deletes rounds (their stops go with them). */
export async function deleteRounds(transaction: Transaction, roundIds: number[]): Promise<void> {
  await models().CollectionRound.destroy({ where: { id: roundIds }, transaction });
}

export interface OpenRequest {
  id: number;
  householdName: string;
  lat: number | null;
  lng: number | null;
  bucketCount: number;
}

/** The date's open requests with their household's place, by id; locks the request rows. */
export function lockOpenRequests(transaction: Transaction, forDate: string): Promise<OpenRequest[]> {
  // SQL: row locks on the requests only (FOR UPDATE OF r), reading their household's name and place.
  return q<OpenRequest>(
    `SELECT r.id, h.name AS "householdName", h.lat, h.lng, r.bucket_count AS "bucketCount"
       FROM collection_requests r JOIN households h ON h.id = r.household_id
      WHERE r.for_date = $1 AND r.status = 'open' ORDER BY r.id FOR UPDATE OF r`,
    [forDate],
    transaction,
  );
}

export interface NewRound {
  volunteerId: number;
  endDigesterId: number;
  totalM: number;
  loadKg: number;
}

/** Inserts a date's planned rounds in one statement; returns their ids in the same order. */
export async function insertRounds(transaction: Transaction, forDate: string, rounds: NewRound[]): Promise<number[]> {
  if (rounds.length === 0) return [];
  // SQL: a CTE that draws each row's id first and inserts all rounds in one statement.
  // Ids are drawn per input row first, so each id is tied to its row whatever order the insert runs in.
  const rows = await q<{ id: number }>(
    `WITH input AS (
        SELECT * FROM unnest($2::int[], $3::int[], $4::numeric[], $5::numeric[]) WITH ORDINALITY
          AS u(volunteer_id, end_digester_id, total_m, load_kg, ord)),
      ids AS MATERIALIZED (SELECT ord, nextval(pg_get_serial_sequence('collection_rounds', 'id'))::int AS id FROM input),
      inserted AS (
        INSERT INTO collection_rounds (id, for_date, volunteer_id, end_digester_id, total_m, load_kg)
        SELECT ids.id, $1::date, input.volunteer_id, input.end_digester_id, input.total_m, input.load_kg
          FROM input JOIN ids USING (ord)
        RETURNING id)
     SELECT ids.id FROM ids JOIN inserted USING (id) ORDER BY ids.ord`,
    [
      forDate,
      rounds.map((r) => r.volunteerId),
      rounds.map((r) => r.endDigesterId),
      rounds.map((r) => r.totalM),
      rounds.map((r) => r.loadKg),
    ],
    transaction,
  );
  return rows.map((r) => r.id);
}

/** Adds stops to rounds in one statement: each request as its round's `seq`-th stop (from 1). */
export async function insertStops(
  transaction: Transaction,
  stops: { roundId: number; requestId: number; seq: number }[],
): Promise<void> {
  if (stops.length === 0) return;
  await models().CollectionRoundStop.bulkCreate(stops, { transaction });
}

export async function markRequestsPlanned(transaction: Transaction, requestIds: number[]): Promise<void> {
  if (requestIds.length === 0) return;
  await models().CollectionRequest.update({ status: "planned" }, { where: { id: requestIds }, transaction });
}

/** Every round of a date, by id. */
export function roundSummariesOn(forDate: string, transaction?: Transaction): Promise<RoundSummary[]> {
  // SQL: each round with counts of its stops (aggregate subqueries), in one statement.
  return q<RoundSummary>(
    `SELECT ${summaryColumns} ${summaryFrom} WHERE r.for_date = $1 ORDER BY r.id`,
    [forDate],
    transaction,
  );
}

/** Rounds on one date and/or from one date on (YYYY-MM-DD), optionally of one volunteer, by date and id. */
export function listRoundSummaries(filter: {
  forDate?: string | undefined;
  fromDate?: string | undefined;
  volunteerId?: number | undefined;
}): Promise<RoundSummary[]> {
  const bind: unknown[] = [];
  const where: string[] = [];
  if (filter.forDate !== undefined) {
    bind.push(filter.forDate);
    where.push(`r.for_date = $${bind.length}`);
  }
  if (filter.fromDate !== undefined) {
    bind.push(filter.fromDate);
    where.push(`r.for_date >= $${bind.length}`);
  }
  if (filter.volunteerId !== undefined) {
    bind.push(filter.volunteerId);
    where.push(`r.volunteer_id = $${bind.length}`);
  }
  // SQL: each round with counts of its stops (aggregate subqueries), in one statement.
  return q<RoundSummary>(
    `SELECT ${summaryColumns} ${summaryFrom} ${where.length ? `WHERE ${where.join(" AND ")}` : ""} ORDER BY r.for_date, r.id LIMIT ${ROUND_LIST_LIMIT}`,
    bind,
  );
}

export interface RoundRow extends RoundSummary {
  /** The volunteer's start point (null when not set). */
  startLat: number | null;
  startLng: number | null;
}

/** One round with its volunteer's start point; `lock` locks the round row until the transaction ends. */
export async function findRound(
  id: number,
  options: { transaction?: Transaction | undefined; lock?: boolean } = {},
): Promise<RoundRow | undefined> {
  // SQL: the round's counts (aggregate subqueries) and, with `lock`, a row lock on the round only.
  const [round] = await q<RoundRow>(
    `SELECT ${summaryColumns}, p.start_lat AS "startLat", p.start_lng AS "startLng" ${summaryFrom} WHERE r.id = $1 ${options.lock ? "FOR UPDATE OF r" : ""}`,
    [id],
    options.transaction,
  );
  return round;
}

export interface StopRow {
  seq: number;
  requestId: number;
  householdId: number;
  householdName: string;
  addressText: string;
  lat: number;
  lng: number;
  bucketCount: number;
  status: CollectionRequestStatus;
  dropOffId: number | null;
}

/** A round's stops in order, with their request and its household. */
export async function roundStops(roundId: number, transaction?: Transaction): Promise<StopRow[]> {
  const rows = await models().CollectionRoundStop.findAll({
    where: { roundId },
    include: [
      {
        association: "request",
        attributes: ["bucketCount", "status", "householdId"],
        required: true,
        include: [
          { association: "household", attributes: ["id", "name", "addressText", "lat", "lng"], required: true },
        ],
      },
    ],
    order: [["seq", "ASC"]],
    transaction,
  });
  return rows.map((s) => {
    const h = s.request!.household!;
    return {
      seq: s.seq,
      requestId: s.requestId,
      householdId: h.id,
      householdName: h.name,
      addressText: h.addressText,
      lat: h.lat!,
      lng: h.lng!,
      bucketCount: s.request!.bucketCount,
      status: s.request!.status,
      dropOffId: s.dropOffId,
    };
  });
}

export interface LockedStop {
  status: CollectionRequestStatus;
  householdId: number;
  bucketCount: number;
  /** The round's end digester's status now (it may have gone resting or offline since the plan). */
  endDigesterStatus: "active" | "resting" | "offline";
}

/** A stop of a round with its request and the end digester's status; locks the request row. */
export async function lockStop(
  transaction: Transaction,
  roundId: number,
  requestId: number,
): Promise<LockedStop | undefined> {
  // SQL: a row lock on the request only (FOR UPDATE OF c), with its round's end digester status.
  const [stop] = await q<LockedStop>(
    `SELECT c.status, c.household_id AS "householdId", c.bucket_count AS "bucketCount", d.status AS "endDigesterStatus"
       FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
       JOIN collection_rounds r ON r.id = s.round_id JOIN digesters d ON d.id = r.end_digester_id
      WHERE s.round_id = $1 AND s.request_id = $2 FOR UPDATE OF c`,
    [roundId, requestId],
    transaction,
  );
  return stop;
}

/** Links a stop to the drop-off its collection made. */
export async function setStopDropOff(
  transaction: Transaction,
  roundId: number,
  requestId: number,
  dropOffId: number,
): Promise<void> {
  await models().CollectionRoundStop.update({ dropOffId }, { where: { roundId, requestId }, transaction });
}

export async function markRequestCollected(transaction: Transaction, requestId: number): Promise<void> {
  await models().CollectionRequest.update({ status: "collected" }, { where: { id: requestId }, transaction });
}

/** Marks the round done when none of its stops is still planned. */
export async function finishRoundIfDone(transaction: Transaction, roundId: number): Promise<void> {
  // SQL: a conditional UPDATE (NOT EXISTS a planned stop), decided and written in one statement.
  await sequelize().query(
    `UPDATE collection_rounds r SET status = 'done', updated_at = now() WHERE r.id = $1 AND NOT EXISTS (
       SELECT 1 FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
        WHERE s.round_id = r.id AND c.status = 'planned')`,
    { bind: [roundId], transaction },
  );
}

/** Stores a round's length, load and status after its stops changed. */
export async function updateRoundTotals(
  transaction: Transaction,
  roundId: number,
  totals: { totalM: number; loadKg: number; status: "planned" | "done" | "cancelled" },
): Promise<void> {
  await models().CollectionRound.update(totals, { where: { id: roundId }, transaction });
}

/** Of these drop-off ids, those a round's collected stop made (their buckets are at the round's digester already). */
export async function dropOffsMadeByRounds(dropOffIds: number[], transaction?: Transaction): Promise<number[]> {
  if (dropOffIds.length === 0) return [];
  const rows = await models().CollectionRoundStop.findAll({
    attributes: ["dropOffId"],
    where: { dropOffId: dropOffIds },
    transaction,
  });
  return rows.map((r) => r.dropOffId!);
}
