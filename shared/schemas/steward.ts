/**
 * The steward's day: for each digester they look after, today's feed budget with the binding
 * limit in words, the drop-offs waiting, the last readings and how old they are, and the
 * warnings with what to do. Plus the accept / feed / turn-away requests. Requests are `.strict()`.
 */
import { z } from "zod";
import { DROP_OFF_MIXES } from "../domain/drop-offs";
import type { FeedLimitName } from "../domain/feed-budget";
import { DigesterProfileSchema, DigesterStatusSchema, DigesterTodaySchema } from "./digester";
import { BudgetOverrideSchema, FeedingSchema, WaterLitresSchema } from "./feedings";
import { DropOffStatusSchema, TurnedAwayReasonSchema, type TURNED_AWAY_REASONS } from "./drop-offs";
import { noteText } from "./common";

/** Ages beyond which a reading no longer counts for the budget (DOMAIN.md §2: temperature 48 h, pH and acids 7 days). */
export const READING_MAX_AGE_HOURS = { temperature: 48, ph: 7 * 24, vfaTa: 7 * 24 } as const;

/** `POST /api/drop-offs/:id/accept`. `feedNow` also feeds it (a feeding row linked to the drop-off). */
export const AcceptDropOffSchema = z
  .object({
    feedNow: z.boolean({ error: "feedNow must be true or false." }).optional(),
    waterLitres: WaterLitresSchema.optional(),
    override: BudgetOverrideSchema.optional(),
  })
  .strict()
  .refine((v) => v.waterLitres === undefined || v.feedNow === true, {
    path: ["waterLitres"],
    message: "Dilution water is recorded when feeding: set feedNow to true, or feed it later.",
  });
export type AcceptDropOff = z.input<typeof AcceptDropOffSchema>;

/** `POST /api/drop-offs/:id/feed`: feed an accepted drop-off. */
export const FeedDropOffSchema = z
  .object({
    waterLitres: WaterLitresSchema.optional(),
    override: BudgetOverrideSchema.optional(),
  })
  .strict();
export type FeedDropOff = z.input<typeof FeedDropOffSchema>;

/** Plain words for the reasons a steward turns a drop-off away (the steward's side). */
export const TURN_AWAY_REASON_CHOICES: Readonly<Record<(typeof TURNED_AWAY_REASONS)[number], string>> = {
  contamination: "Contamination (something from the refuse list)",
  too_much_citrus: "Too much citrus",
  over_budget: "Over today's budget",
  other: "Other reason (say which in the note)",
};

/** `POST /api/drop-offs/:id/turn-away`. "other" needs a note saying why. */
export const TurnAwayDropOffSchema = z
  .object({
    reason: TurnedAwayReasonSchema,
    note: noteText("The note must be text.")
      .trim()
      .max(500, "Use at most 500 characters.")
      .nullish()
      .transform((v) => (v ? v : undefined)),
  })
  .strict()
  .refine((v) => v.reason !== "other" || (v.note !== undefined && v.note.length > 0), {
    path: ["note"],
    message: "Say in the note why it was turned away.",
  });
export type TurnAwayDropOff = z.input<typeof TurnAwayDropOffSchema>;

/** A drop-off as the steward handles it. */
export const StewardDropOffSchema = z.object({
  id: z.number().int(),
  digesterId: z.number().int(),
  householdName: z.string(),
  forDate: z.string(),
  bucketCount: z.number().int().nullable(),
  bucketLitres: z.number().nullable(),
  weightKg: z.number().nullable(),
  massSource: z.enum(["weighed", "estimated"]),
  freshKg: z.number(),
  kgVs: z.number(),
  mix: z.enum(DROP_OFF_MIXES),
  citrusPercent: z.number(),
  status: DropOffStatusSchema,
  turnedAwayReason: TurnedAwayReasonSchema.nullable(),
  note: z.string().nullable(),
  stewardNote: z.string().nullable(),
  overrideReason: z.string().nullable(),
  createdAt: z.string(),
  /** Whether it fits in today's room now (false for anything beyond the budget). */
  fitsToday: z.boolean(),
  /** Citrus share above the 10 % limit (DOMAIN.md §1). */
  citrusOverLimit: z.boolean(),
  /** Dilution water suggested when feeding it, litres (its mix's TS down to the digester's target, DOMAIN.md §2 limit 7). */
  suggestedWaterLitres: z.number(),
});
export type StewardDropOff = z.infer<typeof StewardDropOffSchema>;

