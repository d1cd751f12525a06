/**
 * Contracts of the public calculator endpoints: strict requests (unknown keys
 * are rejected), ranges named in every message, and the responses. The
 * mapping from a parsed request to its response is in
 * `shared/domain/calculators.ts`.
 */
import { z } from "zod";
import { noteText } from "./common";
import { FEED_BINDINGS, FEED_LIMIT_NAMES, FEED_WARNING_CODES, FEED_WARNING_SEVERITIES } from "../domain/feed-budget";

/** A finite number in [min, max]; every failure (missing, wrong type, out of range) names the allowed range. */
function numberIn(label: string, min: number, max: number, unit: string) {
  const message = `${label} must be a number from ${min} to ${max}${unit === "" ? "" : ` ${unit}`}.`;
  return z.number({ error: message }).min(min, { error: message }).max(max, { error: message });
}

// ── Feed budget ────────────────────────────────────────────────────────────

/** Highest reference loading rate accepted with a recorded reason, kg VS/m³/d; the domain caps at 2.0 without one. */
export const OLR_REF_MAX_WITH_REASON = 5;

/** Feed-budget request: a digester's volume, temperature, readings and feeding history (see `computeFeedBudget`). */
export const FeedBudgetRequestSchema = z
  .object({
    workingVolumeM3: numberIn("Working volume", 0.05, 100, "m³"),
    temperatureC: numberIn("Temperature", -30, 90, "°C (or null when unknown)").nullable(),
    olrRefKgVsPerM3Day: numberIn(
      "Reference loading rate",
      0.1,
      OLR_REF_MAX_WITH_REASON,
      "kg VS/m³/day (above 2.0 only with olrOverrideReason)",
    ).optional(),
    olrOverrideReason: noteText("Override reason must be text of 3 to 300 characters.")
      .trim()
      .min(3, { error: "Override reason must be text of 3 to 300 characters." })
      .max(300, { error: "Override reason must be text of 3 to 300 characters." })
      .optional(),
    daysSinceStart: numberIn("Days since start", 0, 3650, "days")
      .int({ error: "Days since start must be a whole number from 0 to 3650 days." })
      .nullish(),
    gasBurns: z.boolean({ error: "gasBurns must be true or false." }).optional(),
    ph: numberIn("pH", 0, 14, "").nullish(),
    vfaTaRatio: numberIn("Acids/alkalinity ratio (VFA/TA)", 0, 5, "").nullish(),
    fedKgVsPrevious7Days: z
      .array(numberIn("Each daily load", 0, 1000, "kg VS"), {
        error: "fedKgVsPrevious7Days must be a list of up to 7 daily loads in kg VS, oldest first.",
      })
      .max(7, { error: "fedKgVsPrevious7Days must be a list of up to 7 daily loads in kg VS, oldest first." })
      .optional(),
    fedTodayKgVs: numberIn("Fed today", 0, 1000, "kg VS").optional(),
    scrapsTsPercent: numberIn("Scraps total solids", 1, 95, "% of fresh mass").optional(),
    scrapsVsPercentOfTs: numberIn("Scraps volatile solids", 1, 100, "% of total solids").optional(),
    targetTsPercent: numberIn("Target slurry total solids", 2, 15, "%").optional(),
    bucketLitres: numberIn("Bucket size", 0.5, 100, "L").optional(),
    bucketKgPerLitre: numberIn("Bucket density", 0.1, 1.2, "kg/L").optional(),
  })
  .strict()
  .refine(
    (body) =>
      body.olrRefKgVsPerM3Day === undefined || body.olrRefKgVsPerM3Day <= 2 || body.olrOverrideReason !== undefined,
    {
      path: ["olrOverrideReason"],
      error: "A reference loading rate above 2.0 kg VS/m³/day needs olrOverrideReason (3 to 300 characters).",
    },
  );
export type FeedBudgetRequest = z.infer<typeof FeedBudgetRequestSchema>;

const kgVsPerDayOrNull = z.number().min(0).nullable();

/** One warning beside a feed budget. */
export const FeedWarningSchema = z.object({
  code: z.enum(FEED_WARNING_CODES),
  severity: z.enum(FEED_WARNING_SEVERITIES),
  message: z.string(),
  actions: z.array(z.string()),
});
export type FeedWarningDto = z.infer<typeof FeedWarningSchema>;

