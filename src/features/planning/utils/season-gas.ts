/**
 * Expected daily gas against digester temperature, for the planning chart. Computed in the
 * browser from the shared domain: one chart needs dozens of evaluations, which need no server.
 */
import { z } from "zod";
import { computeFeedBudget, cookingMinutes, expectedDailyGas, freshKgFromKgVs, kgVsFromFreshKg } from "@shared/domain";
import {
  FeedBudgetRequestSchema,
  GasHolderRequestSchema,
  MethaneYieldRequestSchema,
  SizingFromScrapsRequestSchema,
} from "@shared/schemas/calc";

export interface SeasonGasInput {
  workingVolumeM3: number;
  /** Scraps the group would like to feed each day, kg (default mixed household scraps). */
  dailyScrapsKg: number;
  burnerLitresPerHour: number;
}

export interface SeasonGasPoint {
  temperatureC: number;
  /** Scraps actually fed: the planned amount, or less where the feed budget's organic or liquid limit is lower. */
  fedKgScraps: number;
  /** True when the feed budget takes less than planned at this temperature. */
  limitedByBudget: boolean;
  biogasLitresPerDay: number;
  cookingMinutesPerDay: number;
}

/**
 * One point: the day's feed is the planned kg VS capped by the feed budget's organic-load and
 * hydraulic limits at that temperature (DOMAIN.md §2 limits 1, 2 and 7; the acid check and ramps
 * depend on readings a plan does not have), then biogas by the Chen–Hashimoto steady state at the
 * digester's own retention time and S0 ({@link expectedDailyGas}, DOMAIN.md §3), then minutes of
 * cooking at the burner flow ({@link cookingMinutes}). Feeding the planned amount regardless of the
 * cold would overstate winter gas and sour the digester, which is why the cap is applied.
 */
export function seasonGasPoint(input: SeasonGasInput, temperatureC: number): SeasonGasPoint {
  const plannedKgVs = kgVsFromFreshKg(input.dailyScrapsKg);
  const { limits } = computeFeedBudget({ workingVolumeM3: input.workingVolumeM3, temperatureC });
  const allowedKgVs = Math.min(plannedKgVs, limits.organicLoad ?? 0, limits.hydraulic ?? 0);
  const gas = expectedDailyGas({
    workingVolumeM3: input.workingVolumeM3,
    loadingKgVsPerDay: allowedKgVs,
    temperatureC,
  });
  return {
    temperatureC,
    fedKgScraps: freshKgFromKgVs(allowedKgVs),
    limitedByBudget: allowedKgVs < plannedKgVs - 1e-9,
    biogasLitresPerDay: gas.biogasLitresPerDay,
    cookingMinutesPerDay: cookingMinutes(gas.biogasLitresPerDay, input.burnerLitresPerHour),
  };
}

/** Points from `fromC` to `toC` every `stepC` degrees (inclusive). */
export function seasonGasCurve(input: SeasonGasInput, fromC = 5, toC = 40, stepC = 1): SeasonGasPoint[] {
  const points: SeasonGasPoint[] = [];
  for (let t = fromC; t <= toC + 1e-9; t += stepC) points.push(seasonGasPoint(input, Math.round(t * 10) / 10));
  return points;
}

const seasonTemperature = MethaneYieldRequestSchema.shape.temperatureC;

/**
 * The planner's inputs, with the ranges (and messages) of the API fields they mirror: volume as
 * the feed budget, scraps as sizing, burner as the gas holder, temperatures as the gas model.
 */
export const SeasonGasFormSchema = z
  .object({
    workingVolumeM3: FeedBudgetRequestSchema.shape.workingVolumeM3,
    dailyScrapsKg: SizingFromScrapsRequestSchema.shape.dailyScrapsKg,
    burnerLitresPerHour: GasHolderRequestSchema.shape.burnerLitresPerHour.unwrap(),
    coldTemperatureC: seasonTemperature,
    warmTemperatureC: seasonTemperature,
  })
  .strict();
export type SeasonGasForm = z.infer<typeof SeasonGasFormSchema>;

export interface SeasonGasPlan {
  curve: SeasonGasPoint[];
  cold: SeasonGasPoint;
  warm: SeasonGasPoint;
  /** Rows for the table beside the chart: every 5 °C of the curve plus the two seasons. */
  tableRows: SeasonGasPoint[];
}

/** The whole planner answer: a curve from 5 to 40 °C (widened to take in both seasons), the two seasons and the table rows. */
export function planSeasonGas(form: SeasonGasForm): SeasonGasPlan {
  const input = {
    workingVolumeM3: form.workingVolumeM3,
    dailyScrapsKg: form.dailyScrapsKg,
    burnerLitresPerHour: form.burnerLitresPerHour,
  };
  const fromC = Math.floor(Math.min(5, form.coldTemperatureC, form.warmTemperatureC) / 5) * 5;
  const toC = Math.ceil(Math.max(40, form.coldTemperatureC, form.warmTemperatureC) / 5) * 5;
  const curve = seasonGasCurve(input, fromC, toC, 1);
  const cold = seasonGasPoint(input, form.coldTemperatureC);
  const warm = seasonGasPoint(input, form.warmTemperatureC);
  const byTemperature = new Map<number, SeasonGasPoint>();
  for (const point of [...curve.filter((p) => p.temperatureC % 5 === 0), cold, warm]) {
    byTemperature.set(point.temperatureC, point);
  }
  const tableRows = [...byTemperature.values()].sort((a, b) => a.temperatureC - b.temperatureC);
  return { curve, cold, warm, tableRows };
}
