/**
 * Gas: the Chen–Hashimoto methane model, expected daily biogas, gas-holder
 * fill and cooking time, floating-drum pressure, and energy content.
 * Formulas and sources: DOMAIN.md §3.
 */
import {
  type CubicMetres,
  type Hours,
  type Kg,
  type Litres,
  type MegaJoules,
  type Minutes,
  type Pascal,
  type PerDay,
  type SquareMetres,
  circleAreaM2,
  cubicMetres,
  hours,
  kg,
  litres,
  megaJoules,
  minutes,
  pascal,
  pascalToMillibar,
  pascalToMmWaterColumn,
  perDay,
  STANDARD_GRAVITY_M_PER_S2,
} from "../units";
import { DEFAULT_SCRAPS_TS_PERCENT, DEFAULT_SCRAPS_VS_PERCENT_OF_TS } from "./scraps";
import { DEFAULT_TARGET_TS_PERCENT, dilutionWaterPerKg } from "./sizing";
import { temperatureFactor } from "./temperature";

export { GAS_CAUTIONS, PRESSURE_CAUTIONS, DIGESTATE_CAUTIONS, ESTIMATES_STATEMENT } from "./safety";

/** Ultimate methane yield of mixed food waste, m³ CH4/kg VS [judgement inside 0.348–0.435, read: Zhang et al. 2007]. */
export const DEFAULT_B0_M3_PER_KG_VS = 0.4;
/** Methane share of biogas [read: 50–70 %, FAO/CMS 1996 *Biogas technology: a training manual for extension*, Table 1]. */
export const DEFAULT_METHANE_FRACTION = 0.6;
/** Lower heating value of methane, MJ/Nm³ [memory: ISO 6976]. */
export const METHANE_LHV_MJ_PER_M3 = 35.8;
/** Household biogas burner flow, L/h [read: 200–450 L/h, field tests 300–400, Tilley et al. 2014 Eawag Compendium D.7]. */
export const DEFAULT_BURNER_LITRES_PER_HOUR = 350;
/** Range in which μm(T) = 0.013·T − 0.129 was fitted, °C (Hashimoto, Chen & Varel 1981). */
export const MU_MAX_VALID_FROM_C = 20;
/** Upper end of the μm(T) fit, °C (Hashimoto, Chen & Varel 1981 [memory]). */
export const MU_MAX_VALID_TO_C = 60;

/**
 * Maximum specific growth rate of the methane formers:
 * μm(T) = 0.013·T − 0.129 d⁻¹, fitted for 20–60 °C (Hashimoto, Chen & Varel
 * 1981 [memory]); T is clamped to that range (below 20 °C the gas model
 * scales the 20 °C result instead, see {@link chenHashimotoMethane}).
 * Check: μm(30) = 0.261 d⁻¹.
 */
export function muMaxPerDay(temperatureC: number): PerDay {
  const t = Math.min(MU_MAX_VALID_TO_C, Math.max(MU_MAX_VALID_FROM_C, temperatureC));
  return perDay(0.013 * t - 0.129);
}

/**
 * Chen–Hashimoto kinetic parameter K (dimensionless) from the influent VS:
 * K = 0.6 + 0.0206·e^(0.051·S0), S0 in kg VS/m³. This is the swine-manure
 * form (Hashimoto 1984, Agric. Wastes 9:299 [memory]); no K is published for
 * food waste, so results are estimates. Check: K(40) ≈ 0.758.
 */
export function kineticParameterK(s0KgVsPerM3: number): number {
  return 0.6 + 0.0206 * Math.exp(0.051 * s0KgVsPerM3);
}

/** Result of {@link chenHashimotoMethane}. */
export interface MethaneYield {
  /** μm used, d⁻¹ (at 20 °C when the digester is colder). */
  readonly muMaxPerDay: PerDay;
  readonly k: number;
  /** Volumetric methane production γ, m³ CH4 per m³ of digester per day. */
  readonly methaneM3PerM3Day: number;
  /** True when θ·μm ≤ 1: the microbes are washed out faster than they grow, γ = 0. */
  readonly washout: boolean;
}

/**
 * Steady-state methane production (Chen & Hashimoto 1978, Biotechnol.
 * Bioeng. Symp. 8:269 [memory for the constants]):
 * γ = (B0·S0/θ)·[1 − K/(θ·μm − 1 + K)] m³ CH4/m³/d, γ = 0 (washout) when
 * θ·μm ≤ 1; μm from {@link muMaxPerDay}, K from {@link kineticParameterK}.
 * Below 20 °C the 20 °C result is scaled by f(T)/f(20) ({@link temperatureFactor}),
 * so it is 0 below 10 °C. Check: B0 0.45, S0 40, θ 40 d, 30 °C → μm 0.261,
 * K ≈ 0.758, γ ≈ 0.4165 (DOMAIN.md §3 [derived]).
 */