/** Feed-budget response: kg VS, kg of scraps and buckets still welcome today, every limit, the binding one and why. */
export const FeedBudgetResponseSchema = z.object({
  budgetKgVs: z.number().min(0),
  budgetKgScraps: z.number().min(0),
  budgetBuckets: z.number().min(0),
  binding: z.enum(FEED_BINDINGS),
  limits: z.object(
    Object.fromEntries(FEED_LIMIT_NAMES.map((name) => [name, kgVsPerDayOrNull])) as Record<
      (typeof FEED_LIMIT_NAMES)[number],
      typeof kgVsPerDayOrNull
    >,
  ),
  dilutionWaterLitresPerKg: z.number().min(0),
  explanation: z.string(),
  warnings: z.array(FeedWarningSchema),
});
export type FeedBudgetResponse = z.infer<typeof FeedBudgetResponseSchema>;

// ── Gas holder ─────────────────────────────────────────────────────────────

const drumDiameterM = numberIn("Drum diameter", 0.2, 5, "m");
const drumMassKg = numberIn("Drum mass", 0.5, 5000, "kg");

/** Gas-holder request: floating drum size and mass, optional weights, rise and burner flow. */
export const GasHolderRequestSchema = z
  .object({
    drumDiameterM,
    drumMassKg,
    addedMassKg: numberIn("Added mass", 0, 5000, "kg").optional(),
    drumRiseM: numberIn("Drum rise", 0, 3, "m").optional(),
    burnerLitresPerHour: numberIn("Burner flow", 50, 2000, "L/h").optional(),
  })
  .strict();
export type GasHolderRequest = z.infer<typeof GasHolderRequestSchema>;

/** Gas-holder response: pressure in Pa, mbar and mm WC; stored litres and cooking minutes when the rise was given. */
export const GasHolderResponseSchema = z.object({
  pressurePa: z.number(),
  pressureMbar: z.number(),
  pressureMmWc: z.number(),
  storedLitres: z.number().optional(),
  cookingMinutes: z.number().optional(),
  cautions: z.array(z.string()),
});
export type GasHolderResponse = z.infer<typeof GasHolderResponseSchema>;

/** Weights-for-pressure request: drum and the pressure wanted. */
export const WeightsForPressureRequestSchema = z
  .object({
    drumDiameterM,
    drumMassKg,
    targetPressurePa: numberIn("Target pressure", 10, 10000, "Pa"),
  })
  .strict();
export type WeightsForPressureRequest = z.infer<typeof WeightsForPressureRequestSchema>;

/** Weights-for-pressure response: mass to add (0 when the drum alone exceeds the target, with a note first in cautions). */
export const WeightsForPressureResponseSchema = z.object({
  addedMassKg: z.number().min(0),
  cautions: z.array(z.string()),
});
export type WeightsForPressureResponse = z.infer<typeof WeightsForPressureResponseSchema>;

// ── Sizing ─────────────────────────────────────────────────────────────────

/** Sizing from daily slurry and retention time (V = S_d × RT). */
export const SizingFromSlurryRequestSchema = z
  .object({
    dailySlurryLitres: numberIn("Daily slurry", 1, 10000, "L/day"),
    retentionDays: numberIn("Retention time", 5, 400, "days"),
  })
  .strict();
export type SizingFromSlurryRequest = z.infer<typeof SizingFromSlurryRequestSchema>;

/** Sizing from daily scraps at a digester temperature. */
export const SizingFromScrapsRequestSchema = z
  .object({
    dailyScrapsKg: numberIn("Daily scraps", 0.1, 2000, "kg"),
    scrapsTsPercent: numberIn("Scraps total solids", 1, 95, "% of fresh mass").optional(),
    targetTsPercent: numberIn("Target slurry total solids", 2, 15, "%").optional(),
    // Below 10 °C digestion stops (f(T) = 0), so no volume would do.
    temperatureC: numberIn("Digester temperature", 10, 90, "°C (below 10 °C digestion stops)"),
  })
  .strict();
export type SizingFromScrapsRequest = z.infer<typeof SizingFromScrapsRequestSchema>;

/** Sizing request: one of the two shapes above, each strict. */
export const SizingRequestSchema = z.union([SizingFromSlurryRequestSchema, SizingFromScrapsRequestSchema], {
  error:
    "Give either dailySlurryLitres and retentionDays, or dailyScrapsKg and temperatureC (optionally scrapsTsPercent and targetTsPercent) — not a mix of both.",
});
export type SizingRequest = z.infer<typeof SizingRequestSchema>;

