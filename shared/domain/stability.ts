/**
 * Digester stability: the Nordmann (FOS/TAC) titration, the action bands the
 * feed budget's stability gate uses, and the sodium bicarbonate buffer dose.
 * Figures and sources: DOMAIN.md §2 (limit 3) and §5.
 */
import { type Fraction, type Kg, type MgPerLitre, fraction, kg, mgPerLitre } from "../units";

/** Action band from pH and VFA/TA, most severe first: stop feeding, feed half, hold at last week's mean, feed as planned. */
export type StabilityBand = "stop" | "halve" | "hold" | "ok";

const BAND_SEVERITY: Readonly<Record<StabilityBand, number>> = { ok: 0, hold: 1, halve: 2, stop: 3 };

/** pH below this stops feeding (DOMAIN.md §2 limit 3 [judgement after Lossie & Pütz; Gerardi 2003 read: failure below 6.0]). */
export const PH_STOP_BELOW = 6.5;
/** pH below this (and ≥ 6.5) halves feeding (DOMAIN.md §2 limit 3; optimum 6.8–7.2, Gerardi 2003 [read]). */
export const PH_HALVE_BELOW = 6.8;
/** VFA/TA above this stops feeding (DOMAIN.md §2 limit 3 [judgement]). */
export const RATIO_STOP_ABOVE = 0.6;
/** VFA/TA above this (≤ 0.6) halves feeding (DOMAIN.md §2 limit 3 [judgement]). */
export const RATIO_HALVE_ABOVE = 0.5;
/** VFA/TA above this (≤ 0.5) holds feeding at the 7-day mean; optimum 0.3–0.4 (ManTech Method Abstract #127 [read]). */
export const RATIO_HOLD_ABOVE = 0.4;
/** Stability factor when no pH was read in 7 days (DOMAIN.md §2 limit 3 [judgement]). */
export const NO_PH_FACTOR = 0.8;

/**
 * Band for a pH reading: < 6.5 stop, 6.5 to < 6.8 halve, else ok.
 * Source: DOMAIN.md §2 limit 3 [judgement; Gerardi 2003 read].
 */
export function phBand(ph: number): StabilityBand {
  if (ph < PH_STOP_BELOW) return "stop";
  if (ph < PH_HALVE_BELOW) return "halve";
  return "ok";
}

/**
 * Band for a VFA/TA (FOS/TAC) ratio: > 0.6 stop, > 0.5 halve, > 0.4 hold,
 * else ok. Source: DOMAIN.md §2 limit 3 [read: optimum 0.3–0.4, ManTech #127;
 * bands judgement after Lossie & Pütz, memory].
 */
export function ratioBand(vfaTaRatio: number): StabilityBand {
  if (vfaTaRatio > RATIO_STOP_ABOVE) return "stop";
  if (vfaTaRatio > RATIO_HALVE_ABOVE) return "halve";
  if (vfaTaRatio > RATIO_HOLD_ABOVE) return "hold";
  return "ok";
}

/** Result of {@link assessStability}. */
export interface StabilityAssessment {
  /** The most severe band of the readings given. */
  readonly band: StabilityBand;
  /**
   * Factor s on the organic limit: 0 (stop), 0.5 (halve), 0.8 (no pH in
   * 7 days), else 1. The hold band keeps s (its cap is the 7-day mean, see
   * `holdAtWeekMean`).
   */
  readonly factor: Fraction;
  /** True when the VFA/TA is in the hold band: feed no more than the last 7 days' mean. */
  readonly holdAtWeekMean: boolean;
  /** True when no pH reading was given (none in the last 7 days). */
  readonly phMissing: boolean;
}

/**
 * Stability gate from the latest pH and VFA/TA within 7 days (pass undefined
 * or null when there is none): s = min(s_pH, s_ratio), where s is 0 in the
 * stop band, 0.5 in the halve band, 1 otherwise, and s_pH = 0.8 when no pH
 * was read. Source: DOMAIN.md §2 limit 3.
 */
export function assessStability(readings: {
  readonly ph?: number | null;
  readonly vfaTaRatio?: number | null;
}): StabilityAssessment {
  const phMissing = readings.ph === undefined || readings.ph === null;
  const bandFromPh: StabilityBand = phMissing ? "ok" : phBand(readings.ph as number);
  const bandFromRatio: StabilityBand =
    readings.vfaTaRatio === undefined || readings.vfaTaRatio === null ? "ok" : ratioBand(readings.vfaTaRatio);
  const band = BAND_SEVERITY[bandFromPh] >= BAND_SEVERITY[bandFromRatio] ? bandFromPh : bandFromRatio;
  const factorOf = (b: StabilityBand): number => (b === "stop" ? 0 : b === "halve" ? 0.5 : 1);
  const phFactor = phMissing ? NO_PH_FACTOR : factorOf(bandFromPh);
  return {
    band,
    factor: fraction(Math.min(phFactor, factorOf(bandFromRatio))),
    holdAtWeekMean: bandFromRatio === "hold",
    phMissing,
  };
}

/** What to do when feeding must stop for acid (DOMAIN.md §2 limit 3). */
export const ACID_STOP_ACTIONS: readonly string[] = [
  "Stop feeding.",
  "Stir the digester.",
  "Buffer with sodium bicarbonate (baking soda).",
  "Test pH and acids again in 2–3 days.",
];

