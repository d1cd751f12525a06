/**
 * Collection rounds: planning a date's cargo-bike rounds with shared/domain/rounds.ts
 * (volunteers' bike loads and start points; end digesters with room for that date from the feed
 * budget), storing them, the round sheet and its GeoJSON, and marking stops collected (which
 * creates a pending drop-off at the round's end digester for its steward to accept).
 *
 * Room on the date: today = today's feed budget minus what is already pending today; a later
 * date = that day of the weekly-room projection (shared/domain/weekly-room.ts; day 6 beyond a week).
 */
import { performance } from "node:perf_hooks";
import { QueryTypes, type Transaction } from "sequelize";
import { dropOffQuantities } from "../../../shared/domain/drop-offs";
import { DEFAULT_BUCKET_LITRES } from "../../../shared/domain/feed-budget";
import { haversineM, isValidLatLng } from "../../../shared/domain/geo";
import { planCollectionRounds } from "../../../shared/domain/rounds";
import { freshKgFromKgVs } from "../../../shared/domain/scraps";
import { projectWeeklyRoom } from "../../../shared/domain/weekly-room";
import {
  COLLECTION_BUCKET_KG,
  type CollectionRequestStatus,
  type PlanResult,
  type RoundSheet,
  type RoundSummary,
} from "../../../shared/schemas/collections";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, forbidden, notFound } from "../../lib/app-error";
import { daysBetween, localDate } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { type DigesterToday, loadDigestersToday } from "../digesters/digester-state.service";

const q = <T extends object>(sql: string, bind: unknown[], transaction?: Transaction) =>
  sequelize().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction });

/** Room for scraps at a digester on `forDate`, fresh kg (see the module comment). */
export function roomOnDateKg(state: DigesterToday, forDate: string): number {
  if (state.closed) return 0;
  const k = daysBetween(state.today, forDate);
  if (k <= 0) return Math.max(0, state.budget.budgetKgScraps - state.pendingTodayKgScraps);
  const projection = projectWeeklyRoom({
    limits: state.budget.limits,
    previous7DaysKgVs: state.budget.limits.weekRamp === null ? null : state.previous7DaysKgVs,
    fedTodayKgVs: state.committedTodayKgVs,
    closed: false,
  });
  return freshKgFromKgVs(projection.dailyKgVs[Math.min(6, k)] ?? 0);
}

const summaryColumns = `
  r.id, to_char(r.for_date, 'YYYY-MM-DD') AS "forDate", r.volunteer_id AS "volunteerId", p.name AS "volunteerName",
  r.end_digester_id AS "endDigesterId", d.name AS "endDigesterName", r.total_m::float8 AS "totalM",
  r.load_kg::float8 AS "loadKg", r.status,
  (SELECT count(*)::int FROM collection_round_stops s WHERE s.round_id = r.id) AS "stopCount",
  (SELECT count(*)::int FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
    WHERE s.round_id = r.id AND c.status = 'collected') AS "collectedCount"`;
const summaryFrom = `FROM collection_rounds r JOIN people p ON p.id = r.volunteer_id JOIN digesters d ON d.id = r.end_digester_id`;

const UNPLACED_WORDS: Record<string, string> = {
  noLocation: "the household has no location on the map; add one, or ask them to bring the buckets.",
  invalidLoad: "the request has no valid number of buckets.",
  heavierThanAnyBike: "more buckets than any volunteer's cargo bike can carry; split it over two days.",
  noDigesterWithRoom: "no digester has room for it on this date; plan it another day.",
  noVolunteer: "no volunteer is available for it; plan it another day or find a volunteer.",
};

