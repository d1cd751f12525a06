/**
 * Today's feed budget for one digester: seven limits, the smallest binds
 * (DOMAIN.md §2). Pure: the caller picks the readings (see
 * {@link pickDigesterTemperature}, {@link latestReadingWithin}) and passes
 * the feeding history.
 */
import { type Kg, type KgVs, type KgVsPerDay, kg, kgVs, kgVsPerDay } from "../units";
import {
  DEFAULT_BUCKET_KG_PER_LITRE,
  DEFAULT_SCRAPS_TS_PERCENT,
  DEFAULT_SCRAPS_VS_PERCENT_OF_TS,
  freshKgFromKgVs,
} from "./scraps";
import {
  DEFAULT_OLR_REF_KG_VS_PER_M3_DAY,
  DEFAULT_TARGET_TS_PERCENT,
  dailySlurryLitresFromVolume,
  dilutionWaterPerKg,
  minimumRetentionDays,
  WARM_RETENTION_FROM_C,
} from "./sizing";
import {
  ACID_HALVE_ACTIONS,
  ACID_HOLD_ACTIONS,
  ACID_STOP_ACTIONS,
  NO_PH_FACTOR,
  type StabilityAssessment,
  assessStability,
} from "./stability";
import { TOO_COLD_BELOW_C, temperatureFactor } from "./temperature";

export { temperatureFactor, pickDigesterTemperature, latestReadingWithin } from "./temperature";
/** Reading types used with the temperature helpers re-exported above. */
export type { TimedReading, PickedTemperature, TemperatureBasis } from "./temperature";

/** Highest OLRref a steward may set without a recorded reason, kg VS/m³/d [2ary: Energies 2020 13:1279, heated stirred food-waste digesters]. */
export const OLR_REF_CAP_KG_VS_PER_M3_DAY = 2.0;
/** Length of the start-up ramp, days (DOMAIN.md §2 limit 4 [judgement]). */
export const START_UP_RAMP_DAYS = 42;
/** Share of the organic limit allowed on the first day the gas burns (DOMAIN.md §2 limit 4 [judgement]). */
export const START_UP_INITIAL_SHARE = 0.25;
/** Today's load may be at most this × the previous 7 days' mean (DOMAIN.md §2 limit 5 [judgement]). */
export const WEEK_RAMP_FACTOR = 1.2;
/** …but the week-on-week limit never falls below this share of the organic limit (DOMAIN.md §2 limit 5 [judgement]). */
export const WEEK_RAMP_FLOOR_SHARE = 0.25;
/** Bucket size used for "buckets" when none is given, litres [judgement: a common kitchen caddy]. */
export const DEFAULT_BUCKET_LITRES = 10;

/** Names of the limits, in the order used to name the binding one on a tie (the more basic reason first). */
export const FEED_LIMIT_NAMES = [
  "organicLoad",
  "hydraulic",
  "stability",
  "startUpRamp",
  "weekRamp",
  "rollingWeek",
] as const;

/** One feed limit. Temperature is folded into `organicLoad` through f(T). */
export type FeedLimitName = (typeof FEED_LIMIT_NAMES)[number];

/** What can set today's budget: a limit, or a missing temperature (then the budget is 0). */
export const FEED_BINDINGS = [...FEED_LIMIT_NAMES, "temperatureUnknown"] as const;

/** One value of {@link FEED_BINDINGS}. */
export type FeedBinding = (typeof FEED_BINDINGS)[number];

/** Plain names of what binds; each appears (case-insensitively) in the explanation when it binds. */
export const FEED_LIMIT_LABELS: Readonly<Record<FeedBinding, string>> = {
  organicLoad: "organic load limit",
  hydraulic: "liquid limit",
  stability: "acid check",
  startUpRamp: "start-up ramp",
  weekRamp: "week-on-week rise",
  rollingWeek: "rolling week",
  temperatureUnknown: "log a temperature",
};

