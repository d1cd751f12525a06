/**
 * Collection requests: a resident who cannot carry asks for a collection of their own
 * household's buckets on a date; they see and cancel their requests; coordinators see all.
 */
import { QueryTypes } from "sequelize";
import type { CollectionRequestView, CreateCollectionRequest } from "../../../shared/schemas/collections";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, forbidden, notFound } from "../../lib/app-error";
import { addDays, localDate } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";

/** How far ahead a collection may be asked for, days. */
export const MAX_DAYS_AHEAD = 60;

const columns = `
  r.id, r.household_id AS "householdId", h.name AS "householdName", h.address_text AS "addressText",
  to_char(r.for_date, 'YYYY-MM-DD') AS "forDate", r.bucket_count AS "bucketCount", r.status,
  s.round_id AS "roundId"`;
const from = `FROM collection_requests r JOIN households h ON h.id = r.household_id
  LEFT JOIN collection_round_stops s ON s.request_id = r.id`;

export async function createRequest(caller: Caller, input: CreateCollectionRequest, now = new Date()): Promise<CollectionRequestView> {
  if (caller.householdId === null) {
    throw new AppError(409, "no_household", "Register your household first: a collection is for your household's buckets.");
  }
  const today = localDate(now);
  if (input.forDate < today) throw badRequest("Choose today or a later day.", { forDate: "Choose today or a later day." });
  if (input.forDate > addDays(today, MAX_DAYS_AHEAD)) {
    throw badRequest(`Choose a day within the next ${MAX_DAYS_AHEAD} days.`, { forDate: `Within ${MAX_DAYS_AHEAD} days.` });
  }
  return sequelize().transaction(async (transaction) => {
    // One live request per household and day; the household row lock serialises two taps.
    await sequelize().query(`SELECT id FROM households WHERE id = $1 FOR UPDATE`, { bind: [caller.householdId], transaction });
    const existing = await sequelize().query<{ id: number }>(
      `SELECT id FROM collection_requests WHERE household_id = $1 AND for_date = $2 AND status IN ('open', 'planned')`,
      { bind: [caller.householdId, input.forDate], type: QueryTypes.SELECT, transaction },
    );
    if (existing.length > 0) {
      throw conflict(`Your household already asked for a collection on ${input.forDate}. Cancel it first to change the buckets.`, {
        forDate: "Already asked for this day.",
      });
    }
    const [row] = await sequelize().query<{ id: number }>(
      `INSERT INTO collection_requests (household_id, for_date, bucket_count) VALUES ($1, $2, $3) RETURNING id`,
      { bind: [caller.householdId, input.forDate, input.bucketCount], type: QueryTypes.SELECT, transaction },
    );
    const [view] = await sequelize().query<CollectionRequestView>(`SELECT ${columns} ${from} WHERE r.id = $1`, {
      bind: [row!.id],
      type: QueryTypes.SELECT,
      transaction,
    });
    return view!;
  });
}

export async function listRequests(caller: Caller, query: { mine?: "true" | "false" | undefined; date?: string | undefined }) {
  const mine = query.mine !== "false";
  if (!mine && !caller.roles.includes("coordinator")) throw forbidden("Only coordinators see every household's requests.");
  if (mine && caller.householdId === null) return { requests: [] as CollectionRequestView[] };
  const where: string[] = [];
  const bind: unknown[] = [];
  if (mine) {
    bind.push(caller.householdId);
    where.push(`r.household_id = $${bind.length}`);
  }
  if (query.date) {
    bind.push(query.date);
    where.push(`r.for_date = $${bind.length}`);
  }
  const requests = await sequelize().query<CollectionRequestView>(
    `SELECT ${columns} ${from} ${where.length ? `WHERE ${where.join(" AND ")}` : ""} ORDER BY r.for_date DESC, r.id DESC LIMIT 500`,
    { bind, type: QueryTypes.SELECT },
  );
  return { requests };
}

/** Cancels an open or planned request (own household, or a coordinator); a planned stop leaves its round. */
export async function cancelRequest(caller: Caller, id: number): Promise<CollectionRequestView> {
  return sequelize().transaction(async (transaction) => {
    const [row] = await sequelize().query<{ householdId: number; status: string }>(
      `SELECT household_id AS "householdId", status FROM collection_requests WHERE id = $1 FOR UPDATE`,
      { bind: [id], type: QueryTypes.SELECT, transaction },
    );
    if (!row) throw notFound("The collection request");
    if (!caller.roles.includes("coordinator") && caller.householdId !== row.householdId) {
      throw forbidden("You can cancel only your own household's collections.");
    }
    if (row.status !== "open" && row.status !== "planned") {
      throw conflict(`This collection is already ${row.status}; it cannot be cancelled.`);
    }
    await sequelize().query(`DELETE FROM collection_round_stops WHERE request_id = $1`, { bind: [id], transaction });
    await sequelize().query(`UPDATE collection_requests SET status = 'cancelled', updated_at = now() WHERE id = $1`, {
      bind: [id],
      transaction,
    });
    const [view] = await sequelize().query<CollectionRequestView>(`SELECT ${columns} ${from} WHERE r.id = $1`, {
      bind: [id],
      type: QueryTypes.SELECT,
      transaction,
    });
    return view!;
  });
}