/** Plans (or re-plans) a date: planned rounds with nothing collected yet are replaced. */
export async function planRounds(forDate: string, now = new Date()): Promise<PlanResult> {
  const today = localDate(now);
  if (forDate < today) throw badRequest("Plan today or a later day.", { forDate: "Today or later." });
  return sequelize().transaction(async (transaction) => {
    await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.rounds:' || $1))`, { bind: [forDate], transaction });
    const old = await q<{ id: number }>(
      `SELECT r.id FROM collection_rounds r WHERE r.for_date = $1 AND r.status = 'planned'
         AND NOT EXISTS (SELECT 1 FROM collection_round_stops s WHERE s.round_id = r.id AND s.drop_off_id IS NOT NULL)`,
      [forDate],
      transaction,
    );
    const oldIds = old.map((r) => r.id);
    if (oldIds.length > 0) {
      await sequelize().query(
        `UPDATE collection_requests SET status = 'open', updated_at = now()
          WHERE status = 'planned' AND id IN (SELECT request_id FROM collection_round_stops WHERE round_id = ANY($1::int[]))`,
        { bind: [oldIds], transaction },
      );
      await sequelize().query(`DELETE FROM collection_rounds WHERE id = ANY($1::int[])`, { bind: [oldIds], transaction });
    }
    const requests = await q<{ id: number; householdName: string; lat: number | null; lng: number | null; bucketCount: number }>(
      `SELECT r.id, h.name AS "householdName", h.lat, h.lng, r.bucket_count AS "bucketCount"
         FROM collection_requests r JOIN households h ON h.id = r.household_id
        WHERE r.for_date = $1 AND r.status = 'open' ORDER BY r.id FOR UPDATE OF r`,
      [forDate],
      transaction,
    );
    const volunteers = await q<{ id: number; name: string; lat: number; lng: number; bikeLoadKg: number }>(
      `SELECT id, name, start_lat AS lat, start_lng AS lng, bike_load_kg::float8 AS "bikeLoadKg" FROM people
        WHERE is_volunteer AND status = 'active' AND bike_load_kg IS NOT NULL AND start_lat IS NOT NULL AND start_lng IS NOT NULL
        ORDER BY id`,
      [],
      transaction,
    );
    const states = await loadDigestersToday(null, { now, transaction });
    const digesters = states
      .map((s) => ({ id: String(s.digester.id), lat: s.digester.lat, lng: s.digester.lng, roomKg: roomOnDateKg(s, forDate) }))
      .filter((d) => d.roomKg > 0);
    const messages: string[] = [];
    if (requests.length === 0) messages.push(`No open collection requests for ${forDate}.`);
    if (volunteers.length === 0) messages.push("No volunteer with a cargo-bike load and a start point: mark someone as a volunteer on the people page.");
    if (digesters.length === 0) messages.push(`No digester has room on ${forDate} (resting, offline, no temperature reading or full).`);

    const started = performance.now();
    const plan = planCollectionRounds({
      stops: requests.map((r) => ({ householdId: String(r.id), lat: r.lat, lng: r.lng, loadKg: r.bucketCount * COLLECTION_BUCKET_KG })),
      volunteers: volunteers.map((v) => ({ id: String(v.id), lat: v.lat, lng: v.lng, bikeLoadKg: v.bikeLoadKg })),
      digesters,
    });
    const solveMs = performance.now() - started;
    for (const m of plan.messages) messages.push(m);

    for (const round of plan.rounds) {
      const [row] = await q<{ id: number }>(
        `INSERT INTO collection_rounds (for_date, volunteer_id, end_digester_id, total_m, load_kg) VALUES ($1, $2, $3, $4, $5) RETURNING id`,
        [forDate, Number(round.volunteerId), Number(round.endDigesterId), round.lengthM, round.loadKg],
        transaction,
      );
      for (const [i, stop] of round.stops.entries()) {
        await sequelize().query(`INSERT INTO collection_round_stops (round_id, request_id, seq) VALUES ($1, $2, $3)`, {
          bind: [row!.id, Number(stop.householdId), i + 1],
          transaction,
        });
      }
      await sequelize().query(
        `UPDATE collection_requests SET status = 'planned', updated_at = now() WHERE id = ANY($1::int[])`,
        { bind: [round.stops.map((s) => Number(s.householdId))], transaction },
      );
    }
    const names = new Map(requests.map((r) => [String(r.id), r.householdName]));
    const rounds = await q<RoundSummary>(`SELECT ${summaryColumns} ${summaryFrom} WHERE r.for_date = $1 ORDER BY r.id`, [forDate], transaction);
    return {
      forDate,
      rounds,
      unplaced: plan.unplacedStops.map((u) => ({
        requestId: Number(u.householdId),
        householdName: names.get(u.householdId) ?? "",
        reason: u.reason,
        message: `${names.get(u.householdId) ?? "A request"}: ${UNPLACED_WORDS[u.reason] ?? u.message}`,
      })),
      messages,
      totalM: plan.totalLengthM,
      solveMs: Math.round(solveMs * 10) / 10,
    };
  });
}