/** Input of {@link computeFeedBudget}; mirrors the feed-budget API request. */
export interface FeedBudgetInput {
  readonly workingVolumeM3: number;
  /** Digester temperature to budget with (see {@link pickDigesterTemperature}); null when unknown → budget 0. */
  readonly temperatureC: number | null;
  /** Reference organic loading rate at ≥ 30 °C, kg VS/m³/d; default 1.5, capped at 2.0 without `olrOverrideReason`. */
  readonly olrRefKgVsPerM3Day?: number;
  /** The steward's recorded reason for an OLRref above 2.0; lifts the cap. */
  readonly olrOverrideReason?: string | null;
  /** Days since the start-up began; null/undefined = established digester. */
  readonly daysSinceStart?: number | null;
  /** During start-up: false = the gas does not burn yet → no feed. */
  readonly gasBurns?: boolean | null;
  /** Latest pH within 7 days, if any. */
  readonly ph?: number | null;
  /** Latest VFA/TA (FOS/TAC) ratio within 7 days, if any. */
  readonly vfaTaRatio?: number | null;
  /** Up to 7 daily loads (kg VS) before today, oldest first; missing days count as 0; omitted = no history (planning). */
  readonly fedKgVsPrevious7Days?: readonly number[] | null;
  /** kg VS already fed today. */
  readonly fedTodayKgVs?: number | null;
  readonly scrapsTsPercent?: number | null;
  readonly scrapsVsPercentOfTs?: number | null;
  /** Target slurry TS, % (default 8). */
  readonly targetTsPercent?: number | null;
  /** Bucket size for the "buckets" figure, litres (default 10). */
  readonly bucketLitres?: number | null;
  /** Bulk density of scraps in a bucket, kg/L (default 0.5). */
  readonly bucketKgPerLitre?: number | null;
}

/** Codes of feed-budget warnings. */
export const FEED_WARNING_CODES = [
  "temperatureUnknown",
  "tooCold",
  "cool",
  "noRecentPh",
  "acidStop",
  "acidHalve",
  "acidHold",
  "holdWithoutHistory",
  "noHistory",
  "startUpNoGas",
  "startUpConfirmGas",
  "olrCapped",
  "olrOverride",
  "overLimitToday",
] as const;

/** One feed-budget warning code. */
export type FeedWarningCode = (typeof FEED_WARNING_CODES)[number];

/** Severities of feed-budget warnings, most severe first. */
export const FEED_WARNING_SEVERITIES = ["stop", "caution", "info"] as const;

/** A warning beside the budget: `stop` = do not feed, `caution` = feed less or act, `info` = worth knowing. */
export interface FeedWarning {
  readonly code: FeedWarningCode;
  readonly severity: (typeof FEED_WARNING_SEVERITIES)[number];
  readonly message: string;
  /** Steps to take, in order; empty when there is nothing to do. */
  readonly actions: readonly string[];
}

/** Result of {@link computeFeedBudget}; mirrors the feed-budget API response. */
export interface FeedBudget {
  /** kg VS still welcome today: max(0, min(limits) − fed today). */
  readonly budgetKgVs: KgVs;
  /** Fresh kg of scraps of the given (or default) composition holding `budgetKgVs`. */
  readonly budgetKgScraps: Kg;
  /** `budgetKgScraps` in buckets of `bucketLitres` × `bucketKgPerLitre`. */
  readonly budgetBuckets: number;
  readonly binding: FeedBinding;
  /** Each limit on today's total load, kg VS/day; null when not applied. */
  readonly limits: Readonly<Record<FeedLimitName, KgVsPerDay | null>>;
  /** Dilution water per kg of scraps, L/kg (w = TS/TS_target − 1). */
  readonly dilutionWaterLitresPerKg: number;
  /** One or two sentences a steward understands, naming the binding limit. */
  readonly explanation: string;
  readonly warnings: readonly FeedWarning[];
}

/**
 * Today's feed budget (DOMAIN.md §2). Limits on today's total load, kg VS/d,
 * with V the working volume (m³) and f(T) from {@link temperatureFactor}:
 *
 * 1–2. organicLoad = OLRref × f(T) × V (OLRref default 1.5 [read: Werner,
 *      Stöhr & Hees 1989 §5.1]; capped at 2.0 without a recorded reason
 *      [2ary: Energies 2020 13:1279]).
 * 3. stability = s × organicLoad, s from {@link assessStability} (0 stop,
 *    0.5 halve, 0.8 no pH in 7 days, else 1); in the hold band
 *    (VFA/TA 0.4–0.5) also ≤ the previous 7 days' mean (without history:
 *    ≤ half the organic limit) [read: ManTech #127, Gerardi 2003; bands judgement].
 * 4. startUpRamp (daysSinceStart given): 0 while the gas does not burn, then
 *    (0.25 + 0.75 × d/42) × organicLoad until day 42 [judgement].
 * 5. weekRamp = max(1.2 × mean of the 7 days before today, 0.25 × organicLoad) [judgement].
 * 6. rollingWeek = max(0, 7 × organicLoad − Σ of the 6 days before today) [judgement].
 *    5 and 6 need history; without it they are null and a warning says so.
 * 7. hydraulic = (V × 1000 / HRTmin(T)) ÷ (1 + w) × TS × VS, i.e. daily
 *    slurry ≤ V/HRTmin (≈ 1 kg/L) turned into kg VS via the scraps' VS per
 *    fresh kg; HRTmin 40 d at ≥ 20 °C, 100 d below [read: *Biogas Digest
 *    Vol. II* p. 40; Sasse 1988 §2].
 *
 * budget = max(0, min(limits) − fedToday). Unknown temperature → budget 0,
 * binding "temperatureUnknown" (never assume warm). Ties name the more basic
 * limit first ({@link FEED_LIMIT_NAMES} order).
 */
