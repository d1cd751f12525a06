/**
 * What a household's fed scraps became: upper estimates of gas, cooking time and fertiliser
 * from the volatile solids and fresh mass that went into a digester (DOMAIN.md §3–4).
 */
import { DEFAULT_DIGESTATE_OUT_FRACTION, digestateLitresFromFed } from "./digestate";
import {
  DEFAULT_B0_M3_PER_KG_VS,
  DEFAULT_BURNER_LITRES_PER_HOUR,
  DEFAULT_METHANE_FRACTION,
  cookingMinutes,
} from "./gas";

/** The factors behind {@link fedScrapsImpact}, each with its source at its definition. */
export interface ImpactFactors {
  /** Ultimate methane yield, m³ CH4 per kg VS (gas.ts: 0.40, a judgement in 0.348–0.435 read in Zhang et al. 2007). */
  b0M3PerKgVs: number;
  /** Methane share of biogas (gas.ts: 0.60, read in FAO/CMS 1996 Table 1, 50–70 %). */
  methaneFraction: number;
  /** Household burner flow, L/h (gas.ts: 350, read in Tilley et al. 2014, Compendium D.7). */
  burnerLitresPerHour: number;
  /** Digestate out per volume fed (digestate.ts: 0.92, read in NNFCC). */
  digestateOutFraction: number;
}

export const DEFAULT_IMPACT_FACTORS: Readonly<ImpactFactors> = {
  b0M3PerKgVs: DEFAULT_B0_M3_PER_KG_VS,
  methaneFraction: DEFAULT_METHANE_FRACTION,
  burnerLitresPerHour: DEFAULT_BURNER_LITRES_PER_HOUR,
  digestateOutFraction: DEFAULT_DIGESTATE_OUT_FRACTION,
};

export interface FedScrapsImpact {
  /** m³ CH4 = kg VS × B0. */
  methaneM3: number;
  /** m³ biogas = methane ÷ methane share. */
  biogasM3: number;
  /** Minutes of cooking = biogas L ÷ burner L/h × 60. */
  cookingMinutes: number;
  /** Litres of digestate = out fraction × (fresh kg ≈ L + dilution water L). */
  digestateLitres: number;
}

/**
 * Upper estimates for scraps that were fed: methane m³ = fedKgVs × B0; biogas m³ = methane ÷
 * methane share; cooking minutes = biogas L ÷ burner L/h × 60; digestate L = out fraction ×
 * (fresh kg, taken as litres, + dilution water L). B0 is the most the scraps can give: an
 * unheated digester in a cold month gives less, so the figures are "up to".
 *
 * @param fed.fedKgVs kg VS fed; fed.fedFreshKg fresh kg fed; fed.waterLitres dilution water recorded, L.
 */
export function fedScrapsImpact(
  fed: { fedKgVs: number; fedFreshKg: number; waterLitres: number },
  factors: ImpactFactors = DEFAULT_IMPACT_FACTORS,
): FedScrapsImpact {
  const methaneM3 = fed.fedKgVs * factors.b0M3PerKgVs;
  const biogasM3 = methaneM3 / factors.methaneFraction;
  return {
    methaneM3,
    biogasM3,
    cookingMinutes: cookingMinutes(biogasM3 * 1000, factors.burnerLitresPerHour) as number,
    digestateLitres: digestateLitresFromFed(fed.fedFreshKg + fed.waterLitres, factors.digestateOutFraction) as number,
  };
}

/** The method as a household reads it beside the figures. */
export function impactMethodSentence(factors: ImpactFactors = DEFAULT_IMPACT_FACTORS): string {
  return (
    `Gas is an upper estimate: the volatile solids of your fed scraps × ${factors.b0M3PerKgVs} m³ of methane per kg (the most food scraps give), ` +
    `as biogas with ${Math.round(factors.methaneFraction * 100)} % methane, cooking at ${factors.burnerLitresPerHour} litres an hour; ` +
    `fertiliser is ${Math.round(factors.digestateOutFraction * 100)} % of the scraps plus the water they were mixed with.`
  );
}