/** Sizing response for the slurry shape. */
export const SizingFromSlurryResponseSchema = z.object({ workingVolumeM3: z.number().min(0) });
/** Sizing response for the scraps shape. */
export const SizingFromScrapsResponseSchema = z.object({
  workingVolumeM3: z.number().min(0),
  dailySlurryLitres: z.number().min(0),
  retentionDays: z.number().min(0),
  dilutionWaterLitresPerDay: z.number().min(0),
});
/** Sizing response: either shape. */
export const SizingResponseSchema = z.union([SizingFromScrapsResponseSchema, SizingFromSlurryResponseSchema]);
export type SizingFromSlurryResponse = z.infer<typeof SizingFromSlurryResponseSchema>;
export type SizingFromScrapsResponse = z.infer<typeof SizingFromScrapsResponseSchema>;
export type SizingResponse = z.infer<typeof SizingResponseSchema>;

// ── Methane yield ──────────────────────────────────────────────────────────

/** Methane-yield request: Chen–Hashimoto inputs. */
export const MethaneYieldRequestSchema = z
  .object({
    b0M3PerKgVs: numberIn("Ultimate methane yield B0", 0.05, 1, "m³ CH4/kg VS"),
    s0KgVsPerM3: numberIn("Influent volatile solids S0", 1, 300, "kg VS/m³"),
    retentionDays: numberIn("Retention time", 1, 400, "days"),
    // The growth-rate fit behind the model ends at 60 °C.
    temperatureC: numberIn("Temperature", -30, 60, "°C (the model is fitted up to 60 °C)"),
  })
  .strict();
export type MethaneYieldRequest = z.infer<typeof MethaneYieldRequestSchema>;

/** Methane-yield response: μm (1/d), K, γ (m³ CH4/m³/d) and whether the microbes wash out. */
export const MethaneYieldResponseSchema = z.object({
  muMaxPerDay: z.number(),
  k: z.number(),
  methaneM3PerM3Day: z.number().min(0),
  washout: z.boolean(),
});
export type MethaneYieldResponse = z.infer<typeof MethaneYieldResponseSchema>;

// ── Titration ──────────────────────────────────────────────────────────────

/** Titration request: Nordmann A and B volumes, optional sample volume and acid normality. */
export const TitrationRequestSchema = z
  .object({
    aMl: numberIn("A (acid to pH 5.0)", 0.1, 100, "mL"),
    bMl: numberIn("B (acid from pH 5.0 to 4.4)", 0, 100, "mL"),
    sampleMl: numberIn("Sample volume", 1, 500, "mL").optional(),
    acidNormality: numberIn("Acid normality", 0.01, 2, "N").optional(),
  })
  .strict();
export type TitrationRequest = z.infer<typeof TitrationRequestSchema>;

/** Titration response: TAC (mg/L CaCO3), FOS (mg/L acetic acid), FOS/TAC and advice. */
export const TitrationResponseSchema = z.object({
  tacMgPerL: z.number().min(0),
  fosMgPerL: z.number().min(0),
  ratio: z.number().min(0),
  advice: z.string(),
});
export type TitrationResponse = z.infer<typeof TitrationResponseSchema>;

// ── Fertiliser allowance ───────────────────────────────────────────────────

/** Fertiliser-allowance request: bed area, digestate nitrogen and an optional limit. */
export const FertiliserAllowanceRequestSchema = z
  .object({
    bedAreaM2: numberIn("Bed area", 0.1, 100000, "m²"),
    nitrogenGPerL: numberIn("Digestate nitrogen", 0.1, 20, "g N/L"),
    limitKgNPerHaYear: numberIn("Nitrogen limit", 1, 500, "kg N/ha/year").optional(),
  })
  .strict();
export type FertiliserAllowanceRequest = z.infer<typeof FertiliserAllowanceRequestSchema>;

/** Fertiliser-allowance response: undiluted litres per year, dilution advice and cautions. */
export const FertiliserAllowanceResponseSchema = z.object({
  litresPerYear: z.number().min(0),
  dilution: z.string(),
  cautions: z.array(z.string()),
});
export type FertiliserAllowanceResponse = z.infer<typeof FertiliserAllowanceResponseSchema>;
