/**
 * `collection_requests`, owned by the rounds module with the rounds that serve them: a household
 * asking for its buckets to be collected. Plain reads and writes through the models (the
 * request's household and stop by association); SQL only for the row locks. The service owns the
 * transactions and the order of the locks.
 */
import { QueryTypes, type Transaction } from "sequelize";
import type { CollectionRequestStatus, CollectionRequestView } from "../../../shared/schemas/collections";
import { models } from "../../db/models";
import type { CollectionRequestModel } from "../../db/models/collection-request.model";
import { sequelize } from "../../db/sequelize";

/** Most requests one list returns. */
export const REQUEST_LIST_LIMIT = 500;

function toView(r: CollectionRequestModel): CollectionRequestView {
  return {
    id: r.id,
    householdId: r.householdId,
    householdName: r.household!.name,
    addressText: r.household!.addressText,
    forDate: r.forDate,
    bucketCount: r.bucketCount,
    status: r.status,
    roundId: r.stop?.roundId ?? null,
  };
}

const viewIncludes = [
  { association: "household", attributes: ["name", "addressText"], required: true },
  { association: "stop", attributes: ["roundId"] },
];

/** Whether the household has an open or planned request on `forDate` (YYYY-MM-DD). */
export async function hasLiveRequest(
  householdId: number,
  forDate: string,
  transaction?: Transaction,
): Promise<boolean> {
  const row = await models().CollectionRequest.findOne({
    attributes: ["id"],
    where: { householdId, forDate, status: ["open", "planned"] },
    transaction,
  });
  return row !== null;
}

/** Inserts an open request; returns its id. */
export async function insertRequest(
  transaction: Transaction,
  input: { householdId: number; forDate: string; bucketCount: number },
): Promise<number> {
  return (await models().CollectionRequest.create(input, { transaction })).id;
}

/** One request as the API shows it, with its household and round (if planned). */
export async function findRequestView(
  id: number,
  transaction?: Transaction,
): Promise<CollectionRequestView | undefined> {
  const row = await models().CollectionRequest.findByPk(id, { include: viewIncludes, transaction });
  return row ? toView(row) : undefined;
}

/** Requests, newest day first, optionally of one household and/or one day (YYYY-MM-DD). */
export async function listRequestViews(filter: {
  householdId?: number | undefined;
  forDate?: string | undefined;
}): Promise<CollectionRequestView[]> {
  const rows = await models().CollectionRequest.findAll({
    where: {
      ...(filter.householdId !== undefined ? { householdId: filter.householdId } : {}),
      ...(filter.forDate ? { forDate: filter.forDate } : {}),
    },
    include: viewIncludes,
    order: [
      ["forDate", "DESC"],
      ["id", "DESC"],
    ],
    limit: REQUEST_LIST_LIMIT,
  });
  return rows.map(toView);
}

/**
 * Locks the round the request is a stop of, if any, before the request itself: planning and
 * marking a stop collected lock round before request, and cancelling must take the same order.
 */
export async function lockRoundOfRequest(transaction: Transaction, requestId: number): Promise<void> {
  // SQL: a row lock on the round only (FOR UPDATE OF r), found through the stop.
  await sequelize().query(
    `SELECT r.id FROM collection_round_stops s JOIN collection_rounds r ON r.id = s.round_id
      WHERE s.request_id = $1 FOR UPDATE OF r`,
    { bind: [requestId], type: QueryTypes.SELECT, transaction },
  );
}

/** Locks a request row until the transaction ends; its household and status, or undefined when there is none. */
export async function lockRequest(
  transaction: Transaction,
  id: number,
): Promise<{ householdId: number; status: CollectionRequestStatus } | undefined> {
  const row = await models().CollectionRequest.findByPk(id, {
    attributes: ["householdId", "status"],
    lock: transaction.LOCK.UPDATE,
    transaction,
  });
  return row ? { householdId: row.householdId, status: row.status } : undefined;
}

/** Takes the request off the round it is a stop of; returns that round's id (null when none). */
export async function removeFromRounds(transaction: Transaction, requestId: number): Promise<number | null> {
  const stop = await models().CollectionRoundStop.findOne({ where: { requestId }, transaction });
  if (!stop) return null;
  await models().CollectionRoundStop.destroy({ where: { requestId }, transaction });
  return stop.roundId;
}

export async function markCancelled(transaction: Transaction, id: number): Promise<void> {
  await models().CollectionRequest.update({ status: "cancelled" }, { where: { id }, transaction });
}
