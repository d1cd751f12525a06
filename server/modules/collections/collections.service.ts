/**
 * Collection requests: a resident who cannot carry asks for a collection of their own
 * household's buckets on a date; they see and cancel their requests; coordinators see all.
 */
import type { CollectionRequestView, CreateCollectionRequest } from "../../../shared/schemas/collections";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, forbidden, notFound } from "../../lib/app-error";
import { addDays, localDate } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { lockHousehold } from "../households";
import * as repo from "../rounds";
import { refreshRound } from "../rounds";

/** How far ahead a collection may be asked for, days. */
export const MAX_DAYS_AHEAD = 60;

export async function createRequest(
  caller: Caller,
  input: CreateCollectionRequest,
  now = new Date(),
): Promise<CollectionRequestView> {
  const householdId = caller.householdId;
  if (householdId === null) {
    throw new AppError(
      409,
      "no_household",
      "Register your household first: a collection is for your household's buckets.",
    );
  }
  const today = localDate(now);
  if (input.forDate < today)
    throw badRequest("Choose today or a later day.", { forDate: "Choose today or a later day." });
  if (input.forDate > addDays(today, MAX_DAYS_AHEAD)) {
    throw badRequest(`Choose a day within the next ${MAX_DAYS_AHEAD} days.`, {
      forDate: `Within ${MAX_DAYS_AHEAD} days.`,
    });
  }
  return sequelize().transaction(async (transaction) => {
    // One live request per household and day; the household row lock serialises two taps.
    await lockHousehold(transaction, householdId);
    if (await repo.hasLiveRequest(householdId, input.forDate, transaction)) {
      throw conflict(
        `Your household already asked for a collection on ${input.forDate}. Cancel it first to change the buckets.`,
        {
          forDate: "Already asked for this day.",
        },
      );
    }
    const id = await repo.insertRequest(transaction, {
      householdId,
      forDate: input.forDate,
      bucketCount: input.bucketCount,
    });
    return (await repo.findRequestView(id, transaction))!;
  });
}

export async function listRequests(
  caller: Caller,
  query: { mine?: "true" | "false" | undefined; date?: string | undefined },
) {
  const mine = query.mine !== "false";
  if (!mine && !caller.roles.includes("coordinator"))
    throw forbidden("Only coordinators see every household's requests.");
  if (mine && caller.householdId === null) return { requests: [] as CollectionRequestView[] };
  const requests = await repo.listRequestViews({
    householdId: mine ? caller.householdId! : undefined,
    forDate: query.date,
  });
  return { requests };
}

/** Cancels an open or planned request (own household, or a coordinator); a planned stop leaves its round. */
export async function cancelRequest(caller: Caller, id: number): Promise<CollectionRequestView> {
  return sequelize().transaction(async (transaction) => {
    await repo.lockRoundOfRequest(transaction, id);
    const row = await repo.lockRequest(transaction, id);
    if (!row) throw notFound("The collection request");
    if (!caller.roles.includes("coordinator") && caller.householdId !== row.householdId) {
      throw forbidden("You can cancel only your own household's collections.");
    }
    if (row.status !== "open" && row.status !== "planned") {
      throw conflict(`This collection is already ${row.status}; it cannot be cancelled.`);
    }
    const roundId = await repo.removeFromRounds(transaction, id);
    await repo.markCancelled(transaction, id);
    // The round it leaves is re-measured: lighter, shorter, and done or cancelled when nothing is left to collect.
    if (roundId !== null) await refreshRound(transaction, roundId);
    return (await repo.findRequestView(id, transaction))!;
  });
}
