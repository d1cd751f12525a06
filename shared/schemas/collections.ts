/**
 * Collection contracts: residents who cannot carry ask for a collection on a date; coordinators
 * plan cargo-bike rounds for a date; volunteers see their round sheets and mark stops collected.
 * Requests are `.strict()`; responses are plain `z.object`s (an added field does not break an older
 * client) that the API client parses.
 */
import { z } from "zod";
import { IsoDateSchema as isoDate } from "./common";

/** Kilograms a bucket is counted as when planning rounds: 10 L × 0.5 kg/L (the feed budget's default bucket). */
export const COLLECTION_BUCKET_KG = 5;

/** `POST /api/collection-requests`: for the caller's own household. */
export const CreateCollectionRequestSchema = z
  .object({
    forDate: isoDate,
    bucketCount: z
      .number({ error: "Buckets must be a whole number from 1 to 20." })
      .int("Buckets must be a whole number from 1 to 20.")
      .min(1, "Buckets must be a whole number from 1 to 20.")
      .max(20, "Buckets must be a whole number from 1 to 20."),
  })
  .strict();
export type CreateCollectionRequest = z.infer<typeof CreateCollectionRequestSchema>;

export const CollectionRequestsQuerySchema = z
  .object({ mine: z.enum(["true", "false"]).optional(), date: isoDate.optional() })
  .strict();

/** A row id from the path: a PostgreSQL integer (larger would be a 500 from the database). */
const pathId = z.coerce.number({ error: "must be a number" }).int().positive().max(2_147_483_647);
export const IdParamsSchema = z.object({ id: pathId }).strict();
export const StopParamsSchema = z.object({ id: pathId, requestId: pathId }).strict();

export const PlanRoundsSchema = z.object({ forDate: isoDate }).strict();
export const RoundsQuerySchema = z.object({ date: isoDate.optional() }).strict();

export const COLLECTION_REQUEST_STATUSES = ["open", "planned", "collected", "cancelled"] as const;
export type CollectionRequestStatus = (typeof COLLECTION_REQUEST_STATUSES)[number];

export const COLLECTION_REQUEST_STATUS_LABELS: Readonly<Record<CollectionRequestStatus, string>> = {
  open: "Asked, not planned yet",
  planned: "On a volunteer's round",
  collected: "Collected",
  cancelled: "Cancelled",
};

export const CollectionRequestStatusSchema = z.enum(COLLECTION_REQUEST_STATUSES);

/** A point on the map, degrees (WGS 84). */
const latLng = z.object({ lat: z.number(), lng: z.number() });

/** A collection request as the API answers it (`POST /api/collection-requests`, `…/:id/cancel`). */
export const CollectionRequestViewSchema = z.object({
  id: z.number(),
  householdId: z.number(),
  householdName: z.string(),
  addressText: z.string(),
  forDate: z.string(),
  bucketCount: z.number(),
  status: CollectionRequestStatusSchema,
  roundId: z.number().nullable(),
});
export type CollectionRequestView = z.infer<typeof CollectionRequestViewSchema>;

/** `GET /api/collection-requests`. */
export const CollectionRequestListSchema = z.object({ requests: z.array(CollectionRequestViewSchema) });
export type CollectionRequestList = z.infer<typeof CollectionRequestListSchema>;

/** One stop of a round sheet, in order; `loadKg` in kg, `legM` in metres from the previous point. */
export const RoundStopViewSchema = z.object({
  seq: z.number(),
  requestId: z.number(),
  householdId: z.number(),
  householdName: z.string(),
  addressText: z.string(),
  lat: z.number(),
  lng: z.number(),
  bucketCount: z.number(),
  loadKg: z.number(),
  legM: z.number(),
  status: CollectionRequestStatusSchema,
  dropOffId: z.number().nullable(),
});
export type RoundStopView = z.infer<typeof RoundStopViewSchema>;

export const ROUND_STATUSES = ["planned", "done", "cancelled"] as const;

/** A round in a list; `totalM` in metres, `loadKg` in kg. */
export const RoundSummarySchema = z.object({
  id: z.number(),
  forDate: z.string(),
  volunteerId: z.number(),
  volunteerName: z.string(),
  endDigesterId: z.number(),
  endDigesterName: z.string(),
  totalM: z.number(),
  loadKg: z.number(),
  status: z.enum(ROUND_STATUSES),
  stopCount: z.number(),
  collectedCount: z.number(),
});
export type RoundSummary = z.infer<typeof RoundSummarySchema>;

/** `GET /api/collection-rounds`. */
export const RoundListSchema = z.object({ rounds: z.array(RoundSummarySchema) });
export type RoundList = z.infer<typeof RoundListSchema>;

/** `GET /api/collection-rounds/:id` and marking a stop collected: the round sheet. */
export const RoundSheetSchema = RoundSummarySchema.extend({
  start: latLng.nullable(),
  endDigester: z.object({
    id: z.number(),
    name: z.string(),
    siteDescription: z.string(),
    lat: z.number(),
    lng: z.number(),
  }),
  endLegM: z.number(),
  stops: z.array(RoundStopViewSchema),
});
export type RoundSheet = z.infer<typeof RoundSheetSchema>;

/** `POST /api/collection-rounds/plan`: the date's rounds and the requests that could not be placed. */
export const PlanResultSchema = z.object({
  forDate: z.string(),
  rounds: z.array(RoundSummarySchema),
  unplaced: z.array(
    z.object({ requestId: z.number(), householdName: z.string(), reason: z.string(), message: z.string() }),
  ),
  messages: z.array(z.string()),
  totalM: z.number(),
  solveMs: z.number(),
});
export type PlanResult = z.infer<typeof PlanResultSchema>;