export function computeFeedBudget(input: FeedBudgetInput): FeedBudget {
  const warnings: FeedWarning[] = [];
  const volumeM3 = Math.max(0, input.workingVolumeM3);
  const temperatureC = input.temperatureC !== null && Number.isFinite(input.temperatureC) ? input.temperatureC : null;
  const tsPercent = input.scrapsTsPercent ?? DEFAULT_SCRAPS_TS_PERCENT;
  const vsPercentOfTs = input.scrapsVsPercentOfTs ?? DEFAULT_SCRAPS_VS_PERCENT_OF_TS;
  const waterPerKg = dilutionWaterPerKg(tsPercent, input.targetTsPercent ?? DEFAULT_TARGET_TS_PERCENT);
  const fedTodayKgVs = Math.max(0, input.fedTodayKgVs ?? 0);
  const history = input.fedKgVsPrevious7Days?.slice(-7).map((load) => Math.max(0, load)) ?? null;
  const olrRef = resolveOlrRef(input, warnings);

  // Hydraulic: needs no temperature factor, and with no reading assumes the cold retention.
  const hrtMinDays = minimumRetentionDays(temperatureC);
  const maxSlurryLitres = dailySlurryLitresFromVolume(volumeM3, hrtMinDays);
  const hydraulic = (maxSlurryLitres / (1 + waterPerKg)) * (tsPercent / 100) * (vsPercentOfTs / 100);

  const limits: Record<FeedLimitName, number | null> = {
    organicLoad: null,
    hydraulic,
    stability: null,
    startUpRamp: null,
    weekRamp: null,
    rollingWeek: null,
  };
  const stability = assessStability({ ph: input.ph, vfaTaRatio: input.vfaTaRatio });
  const weekMeanKgVs = history === null ? null : sum(history) / 7;
  const daysSinceStart = input.daysSinceStart ?? null;
  const inStartUp = daysSinceStart !== null && (input.gasBurns === false || daysSinceStart < START_UP_RAMP_DAYS);

  if (temperatureC === null) {
    warnings.unshift({
      code: "temperatureUnknown",
      severity: "stop",
      message:
        "Budget unknown — log a temperature. With no digester reading in the last 3 days the budget is 0: a cold digester fed as if warm turns sour.",
      actions: ["Measure the digester temperature and log it."],
    });
  } else {
    const organic = olrRef * temperatureFactor(temperatureC) * volumeM3;
    limits.organicLoad = organic;
    limits.stability = stabilityLimit(stability, organic, weekMeanKgVs, warnings);
    if (daysSinceStart !== null && inStartUp) {
      limits.startUpRamp =
        input.gasBurns === false
          ? 0
          : (START_UP_INITIAL_SHARE +
              ((1 - START_UP_INITIAL_SHARE) * Math.max(0, daysSinceStart)) / START_UP_RAMP_DAYS) *
            organic;
    }
    if (history !== null && weekMeanKgVs !== null) {
      limits.weekRamp = Math.max(WEEK_RAMP_FACTOR * weekMeanKgVs, WEEK_RAMP_FLOOR_SHARE * organic);
      limits.rollingWeek = Math.max(0, 7 * organic - sum(history.slice(-6)));
    }
    pushTemperatureWarnings(temperatureC, warnings);
  }
  pushStabilityWarnings(stability, input, warnings);
  if (inStartUp) pushStartUpWarnings(input.gasBurns, warnings);
  if (history === null) {
    warnings.push({
      code: "noHistory",
      severity: "info",
      message:
        "No feeding history given: the week-on-week and rolling-week limits are not applied, so this is a planning figure.",
      actions: [],
    });
  }

  let binding: FeedBinding = "temperatureUnknown";
  let smallest = 0;
  if (temperatureC !== null) {
    smallest = Math.min(...FEED_LIMIT_NAMES.flatMap((name) => (limits[name] === null ? [] : [limits[name]])));
    const tolerance = 1e-12 * Math.max(1, Math.abs(smallest));
    binding = FEED_LIMIT_NAMES.find((name) => limits[name] !== null && limits[name] <= smallest + tolerance)!;
  }
  const budgetKgVs = Math.max(0, smallest - fedTodayKgVs);
  if (temperatureC !== null && fedTodayKgVs > smallest + 1e-9) {
    warnings.push({
      code: "overLimitToday",
      severity: "caution",
      message: `Already fed ${formatNumber(fedTodayKgVs)} kg VS today, above today's limit of ${formatNumber(smallest)} kg VS.`,
      actions: ["Feed nothing more today.", "Watch the gas and pH over the next days."],
    });
  }

  const budgetKgScraps = freshKgFromKgVs(budgetKgVs, tsPercent, vsPercentOfTs);
  const bucketLitres = input.bucketLitres ?? DEFAULT_BUCKET_LITRES;
  const bucketKg = bucketLitres * (input.bucketKgPerLitre ?? DEFAULT_BUCKET_KG_PER_LITRE);
  const budgetBuckets = bucketKg > 0 ? budgetKgScraps / bucketKg : 0;

  const explanation = [
    explainBinding({
      binding,
      temperatureC,
      limits,
      stability,
      input,
      weekMeanKgVs,
      hrtMinDays,
      maxSlurryLitres,
      volumeM3,
    }),
    explainRemainder(budgetKgVs, budgetKgScraps, budgetBuckets, bucketLitres, fedTodayKgVs, binding),
  ]
    .filter((sentence) => sentence !== "")
    .join(" ");

  return {
    budgetKgVs: kgVs(budgetKgVs),
    budgetKgScraps: kg(budgetKgScraps),
    budgetBuckets,
    binding,
    limits: {
      organicLoad: brandOrNull(limits.organicLoad),
      hydraulic: brandOrNull(limits.hydraulic),
      stability: brandOrNull(limits.stability),
      startUpRamp: brandOrNull(limits.startUpRamp),
      weekRamp: brandOrNull(limits.weekRamp),
      rollingWeek: brandOrNull(limits.rollingWeek),
    },
    dilutionWaterLitresPerKg: waterPerKg,
    explanation,
    warnings,
  };
}

