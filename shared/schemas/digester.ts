import { z } from "zod";
import { FEED_BINDINGS } from "../domain/feed-budget";
import { FeedWarningSchema } from "./calc";
import { isoDate, noteText, oneLineText } from "./common";

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
  /** Drop-offs waiting for a steward today, kg of scraps and kg VS. */
  pendingKgScraps: z.number(),
  pendingKgVs: z.number(),
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

// ── Profile, status, detail and history (the digester page) ───────────────────────────────

/** Heating and insulation choices (database checks in 0001-core.ts). */
export const DIGESTER_HEATINGS = ["none", "solar", "electric", "waste-heat"] as const;
export const DIGESTER_INSULATIONS = ["none", "partial", "full"] as const;

/** Highest reference loading rate the database takes, kg VS/m³/d; above 2.0 only with a recorded reason (DOMAIN.md §2 limit 1). */
export const PROFILE_OLR_REF_MAX = 4;

/** A finite number in [min, max]; every failure names the field and the range. */
function profileNumber(label: string, min: number, max: number, unit: string) {
  const message = `${label} must be a number from ${min} to ${max}${unit ? ` ${unit}` : ""}.`;
  return z.number({ error: message }).min(min, { error: message }).max(max, { error: message });
}

/** The settings a steward keeps for their digester. */
export const DigesterProfileSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  siteDescription: z.string(),
  status: DigesterStatusSchema,
  statusReason: z.string().nullable(),
  location: LatLngSchema,
  workingVolumeM3: z.number(),
  drumDiameterM: z.number().nullable(),
  drumMassKg: z.number().nullable(),
  addedMassKg: z.number(),
  burnerLitresPerHour: z.number(),
  heating: z.enum(DIGESTER_HEATINGS),
  insulation: z.enum(DIGESTER_INSULATIONS),
  startedOn: z.string(),
  gasFirstBurnedOn: z.string().nullable(),
  olrRefKgVsPerM3Day: z.number(),
  olrOverrideReason: z.string().nullable(),
  targetTsPercent: z.number(),
  bucketKgPerLitre: z.number(),
  stewards: z.array(z.object({ id: z.number().int(), name: z.string() })),
});
export type DigesterProfile = z.infer<typeof DigesterProfileSchema>;

/**
 * `PATCH /api/digesters/:id`: any of the profile settings. Ranges follow the database checks
 * and DOMAIN.md: OLRref above 2.0 kg VS/m³/d needs `olrOverrideReason` (checked with the stored
 * values too); gas cannot burn before the start.
 */
export const UpdateDigesterProfileSchema = z
  .object({
    name: oneLineText("Give a name.").trim().min(1, "Give a name.").max(120, "Use at most 120 characters.").optional(),
    siteDescription: noteText("The description must be text.")
      .trim()
      .max(500, "Use at most 500 characters.")
      .optional(),
    workingVolumeM3: profileNumber("Working volume", 0.05, 100, "m³").optional(),
    drumDiameterM: profileNumber("Drum diameter", 0.1, 10, "m").nullable().optional(),
    drumMassKg: profileNumber("Drum mass", 0, 5000, "kg").nullable().optional(),
    addedMassKg: profileNumber("Added weights", 0, 5000, "kg").optional(),
    burnerLitresPerHour: profileNumber("Burner flow", 50, 2000, "L/h").optional(),
    heating: z.enum(DIGESTER_HEATINGS, { error: `Heating must be one of ${DIGESTER_HEATINGS.join(", ")}.` }).optional(),
    insulation: z
      .enum(DIGESTER_INSULATIONS, { error: `Insulation must be one of ${DIGESTER_INSULATIONS.join(", ")}.` })
      .optional(),
    startedOn: isoDate("Start date").optional(),
    gasFirstBurnedOn: isoDate("Gas first burned").nullable().optional(),
    olrRefKgVsPerM3Day: profileNumber("Reference loading rate", 0.1, PROFILE_OLR_REF_MAX, "kg VS/m³/day").optional(),
    olrOverrideReason: noteText("The reason must be text.")
      .trim()
      .max(500, "Use at most 500 characters.")
      .nullable()
      .optional()
      .transform((v) => (v === "" ? null : v)),
    targetTsPercent: profileNumber("Target slurry solids", 2, 15, "%").optional(),
    bucketKgPerLitre: profileNumber("Bucket density", 0.1, 1.2, "kg/L").optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Change at least one setting.");
export type UpdateDigesterProfile = z.input<typeof UpdateDigesterProfileSchema>;
export type UpdateDigesterProfileParsed = z.output<typeof UpdateDigesterProfileSchema>;

/** `PUT /api/digesters/:id/status`: resting and offline need a reason and take no drop-offs. */
export const SetDigesterStatusSchema = z
  .object({
    status: DigesterStatusSchema,
    reason: noteText("The reason must be text.")
      .trim()
      .max(500, "Use at most 500 characters.")
      .nullish()
      .transform((v) => (v ? v : null)),
  })
  .strict()
  .refine((v) => v.status === "active" || v.reason !== null, {
    path: ["reason"],
    message: "Say why the digester is resting or offline.",
  });
export type SetDigesterStatus = z.input<typeof SetDigesterStatusSchema>;

/** `GET /api/digesters/:id/history?days=60`. */
export const DigesterHistoryQuerySchema = z
  .object({
    days: z.coerce
      .number({ error: "days must be a whole number from 7 to 365." })
      .int({ error: "days must be a whole number from 7 to 365." })
      .min(7, { error: "days must be a whole number from 7 to 365." })
      .max(365, { error: "days must be a whole number from 7 to 365." })
      .default(60),
  })
  .strict();

/** One day of the digester's chart series. */
export const DigesterHistoryDaySchema = z.object({
  date: z.string(),
  /** Fed (and, today, accepted) load, kg VS and kg of scraps. */
  loadKgVs: z.number(),
  loadKgScraps: z.number(),
  /** The organic-load limit at that day's temperature, kg VS (OLRref × f(T) × V); null without a temperature. */
  organicLimitKgVs: z.number().nullable(),
  /** The budget cap a steward's accept recorded that day (every limit, under the lock); null when none. */
  recordedCapKgVs: z.number().nullable(),
  temperatureMinC: z.number().nullable(),
  temperatureMeanC: z.number().nullable(),
  temperatureMaxC: z.number().nullable(),
  /** Last pH of the day. */
  ph: z.number().nullable(),
  /** Expected biogas from the 14-day mean load at the day's temperature (Chen–Hashimoto estimate), litres. */
  expectedBiogasLitres: z.number().nullable(),
  gasUsedMinutes: z.number().nullable(),
});
export type DigesterHistoryDay = z.infer<typeof DigesterHistoryDaySchema>;

export const DigesterHistorySchema = z.object({
  digesterId: z.number().int(),
  from: z.string(),
  to: z.string(),
  days: z.array(DigesterHistoryDaySchema),
});
export type DigesterHistory = z.infer<typeof DigesterHistorySchema>;