export function chenHashimotoMethane(input: {
  readonly b0M3PerKgVs: number;
  readonly s0KgVsPerM3: number;
  readonly retentionDays: number;
  readonly temperatureC: number;
}): MethaneYield {
  const mu = muMaxPerDay(input.temperatureC);
  const k = kineticParameterK(input.s0KgVsPerM3);
  const theta = input.retentionDays;
  const washout = !(theta > 0) || theta * mu <= 1;
  if (washout) return { muMaxPerDay: mu, k, methaneM3PerM3Day: 0, washout };
  const gammaAtModelT = ((input.b0M3PerKgVs * input.s0KgVsPerM3) / theta) * (1 - k / (theta * mu - 1 + k));
  const coldScale =
    input.temperatureC < MU_MAX_VALID_FROM_C
      ? temperatureFactor(input.temperatureC) / temperatureFactor(MU_MAX_VALID_FROM_C)
      : 1;
  return { muMaxPerDay: mu, k, methaneM3PerM3Day: Math.max(0, gammaAtModelT * coldScale), washout };
}

/** Result of {@link expectedDailyGas}. */
export interface DailyGasEstimate {
  readonly methaneM3PerDay: CubicMetres;
  readonly biogasM3PerDay: CubicMetres;
  readonly biogasLitresPerDay: Litres;
  /** θ = V / daily slurry, days; null when nothing is fed. */
  readonly retentionDays: number | null;
  /** Influent VS concentration S0 = loading / daily slurry, kg VS/m³; null when nothing is fed. */
  readonly s0KgVsPerM3: number | null;
  readonly washout: boolean;
  /** Lower heating value of the day's biogas. */
  readonly energyMj: MegaJoules;
}

/**
 * Expected daily biogas from the recent loading, by the Chen–Hashimoto steady
 * state ({@link chenHashimotoMethane}) with the digester's own θ and S0:
 * daily slurry Q (m³/d) = the given `dailySlurryLitres` / 1000, or else
 * loading / (TS·VS) × (1 + w) / 1000 (scraps plus dilution water at ≈ 1 kg/L,
 * w from {@link dilutionWaterPerKg}); θ = V / Q; S0 = loading / Q
 * (= loading × θ / V). Methane m³/d = γ × V; biogas = methane / CH4 share
 * (default 0.60, FAO/CMS 1996 [read]); energy = methane × 35.8 MJ/m³
 * [memory: ISO 6976]. Use the mean daily loading of recent weeks: the model
 * is a steady state. Label results "estimate" (K is borrowed from manure).
 */
export function expectedDailyGas(input: {
  readonly workingVolumeM3: number;
  readonly loadingKgVsPerDay: number;
  readonly temperatureC: number;
  readonly dailySlurryLitres?: number;
  readonly scrapsTsPercent?: number;
  readonly scrapsVsPercentOfTs?: number;
  readonly targetTsPercent?: number;
  readonly b0M3PerKgVs?: number;
  readonly methaneFraction?: number;
}): DailyGasEstimate {
  const methaneFraction = input.methaneFraction ?? DEFAULT_METHANE_FRACTION;
  const tsPercent = input.scrapsTsPercent ?? DEFAULT_SCRAPS_TS_PERCENT;
  const vsPercentOfTs = input.scrapsVsPercentOfTs ?? DEFAULT_SCRAPS_VS_PERCENT_OF_TS;
  const slurryM3PerDay =
    input.dailySlurryLitres !== undefined
      ? input.dailySlurryLitres / 1000
      : ((input.loadingKgVsPerDay / ((tsPercent / 100) * (vsPercentOfTs / 100))) *
          (1 + dilutionWaterPerKg(tsPercent, input.targetTsPercent ?? DEFAULT_TARGET_TS_PERCENT))) /
        1000;
  if (!(input.loadingKgVsPerDay > 0) || !(slurryM3PerDay > 0) || !(input.workingVolumeM3 > 0)) {
    return {
      methaneM3PerDay: cubicMetres(0),
      biogasM3PerDay: cubicMetres(0),
      biogasLitresPerDay: litres(0),
      retentionDays: null,
      s0KgVsPerM3: null,
      washout: false,
      energyMj: megaJoules(0),
    };
  }
  const retentionDays = input.workingVolumeM3 / slurryM3PerDay;
  const s0KgVsPerM3 = input.loadingKgVsPerDay / slurryM3PerDay;
  const model = chenHashimotoMethane({
    b0M3PerKgVs: input.b0M3PerKgVs ?? DEFAULT_B0_M3_PER_KG_VS,
    s0KgVsPerM3,
    retentionDays,
    temperatureC: input.temperatureC,
  });
  const methaneM3PerDay = model.methaneM3PerM3Day * input.workingVolumeM3;
  const biogasM3PerDay = methaneM3PerDay / methaneFraction;
  return {
    methaneM3PerDay: cubicMetres(methaneM3PerDay),
    biogasM3PerDay: cubicMetres(biogasM3PerDay),
    biogasLitresPerDay: litres(biogasM3PerDay * 1000),
    retentionDays,
    s0KgVsPerM3,
    washout: model.washout,
    energyMj: biogasEnergyMj(biogasM3PerDay, methaneFraction),
  };
}