const sum = (values: readonly number[]): number => values.reduce((total, value) => total + value, 0);
const brandOrNull = (value: number | null): KgVsPerDay | null => (value === null ? null : kgVsPerDay(value));

function resolveOlrRef(input: FeedBudgetInput, warnings: FeedWarning[]): number {
  const requested = input.olrRefKgVsPerM3Day ?? DEFAULT_OLR_REF_KG_VS_PER_M3_DAY;
  if (requested <= OLR_REF_CAP_KG_VS_PER_M3_DAY) return Math.max(0, requested);
  const reason = input.olrOverrideReason?.trim() ?? "";
  if (reason === "") {
    warnings.push({
      code: "olrCapped",
      severity: "caution",
      message: `The loading rate ${formatNumber(requested)} kg VS/m³/day is above ${OLR_REF_CAP_KG_VS_PER_M3_DAY} and no reason was recorded, so ${OLR_REF_CAP_KG_VS_PER_M3_DAY} is used.`,
      actions: ["Record why this digester can take more (heated, stirred, tested) to lift the cap."],
    });
    return OLR_REF_CAP_KG_VS_PER_M3_DAY;
  }
  warnings.push({
    code: "olrOverride",
    severity: "info",
    message: `Loading rate ${formatNumber(requested)} kg VS/m³/day is above the usual ${OLR_REF_CAP_KG_VS_PER_M3_DAY}, set by the steward: "${reason}".`,
    actions: [],
  });
  return requested;
}

function stabilityLimit(
  stability: StabilityAssessment,
  organicKgVs: number,
  weekMeanKgVs: number | null,
  warnings: FeedWarning[],
): number {
  const scaled = stability.factor * organicKgVs;
  if (!stability.holdAtWeekMean) return scaled;
  if (weekMeanKgVs !== null) return Math.min(scaled, weekMeanKgVs);
  warnings.push({
    code: "holdWithoutHistory",
    severity: "caution",
    message: "Acids are creeping up but no feeding history was given, so the budget is held at half the organic limit.",
    actions: [],
  });
  return Math.min(scaled, 0.5 * organicKgVs);
}

