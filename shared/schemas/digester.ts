import { z } from "zod";
import { FEED_BINDINGS } from "../domain/feed-budget";
import { FeedWarningSchema } from "./calc";

export const DigesterStatusSchema = z.enum(["active", "resting", "offline"]);
export type DigesterStatus = z.infer<typeof DigesterStatusSchema>;

export const LatLngSchema = z.object({
  lat: z.number().min(-90).max(90),
  lng: z.number().min(-180).max(180),
});

/** What anyone may see of a digester: where it is and whether it is taking scraps. */
export const PublicDigesterSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  status: DigesterStatusSchema,
  workingVolumeM3: z.number(),
  location: LatLngSchema,
  siteDescription: z.string(),
});
export type PublicDigester = z.infer<typeof PublicDigesterSchema>;
export const PublicDigesterListSchema = z.array(PublicDigesterSchema);

/** Today's room at a digester, as every signed-in person sees it. */
export const DigesterTodaySchema = z.object({
  date: z.string(),
  budgetKgVs: z.number(),
  budgetKgScraps: z.number(),
  budgetBuckets: z.number(),
  binding: z.enum(FEED_BINDINGS),
  explanation: z.string(),
  warnings: z.array(FeedWarningSchema),
  /** Drop-offs waiting for a steward today, kg of scraps. */
  pendingKgScraps: z.number(),
  temperatureC: z.number().nullable(),
});
export type DigesterToday = z.infer<typeof DigesterTodaySchema>;

/** `GET /api/digesters`: each digester with its state today. */
export const DigesterSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  status: DigesterStatusSchema,
  statusReason: z.string().nullable(),
  location: LatLngSchema,
  siteDescription: z.string(),
  workingVolumeM3: z.number(),
  today: DigesterTodaySchema,
});
export type DigesterSummary = z.infer<typeof DigesterSummarySchema>;
export const DigesterSummaryListSchema = z.array(DigesterSummarySchema);