/**
 * Energy in biogas (lower heating value): MJ = m³ biogas × CH4 share × 35.8 MJ/m³
 * [memory: ISO 6976]; 60 % biogas ≈ 21.5 MJ/m³ (DOMAIN.md §3).
 */
export function biogasEnergyMj(biogasM3: number, methaneFraction: number = DEFAULT_METHANE_FRACTION): MegaJoules {
  return megaJoules(biogasM3 * methaneFraction * METHANE_LHV_MJ_PER_M3);
}

/**
 * Hours until the gas holder is full: (holder L − stored L) / (biogas L/d) × 24.
 * Null when no gas is produced (it never fills). Source: DOMAIN.md §3 [derived].
 */
export function gasHolderFillHours(input: {
  readonly holderLitres: number;
  readonly biogasLitresPerDay: number;
  readonly storedLitres?: number;
}): Hours | null {
  if (!(input.biogasLitresPerDay > 0)) return null;
  const emptyLitres = Math.max(0, input.holderLitres - (input.storedLitres ?? 0));
  return hours((emptyLitres / input.biogasLitresPerDay) * 24);
}

/**
 * Minutes of cooking from stored gas: stored L / burner L/h × 60; burner
 * default 350 L/h [read: 200–450 L/h, Tilley et al. 2014, Eawag Compendium D.7].
 */
export function cookingMinutes(
  storedLitres: number,
  burnerLitresPerHour: number = DEFAULT_BURNER_LITRES_PER_HOUR,
): Minutes {
  return minutes((storedLitres / burnerLitresPerHour) * 60);
}

/**
 * Gas stored under a floating drum that has risen: L = π·D²/4 × rise × 1000.
 * Units: m, m → L. Source: DOMAIN.md §3 (stored gas = A × drum rise).
 */
export function storedLitresFromDrumRise(drumDiameterM: number, drumRiseM: number): Litres {
  return litres(circleAreaM2(drumDiameterM) * Math.max(0, drumRiseM) * 1000);
}

/** Result of {@link floatingDrumPressure}. */
export interface DrumPressure {
  readonly pressurePa: Pascal;
  readonly pressureMbar: number;
  readonly pressureMmWc: number;
  readonly areaM2: SquareMetres;
}

/**
 * Gas pressure under a floating drum: p = (m_drum + m_weights)·g / A,
 * A = π·D²/4, g = 9.80665 m/s²; in mm water column this is exactly
 * kg / m². Check: 70 kg on Ø 1.00 m → 874 Pa = 8.74 mbar = 89.1 mm WC
 * (DOMAIN.md §3 [derived]). Ignores the drum's buoyancy in the slurry seal,
 * which lowers the real pressure a little.
 */
export function floatingDrumPressure(input: {
  readonly drumDiameterM: number;
  readonly drumMassKg: number;
  readonly addedMassKg?: number;
}): DrumPressure {
  const areaM2 = circleAreaM2(input.drumDiameterM);
  const pressurePa = pascal(((input.drumMassKg + (input.addedMassKg ?? 0)) * STANDARD_GRAVITY_M_PER_S2) / areaM2);
  return {
    pressurePa,
    pressureMbar: pascalToMillibar(pressurePa),
    pressureMmWc: pascalToMmWaterColumn(pressurePa),
    areaM2,
  };
}

/** Result of {@link addedMassForPressure}. */
export interface AddedMass {
  /** Mass to add on the drum, kg; 0 when the drum alone reaches the target. */
  readonly addedMassKg: Kg;
  readonly drumAlonePressurePa: Pascal;
  readonly drumAloneExceeds: boolean;
  /** Plain note when the drum alone already gives more than the target; null otherwise. */
  readonly note: string | null;
}

/**
 * Weights needed for a target pressure: total mass = p·A/g, added =
 * total − drum mass, never negative; when the drum alone gives more than the
 * target, 0 and a note (weights cannot lower pressure). Source: DOMAIN.md §3
 * (inverse of {@link floatingDrumPressure}).
 */
export function addedMassForPressure(input: {
  readonly drumDiameterM: number;
  readonly drumMassKg: number;
  readonly targetPressurePa: number;
}): AddedMass {
  const totalKg = (input.targetPressurePa * circleAreaM2(input.drumDiameterM)) / STANDARD_GRAVITY_M_PER_S2;
  const drumAlone = floatingDrumPressure({ drumDiameterM: input.drumDiameterM, drumMassKg: input.drumMassKg });
  const drumAloneExceeds = input.drumMassKg > totalKg;
  return {
    addedMassKg: kg(Math.max(0, totalKg - input.drumMassKg)),
    drumAlonePressurePa: drumAlone.pressurePa,
    drumAloneExceeds,
    note: drumAloneExceeds
      ? `The drum alone already gives ${Math.round(drumAlone.pressurePa)} Pa, more than the ${Math.round(input.targetPressurePa)} Pa asked for: no weights are needed, and weights cannot lower the pressure.`
      : null,
  };
}