function pushTemperatureWarnings(temperatureC: number, warnings: FeedWarning[]): void {
  if (temperatureC < TOO_COLD_BELOW_C) {
    warnings.push({
      code: "tooCold",
      severity: "stop",
      message: `Too cold (${formatTemperature(temperatureC)}): below ${TOO_COLD_BELOW_C} °C the digester cannot digest, so feeding only stores acid.`,
      actions: ["Do not feed until the digester is warmer.", "Insulate or cover the digester if you can."],
    });
  } else if (temperatureC < WARM_RETENTION_FROM_C) {
    warnings.push({
      code: "cool",
      severity: "info",
      message: `Cool (${formatTemperature(temperatureC)}): the digester works slowly, so it takes less and the slurry needs 100 days inside.`,
      actions: [],
    });
  }
}

function pushStabilityWarnings(stability: StabilityAssessment, input: FeedBudgetInput, warnings: FeedWarning[]): void {
  const readings = describeReadings(input);
  if (stability.band === "stop") {
    warnings.push({
      code: "acidStop",
      severity: "stop",
      message: `Acid warning (${readings}): stop feeding.`,
      actions: ACID_STOP_ACTIONS,
    });
  } else if (stability.band === "halve") {
    warnings.push({
      code: "acidHalve",
      severity: "caution",
      message: `Acids rising (${readings}): feed half the usual amount, no bread or sugary food.`,
      actions: ACID_HALVE_ACTIONS,
    });
  } else if (stability.band === "hold") {
    warnings.push({
      code: "acidHold",
      severity: "caution",
      message: `Acids creeping up (${readings}): do not feed more than last week's daily average.`,
      actions: ACID_HOLD_ACTIONS,
    });
  }
  if (stability.phMissing) {
    warnings.push({
      code: "noRecentPh",
      severity: "caution",
      message: `No pH reading in the last 7 days: measure pH. Until then the budget is ${Math.round(NO_PH_FACTOR * 100)} % of normal.`,
      actions: ["Measure pH and log it."],
    });
  }
}

function pushStartUpWarnings(gasBurns: boolean | null | undefined, warnings: FeedWarning[]): void {
  if (gasBurns === false) {
    warnings.push({
      code: "startUpNoGas",
      severity: "stop",
      message: "Starting up: no feed until the gas burns.",
      actions: ["Test the gas at the burner every few days.", "Keep the digester warm."],
    });
  } else if (gasBurns === undefined || gasBurns === null) {
    warnings.push({
      code: "startUpConfirmGas",
      severity: "info",
      message: "Starting up: feed only once the gas burns. Confirm that it does.",
      actions: [],
    });
  }
}

function describeReadings(input: FeedBudgetInput): string {
  const parts: string[] = [];
  if (input.ph !== undefined && input.ph !== null) parts.push(`pH ${input.ph.toFixed(1)}`);
  if (input.vfaTaRatio !== undefined && input.vfaTaRatio !== null)
    parts.push(`acids/alkalinity ${input.vfaTaRatio.toFixed(2)}`);
  return parts.length > 0 ? parts.join(", ") : "no recent readings";
}