async function isVolunteerOnly(caller: Caller): Promise<boolean> {
  return !caller.roles.includes("coordinator");
}

/** Rounds of a date (or all upcoming): coordinators see all, anyone else their own. */
export async function listRounds(caller: Caller, date: string | undefined, now = new Date()): Promise<{ rounds: RoundSummary[] }> {
  const bind: unknown[] = [];
  const where: string[] = [];
  if (date) {
    bind.push(date);
    where.push(`r.for_date = $${bind.length}`);
  } else {
    bind.push(localDate(now));
    where.push(`r.for_date >= $${bind.length}`);
  }
  if (await isVolunteerOnly(caller)) {
    bind.push(caller.id);
    where.push(`r.volunteer_id = $${bind.length}`);
  }
  const rounds = await q<RoundSummary>(
    `SELECT ${summaryColumns} ${summaryFrom} WHERE ${where.join(" AND ")} ORDER BY r.for_date, r.id LIMIT 200`,
    bind,
  );
  return { rounds };
}

async function loadRound(caller: Caller, id: number, transaction?: Transaction, lock = false) {
  const [round] = await q<RoundSummary & { startLat: number | null; startLng: number | null }>(
    `SELECT ${summaryColumns}, p.start_lat AS "startLat", p.start_lng AS "startLng" ${summaryFrom} WHERE r.id = $1 ${lock ? "FOR UPDATE OF r" : ""}`,
    [id],
    transaction,
  );
  if (!round) throw notFound("The round");
  if (!caller.roles.includes("coordinator") && round.volunteerId !== caller.id) throw forbidden("This is another volunteer's round.");
  return round;
}

/** The round sheet: stops in order with address, buckets and legs, start and end. */
export async function roundSheet(caller: Caller, id: number, transaction?: Transaction): Promise<RoundSheet> {
  const round = await loadRound(caller, id, transaction);
  const [end] = await q<{ id: number; name: string; siteDescription: string; lat: number; lng: number }>(
    `SELECT id, name, site_description AS "siteDescription", lat, lng FROM digesters WHERE id = $1`,
    [round.endDigesterId],
    transaction,
  );
  const stops = await q<{
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
  }>(
    `SELECT s.seq, s.request_id AS "requestId", h.id AS "householdId", h.name AS "householdName", h.address_text AS "addressText",
            h.lat, h.lng, c.bucket_count AS "bucketCount", c.status, s.drop_off_id AS "dropOffId"
       FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id JOIN households h ON h.id = c.household_id
      WHERE s.round_id = $1 ORDER BY s.seq`,
    [id],
    transaction,
  );
  const start = isValidLatLng(round.startLat, round.startLng) ? { lat: round.startLat!, lng: round.startLng! } : null;
  let previous = start;
  const withLegs = stops.map((s) => {
    const here = { lat: s.lat, lng: s.lng };
    const legM = previous ? Math.round(haversineM(previous, here)) : 0;
    previous = here;
    return { ...s, loadKg: s.bucketCount * COLLECTION_BUCKET_KG, legM };
  });
  const { startLat: _lat, startLng: _lng, ...summary } = round;
  return {
    ...summary,
    start,
    endDigester: end!,
    endLegM: previous ? Math.round(haversineM(previous, end!)) : 0,
    stops: withLegs,
  };
}

