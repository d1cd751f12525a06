/**
 * Feeding contracts: what went into a digester (from a drop-off or added by hand), with the
 * dilution water. Feeding beyond today's budget needs an explicit override with a reason,
 * which is recorded. Request schemas are `.strict()`.
 */
import { z } from "zod";
import { DROP_OFF_MIXES } from "../domain/drop-offs";
import { IsoDateSchema, noteText } from "./common";

export const FeedMixSchema = z.enum(DROP_OFF_MIXES, {
  error: `Choose what went in: one of ${DROP_OFF_MIXES.join(", ")}.`,
});

export const MAX_OVERRIDE_REASON_LENGTH = 500;
export const MAX_FEEDING_NOTE_LENGTH = 500;
/** Hand feedings may be recorded late, up to this many days back. */
export const MAX_LATE_FEEDING_DAYS = 7;
export const MAX_HAND_FEED_KG = 500;
export const MAX_WATER_LITRES = 5000;

/** `override: { reason }`: the steward's recorded reason for going beyond today's budget. */
export const BudgetOverrideSchema = z
  .object({
    reason: noteText("Say why this goes beyond today's budget.")
      .trim()
      .min(3, `Say why this goes beyond today's budget (3 to ${MAX_OVERRIDE_REASON_LENGTH} characters).`)
      .max(MAX_OVERRIDE_REASON_LENGTH, `Use at most ${MAX_OVERRIDE_REASON_LENGTH} characters.`),
  })
  .strict();
export type BudgetOverride = z.infer<typeof BudgetOverrideSchema>;

export const WaterLitresSchema = z
  .number({ error: `Dilution water must be a number from 0 to ${MAX_WATER_LITRES} litres.` })
  .min(0, { error: `Dilution water must be a number from 0 to ${MAX_WATER_LITRES} litres.` })
  .max(MAX_WATER_LITRES, { error: `Dilution water must be a number from 0 to ${MAX_WATER_LITRES} litres.` })
  .transform((v) => Math.round(v * 100) / 100);

const note = noteText("The note must be text.")
  .trim()
  .max(MAX_FEEDING_NOTE_LENGTH, `Use at most ${MAX_FEEDING_NOTE_LENGTH} characters.`)
  .nullish()
  .transform((v) => (v ? v : undefined));

/**
 * `POST /api/digesters/:id/feedings`: scraps added by hand. Without `waterLitres` the server
 * records the suggested dilution water (fresh kg × the budget's litres per kg). `fedOn` defaults
 * to today; an earlier day (up to 7 back) records a late entry, which is not checked against
 * that day's budget.
 */
export const CreateFeedingSchema = z
  .object({
    freshKg: z
      .number({ error: `Scraps must be a number from 0.1 to ${MAX_HAND_FEED_KG} kg.` })
      .min(0.1, { error: `Scraps must be a number from 0.1 to ${MAX_HAND_FEED_KG} kg.` })
      .max(MAX_HAND_FEED_KG, { error: `Scraps must be a number from 0.1 to ${MAX_HAND_FEED_KG} kg.` })
      .transform((v) => Math.round(v * 1000) / 1000),
    mix: FeedMixSchema.default("mixed"),
    citrusPercent: z
      .number({ error: "Citrus share must be a number from 0 to 100 %." })
      .min(0, { error: "Citrus share must be a number from 0 to 100 %." })
      .max(100, { error: "Citrus share must be a number from 0 to 100 %." })
      .transform((v) => Math.round(v * 100) / 100)
      .default(0),
    waterLitres: WaterLitresSchema.optional(),
    fedOn: IsoDateSchema.optional(),
    note,
    override: BudgetOverrideSchema.optional(),
  })
  .strict();
export type CreateFeeding = z.input<typeof CreateFeedingSchema>;
export type CreateFeedingParsed = z.output<typeof CreateFeedingSchema>;

/** `GET /api/digesters/:id/feedings?from=&to=` (and the CSV export): days, default the last 60. */
export const FeedingRangeQuerySchema = z
  .object({
    from: IsoDateSchema.optional(),
    to: IsoDateSchema.optional(),
  })
  .strict();
export type FeedingRangeQuery = z.output<typeof FeedingRangeQuerySchema>;

/** One feeding row. */
export const FeedingSchema = z.object({
  id: z.number().int(),
  digesterId: z.number().int(),
  fedOn: z.string(),
  fedAt: z.string(),
  freshKg: z.number(),
  kgVs: z.number(),
  waterLitres: z.number(),
  /** The drop-off it came from; null when added by hand. */
  dropOffId: z.number().int().nullable(),
  /** The drop-off's household, for feedings from drop-offs. */
  householdName: z.string().nullable(),
  mix: FeedMixSchema.nullable(),
  overrideReason: z.string().nullable(),
  note: z.string().nullable(),
  enteredBy: z.string().nullable(),
});
export type Feeding = z.infer<typeof FeedingSchema>;
export const FeedingListSchema = z.array(FeedingSchema);