function explainBinding(ctx: {
  binding: FeedBinding;
  temperatureC: number | null;
  limits: Record<FeedLimitName, number | null>;
  stability: StabilityAssessment;
  input: FeedBudgetInput;
  weekMeanKgVs: number | null;
  hrtMinDays: number;
  maxSlurryLitres: number;
  volumeM3: number;
}): string {
  const { binding, temperatureC, limits } = ctx;
  const limitText = (name: FeedLimitName) => `${formatNumber(limits[name] ?? 0)} kg VS a day`;
  switch (binding) {
    case "temperatureUnknown":
      return "Budget unknown — log a temperature: with no digester reading in the last 3 days nothing is fed.";
    case "organicLoad": {
      const factor = temperatureFactor(temperatureC ?? Number.NaN);
      const t = formatTemperature(temperatureC ?? 0);
      if (factor === 0) {
        return `Too cold (${t}): below ${TOO_COLD_BELOW_C} °C the digester cannot digest, so the organic load limit is 0.`;
      }
      if (factor < 1) {
        return `Cold (${t}): the digester can take about ${fractionWords(factor)} of a warm day's feed (${Math.round(factor * 100)} %); the organic load limit for ${formatNumber(ctx.volumeM3)} m³ is ${limitText("organicLoad")}.`;
      }
      return `Warm (${t}): the organic load limit for ${formatNumber(ctx.volumeM3)} m³ is ${limitText("organicLoad")}.`;
    }
    case "hydraulic":
      return `Liquid limit: scraps plus dilution water may not exceed ${formatNumber(ctx.maxSlurryLitres)} L a day, so the slurry stays at least ${ctx.hrtMinDays} days in the digester (${limitText("hydraulic")}).`;
    case "stability": {
      const readings = describeReadings(ctx.input);
      switch (ctx.stability.band) {
        case "stop":
          return `Acid check (${readings}): stop feeding today — stir, add sodium bicarbonate and test again in 2–3 days.`;
        case "halve":
          return `Acid check (${readings}): acids are rising, so feed half the usual amount (${limitText("stability")}) and no bread or sugary food.`;
        case "hold":
          return `Acid check (${readings}): acids are creeping up, so keep to last week's average (${limitText("stability")}).`;
        case "ok":
          return `Acid check: no pH reading in the last 7 days, so the budget is held at ${Math.round(NO_PH_FACTOR * 100)} % (${limitText("stability")}) until you measure.`;
      }
      break;
    }
    case "startUpRamp": {
      if (ctx.input.gasBurns === false) return "Start-up ramp: no feed until the gas burns.";
      const day = Math.max(0, ctx.input.daysSinceStart ?? 0);
      const organic = limits.organicLoad ?? 0;
      const share = organic > 0 ? (limits.startUpRamp ?? 0) / organic : 0;
      return `Start-up ramp (day ${Math.floor(day)} of ${START_UP_RAMP_DAYS}): the load builds up slowly, to ${Math.round(share * 100)} % of full feed today (${limitText("startUpRamp")}).`;
    }
    case "weekRamp":
      return `Week-on-week rise: today's feed may be at most ${Math.round((WEEK_RAMP_FACTOR - 1) * 100)} % above last week's daily average of ${formatNumber(ctx.weekMeanKgVs ?? 0)} kg VS, so the microbes can keep up (${limitText("weekRamp")}).`;
    case "rollingWeek":
      return `Rolling week: the last 6 days already used most of this week's allowance, and missed days are not caught up in one go (${limitText("rollingWeek")}).`;
  }
  return "";
}

function explainRemainder(
  budgetKgVs: number,
  budgetKgScraps: number,
  budgetBuckets: number,
  bucketLitres: number,
  fedTodayKgVs: number,
  binding: FeedBinding,
): string {
  if (binding === "temperatureUnknown") return "";
  if (budgetKgVs <= 0) {
    return fedTodayKgVs > 0 ? "Today's limit is reached: nothing more today." : "Nothing can be fed today.";
  }
  const already = fedTodayKgVs > 0 ? ` after the ${formatNumber(fedTodayKgVs)} kg VS already fed` : "";
  return `Still welcome today${already}: about ${formatNumber(budgetKgScraps)} kg of scraps, ${formatNumber(budgetBuckets)} buckets of ${formatNumber(bucketLitres)} L (${formatNumber(budgetKgVs)} kg VS).`;
}

const FRACTION_WORDS: readonly (readonly [number, string])[] = [
  [1 / 10, "a tenth"],
  [1 / 8, "an eighth"],
  [1 / 5, "a fifth"],
  [1 / 4, "a quarter"],
  [1 / 3, "a third"],
  [1 / 2, "half"],
  [2 / 3, "two thirds"],
  [3 / 4, "three quarters"],
  [9 / 10, "nine tenths"],
];

/** The common fraction nearest (on a log scale) to a share, in words. */
function fractionWords(share: number): string {
  let best = FRACTION_WORDS[0]!;
  for (const candidate of FRACTION_WORDS) {
    if (Math.abs(Math.log(share / candidate[0])) < Math.abs(Math.log(share / best[0]))) best = candidate;
  }
  return best[1];
}

/** Rounded for reading: whole numbers from 100, one decimal from 1, two below; no trailing zeros. */
function formatNumber(value: number): string {
  const decimals = Math.abs(value) >= 100 ? 0 : Math.abs(value) >= 1 ? 1 : 2;
  return String(Number(value.toFixed(decimals)));
}

function formatTemperature(temperatureC: number): string {
  return `${Number.isInteger(temperatureC) ? temperatureC : temperatureC.toFixed(1)} °C`;
}