/** RFC 7946 FeatureCollection: the route as a LineString, a Point per stop and one for the end digester ([lng, lat]). */
export async function roundGeoJson(caller: Caller, id: number): Promise<string> {
  const sheet = await roundSheet(caller, id);
  const line = [
    ...(sheet.start ? [[sheet.start.lng, sheet.start.lat]] : []),
    ...sheet.stops.map((s) => [s.lng, s.lat]),
    [sheet.endDigester.lng, sheet.endDigester.lat],
  ];
  const collection = {
    type: "FeatureCollection",
    features: [
      {
        type: "Feature",
        geometry: { type: "LineString", coordinates: line },
        properties: { kind: "route", roundId: sheet.id, forDate: sheet.forDate, volunteer: sheet.volunteerName, totalM: sheet.totalM },
      },
      ...sheet.stops.map((s) => ({
        type: "Feature",
        geometry: { type: "Point", coordinates: [s.lng, s.lat] },
        properties: { kind: "stop", seq: s.seq, household: s.householdName, address: s.addressText, buckets: s.bucketCount, status: s.status },
      })),
      {
        type: "Feature",
        geometry: { type: "Point", coordinates: [sheet.endDigester.lng, sheet.endDigester.lat] },
        properties: { kind: "endDigester", name: sheet.endDigester.name, loadKg: sheet.loadKg },
      },
    ],
  };
  return JSON.stringify(collection);
}

/**
 * Marks a stop collected: creates a pending drop-off (buckets of 10 L, estimated mass, mixed
 * scraps) at the round's end digester for the steward to accept, and marks the request
 * collected, in one transaction. A second call is a 409.
 */
export async function markCollected(caller: Caller, roundId: number, requestId: number): Promise<RoundSheet> {
  return sequelize().transaction(async (transaction) => {
    const round = await loadRound(caller, roundId, transaction, true);
    if (round.status === "cancelled") throw conflict("This round was cancelled.");
    const [stop] = await q<{ status: string; householdId: number; bucketCount: number; kgPerLitre: number }>(
      `SELECT c.status, c.household_id AS "householdId", c.bucket_count AS "bucketCount", d.bucket_kg_per_litre::float8 AS "kgPerLitre"
         FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
         JOIN collection_rounds r ON r.id = s.round_id JOIN digesters d ON d.id = r.end_digester_id
        WHERE s.round_id = $1 AND s.request_id = $2 FOR UPDATE OF c`,
      [roundId, requestId],
      transaction,
    );
    if (!stop) throw notFound("That stop on this round");
    if (stop.status === "collected") throw conflict("This stop is already marked collected.");
    if (stop.status !== "planned") throw new AppError(409, "not_collectable", `This request is ${stop.status}; it cannot be collected.`);
    const quantities = dropOffQuantities({
      bucketCount: stop.bucketCount,
      bucketLitres: DEFAULT_BUCKET_LITRES,
      kgPerLitre: stop.kgPerLitre,
      mix: "mixed",
    });
    const [dropOff] = await q<{ id: number }>(
      `INSERT INTO drop_offs (household_id, digester_id, person_id, for_date, bucket_count, bucket_litres, mass_source, fresh_kg, kg_vs, mix, status, note)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, 'mixed', 'pending', $10) RETURNING id`,
      [
        stop.householdId,
        round.endDigesterId,
        caller.id,
        round.forDate,
        stop.bucketCount,
        DEFAULT_BUCKET_LITRES,
        quantities.massSource,
        quantities.freshKg,
        quantities.kgVs,
        `Collected by cargo bike on round ${roundId}.`,
      ],
      transaction,
    );
    await sequelize().query(`UPDATE collection_round_stops SET drop_off_id = $3 WHERE round_id = $1 AND request_id = $2`, {
      bind: [roundId, requestId, dropOff!.id],
      transaction,
    });
    await sequelize().query(`UPDATE collection_requests SET status = 'collected', updated_at = now() WHERE id = $1`, {
      bind: [requestId],
      transaction,
    });
    await sequelize().query(
      `UPDATE collection_rounds r SET status = 'done', updated_at = now() WHERE r.id = $1 AND NOT EXISTS (
         SELECT 1 FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
          WHERE s.round_id = r.id AND c.status = 'planned')`,
      { bind: [roundId], transaction },
    );
    return roundSheet(caller, roundId, transaction);
  });
}