/** The latest value of one kind of reading, how old it is, and whether it is too old to count. */
export const LatestValueSchema = z
  .object({
    value: z.number(),
    takenAt: z.string(),
    ageHours: z.number(),
    /** Older than the budget's limit for this kind (temperature 48 h, pH and acids 7 days). */
    stale: z.boolean(),
    maxAgeHours: z.number(),
  })
  .nullable();
export type LatestValue = z.infer<typeof LatestValueSchema>;

export const LatestReadingsSchema = z.object({
  temperatureC: LatestValueSchema,
  ph: LatestValueSchema,
  vfaTaRatio: LatestValueSchema,
  gasLevelPercent: LatestValueSchema,
  /** When anything was last logged; null when never. */
  lastReadingAt: z.string().nullable(),
});
export type LatestReadings = z.infer<typeof LatestReadingsSchema>;

/** Today's budget as the steward sees it: the public summary plus the figures they feed with. */
export const StewardBudgetSchema = DigesterTodaySchema.extend({
  /** kg VS and kg of scraps already fed or accepted today. */
  committedKgVs: z.number(),
  committedKgScraps: z.number(),
  /** Suggested dilution water, litres per kg of mixed scraps (DOMAIN.md §2 limit 7). */
  dilutionWaterLitresPerKg: z.number(),
  /** The digester's target slurry solids, % (for water suggestions of other mixes). */
  targetTsPercent: z.number(),
  /** Each limit on today's total load, kg VS/day (null when not applied). */
  limits: z.object({
    organicLoad: z.number().nullable(),
    hydraulic: z.number().nullable(),
    stability: z.number().nullable(),
    startUpRamp: z.number().nullable(),
    weekRamp: z.number().nullable(),
    rollingWeek: z.number().nullable(),
  } satisfies Record<FeedLimitName, z.ZodType>),
  /** Size of the "bucket" in budgetBuckets, litres, and its mass, kg. */
  bucketLitres: z.number(),
  bucketKg: z.number(),
  /** Resting or offline: no drop-offs are taken at all. */
  closed: z.boolean(),
});
export type StewardBudget = z.infer<typeof StewardBudgetSchema>;

/** One digester on the steward's today page. */
export const StewardDigesterDaySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  status: DigesterStatusSchema,
  statusReason: z.string().nullable(),
  workingVolumeM3: z.number(),
  budget: StewardBudgetSchema,
  readings: LatestReadingsSchema,
  /** Waiting for a decision: today's and earlier days' pending drop-offs, oldest first. */
  waiting: z.array(StewardDropOffSchema),
  /** Accepted but not fed yet. */
  accepted: z.array(StewardDropOffSchema),
  /** Fed today (from drop-offs and by hand). */
  fedToday: z.array(FeedingSchema),
});
export type StewardDigesterDay = z.infer<typeof StewardDigesterDaySchema>;

/** `GET /api/steward/today`. */
export const StewardTodaySchema = z.object({
  date: z.string(),
  digesters: z.array(StewardDigesterDaySchema),
});
export type StewardToday = z.infer<typeof StewardTodaySchema>;

/** Answer of accept / feed / turn-away: the drop-off now, the feeding when one was written, and the budget after. */
export const DropOffDecisionSchema = z.object({
  dropOff: StewardDropOffSchema,
  feeding: FeedingSchema.nullable(),
  budget: StewardBudgetSchema,
});
export type DropOffDecision = z.infer<typeof DropOffDecisionSchema>;

/** `GET /api/digesters/:id`: the profile and the steward's view of today. */
export const DigesterDetailSchema = z.object({
  profile: DigesterProfileSchema,
  day: StewardDigesterDaySchema,
});
export type DigesterDetail = z.infer<typeof DigesterDetailSchema>;

/** `POST /api/digesters/:id/feedings` → 201: the feeding and the budget after it. */
export const HandFeedingResultSchema = z.object({
  feeding: FeedingSchema,
  budget: StewardBudgetSchema,
});
export type HandFeedingResult = z.infer<typeof HandFeedingResultSchema>;