/** What to do in the halve band (DOMAIN.md §2 limit 3). */
export const ACID_HALVE_ACTIONS: readonly string[] = [
  "Feed half the usual amount.",
  "No bread, rice, pasta or sugary food until the readings recover.",
  "Test again within a few days.",
];

/** What to do in the hold band (DOMAIN.md §2 limit 3). */
export const ACID_HOLD_ACTIONS: readonly string[] = [
  "Keep feeding at last week's daily average; do not increase.",
  "Test again within a week.",
];

/**
 * Plain advice for a VFA/TA ratio, in the bands of the stability gate
 * ({@link ratioBand}); below 0.3 the digester has room (optimum 0.3–0.4,
 * ManTech Method Abstract #127 [read]).
 */
export function ratioAdvice(vfaTaRatio: number): string {
  const shown = vfaTaRatio.toFixed(2);
  switch (ratioBand(vfaTaRatio)) {
    case "stop":
      return `Acids are piling up (ratio ${shown}, above 0.6): stop feeding, stir, add sodium bicarbonate and test again in 2–3 days.`;
    case "halve":
      return `Acids are rising (ratio ${shown}, 0.5–0.6): feed half the usual amount, no bread or sugary food, and test again within a few days.`;
    case "hold":
      return `Acids are creeping up (ratio ${shown}, 0.4–0.5): keep feeding at last week's average and do not increase.`;
    case "ok":
      return vfaTaRatio < 0.3
        ? `Few acids (ratio ${shown}, below 0.3): the digester has room; feed may rise gently within today's budget.`
        : `Healthy (ratio ${shown}, in the usual 0.3–0.4): keep feeding as planned.`;
  }
}

/** Nordmann's reference conditions: a 20 mL sample titrated with 0.1 N sulphuric acid (ManTech Method Abstract #127 [read]). */
export const NORDMANN_SAMPLE_ML = 20;
/** Normality of the reference acid, N (ManTech Method Abstract #127 [read]). */
export const NORDMANN_ACID_NORMALITY = 0.1;

/** Result of {@link nordmannTitration}. */
export interface TitrationResult {
  /** Total alkalinity (TAC), mg/L as CaCO3. */
  readonly tacMgPerL: MgPerLitre;
  /** Volatile fatty acids (FOS), mg/L as acetic acid; never below 0. */
  readonly fosMgPerL: MgPerLitre;
  /** FOS/TAC. */
  readonly ratio: number;
  readonly band: StabilityBand;
  readonly advice: string;
}

/**
 * Nordmann FOS/TAC titration: TAC = A × 250 mg/L CaCO3 (A = mL acid to
 * pH 5.0); FOS = (B × 1.66 − 0.15) × 500 mg/L acetic acid (B = mL from pH 5.0
 * to 4.4); ratio = FOS/TAC. Source: ManTech Method Abstract #127 [read].
 *
 * Those constants hold for a 20 mL sample and 0.1 N acid. For other samples
 * and acids, A and B are first scaled to the mL of 0.1 N acid a 20 mL sample
 * would have needed — acid equivalents scale with normality, the acid a
 * sample needs scales with its volume — A₂₀ = A × (N / 0.1) × (20 / sample mL),
 * and the same for B; then the formulas above apply unchanged (including the
 * empirical −0.15 mL offset, which belongs to the reference conditions).
 */
export function nordmannTitration(input: {
  readonly aMl: number;
  readonly bMl: number;
  readonly sampleMl?: number;
  readonly acidNormality?: number;
}): TitrationResult {
  const scale =
    ((input.acidNormality ?? NORDMANN_ACID_NORMALITY) / NORDMANN_ACID_NORMALITY) *
    (NORDMANN_SAMPLE_ML / (input.sampleMl ?? NORDMANN_SAMPLE_ML));
  const aReferenceMl = input.aMl * scale;
  const bReferenceMl = input.bMl * scale;
  if (!(aReferenceMl > 0)) throw new RangeError("aMl must be above 0: without alkalinity there is no ratio.");
  const tac = aReferenceMl * 250;
  // Below B ≈ 0.09 mL the empirical offset would give negative acids; there are none to report.
  const fos = Math.max(0, (bReferenceMl * 1.66 - 0.15) * 500);
  const ratio = fos / tac;
  return {
    tacMgPerL: mgPerLitre(tac),
    fosMgPerL: mgPerLitre(fos),
    ratio,
    band: ratioBand(ratio),
    advice: ratioAdvice(ratio),
  };
}

/**
 * Sodium bicarbonate per gram of alkalinity (as CaCO3) raised: 1.68 g/g
 * (2 × 84.0 / 100.1, stoichiometry; DOMAIN.md §5 [derived]).
 */
export const BICARBONATE_G_PER_G_ALKALINITY = 1.68;

/**
 * Sodium bicarbonate to raise alkalinity by a target:
 * kg = rise (mg/L as CaCO3) × volume (m³) × 1.68 / 1000
 * (mg/L × m³ = g of CaCO3-alkalinity). Check: +500 mg/L in 1 m³ → 0.84 kg.
 * Source: DOMAIN.md §5 [derived, stoichiometry]. Add it dissolved, in portions.
 */
export function bicarbonateDoseKg(input: {
  readonly workingVolumeM3: number;
  readonly alkalinityRiseMgPerL: number;
}): Kg {
  return kg((Math.max(0, input.alkalinityRiseMgPerL) * input.workingVolumeM3 * BICARBONATE_G_PER_G_ALKALINITY) / 1000);
}
