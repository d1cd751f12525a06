/**
 * Collection contracts: residents who cannot carry ask for a collection on a date; coordinators
 * plan cargo-bike rounds for a date; volunteers see their round sheets and mark stops collected.
 * Requests are `.strict()`.
 */
import { z } from "zod";

const isoDate = z
  .string({ error: "Give the date as YYYY-MM-DD." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD.")
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), "That date does not exist.");

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

export interface CollectionRequestView {
  id: number;
  householdId: number;
  householdName: string;
  addressText: string;
  forDate: string;
  bucketCount: number;
  status: CollectionRequestStatus;
  roundId: number | null;
}

export interface RoundStopView {
  seq: number;
  requestId: number;
  householdId: number;
  householdName: string;
  addressText: string;
  lat: number;
  lng: number;
  bucketCount: number;
  loadKg: number;
  legM: number;
  status: CollectionRequestStatus;
  dropOffId: number | null;
}

export interface RoundSummary {
  id: number;
  forDate: string;
  volunteerId: number;
  volunteerName: string;
  endDigesterId: number;
  endDigesterName: string;
  totalM: number;
  loadKg: number;
  status: "planned" | "done" | "cancelled";
  stopCount: number;
  collectedCount: number;
}

export interface RoundSheet extends RoundSummary {
  start: { lat: number; lng: number } | null;
  endDigester: { id: number; name: string; siteDescription: string; lat: number; lng: number };
  endLegM: number;
  stops: RoundStopView[];
}

export interface PlanResult {
  forDate: string;
  rounds: RoundSummary[];
  unplaced: { requestId: number; householdName: string; reason: string; message: string }[];
  messages: string[];
  totalM: number;
  solveMs: number;
}
