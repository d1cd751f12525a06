/**
 * One function per public calculator endpoint: parsed request (see
 * `shared/schemas/calc.ts`) in, response out, so each server route is a
 * one-liner. Defaults and sources live in the functions called here.
 */
import type {
  FeedBudgetRequest,
  FeedBudgetResponse,
  FertiliserAllowanceRequest,
  FertiliserAllowanceResponse,
  GasHolderRequest,
  GasHolderResponse,
  MethaneYieldRequest,
  MethaneYieldResponse,
  SizingRequest,
  SizingResponse,
  TitrationRequest,
  TitrationResponse,
  WeightsForPressureRequest,
  WeightsForPressureResponse,
} from "../schemas/calc";
import { fertiliserAllowance } from "./digestate";
import { computeFeedBudget } from "./feed-budget";
import {
  addedMassForPressure,
  chenHashimotoMethane,
  cookingMinutes,
  floatingDrumPressure,
  storedLitresFromDrumRise,
} from "./gas";
import { ESTIMATES_STATEMENT, GAS_CAUTIONS, PRESSURE_CAUTIONS } from "./safety";
import { sizeDigesterForScraps, workingVolumeM3FromSlurry } from "./sizing";
import { nordmannTitration } from "./stability";

/** Cautions returned with every gas-holder answer: pressure first, then gas, then the estimates statement (DOMAIN.md §3, §6). */
export const GAS_HOLDER_CAUTIONS: readonly string[] = [...PRESSURE_CAUTIONS, ...GAS_CAUTIONS, ESTIMATES_STATEMENT];

/** POST feed-budget: {@link computeFeedBudget} with the request as its input (DOMAIN.md §2). */
export function calcFeedBudget(input: FeedBudgetRequest): FeedBudgetResponse {
  const result = computeFeedBudget(input);
  return {
    budgetKgVs: result.budgetKgVs,
    budgetKgScraps: result.budgetKgScraps,
    budgetBuckets: result.budgetBuckets,
    binding: result.binding,
    limits: { ...result.limits },
    dilutionWaterLitresPerKg: result.dilutionWaterLitresPerKg,
    explanation: result.explanation,
    warnings: result.warnings.map((warning) => ({ ...warning, actions: [...warning.actions] })),
  };
}

/**
 * POST gas-holder: drum pressure in Pa, mbar and mm WC ({@link floatingDrumPressure});
 * with `drumRiseM` also the stored litres and cooking minutes at the burner
 * flow (default 350 L/h). DOMAIN.md §3.
 */
export function calcGasHolder(input: GasHolderRequest): GasHolderResponse {
  const pressure = floatingDrumPressure(input);
  const response: GasHolderResponse = {
    pressurePa: pressure.pressurePa,
    pressureMbar: pressure.pressureMbar,
    pressureMmWc: pressure.pressureMmWc,
    cautions: [...GAS_HOLDER_CAUTIONS],
  };
  if (input.drumRiseM !== undefined) {
    const storedLitres = storedLitresFromDrumRise(input.drumDiameterM, input.drumRiseM);
    response.storedLitres = storedLitres;
    response.cookingMinutes = cookingMinutes(storedLitres, input.burnerLitresPerHour);
  }
  return response;
}

/**
 * POST weights-for-pressure: mass to add for a target pressure
 * ({@link addedMassForPressure}); when the drum alone exceeds it, 0 and the
 * note as the first caution. DOMAIN.md §3.
 */
export function calcWeightsForPressure(input: WeightsForPressureRequest): WeightsForPressureResponse {
  const result = addedMassForPressure(input);
  return {
    addedMassKg: result.addedMassKg,
    cautions: result.note === null ? [...GAS_HOLDER_CAUTIONS] : [result.note, ...GAS_HOLDER_CAUTIONS],
  };
}

/**
 * POST sizing: from daily slurry and retention, V = S_d × RT
 * ({@link workingVolumeM3FromSlurry}); from daily scraps,
 * {@link sizeDigesterForScraps} (retention by temperature, volume raised where
 * the organic load needs it). DOMAIN.md §3, Sasse 1988 §4.2.
 */
export function calcSizing(input: SizingRequest): SizingResponse {
  if ("dailySlurryLitres" in input) {
    return { workingVolumeM3: workingVolumeM3FromSlurry(input.dailySlurryLitres, input.retentionDays) };
  }
  const sized = sizeDigesterForScraps(input);
  return {
    workingVolumeM3: sized.workingVolumeM3,
    dailySlurryLitres: sized.dailySlurryLitres,
    retentionDays: sized.retentionDays,
    dilutionWaterLitresPerDay: sized.dilutionWaterLitresPerDay,
  };
}

/** POST methane-yield: the Chen–Hashimoto steady state ({@link chenHashimotoMethane}). DOMAIN.md §3. */
export function calcMethaneYield(input: MethaneYieldRequest): MethaneYieldResponse {
  const result = chenHashimotoMethane(input);
  return {
    muMaxPerDay: result.muMaxPerDay,
    k: result.k,
    methaneM3PerM3Day: result.methaneM3PerM3Day,
    washout: result.washout,
  };
}

/** POST titration: Nordmann FOS/TAC ({@link nordmannTitration}). DOMAIN.md §5. */
export function calcTitration(input: TitrationRequest): TitrationResponse {
  const result = nordmannTitration(input);
  return { tacMgPerL: result.tacMgPerL, fosMgPerL: result.fosMgPerL, ratio: result.ratio, advice: result.advice };
}

/** POST fertiliser-allowance: litres a bed may take per year ({@link fertiliserAllowance}). DOMAIN.md §4. */
export function calcFertiliserAllowance(input: FertiliserAllowanceRequest): FertiliserAllowanceResponse {
  const result = fertiliserAllowance(input);
  return {
    litresPerYear: result.litresPerYear,
    dilution: result.dilution,
    cautions: [...result.cautions, ESTIMATES_STATEMENT],
  };
}
