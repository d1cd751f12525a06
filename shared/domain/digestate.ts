/**
 * Digestate: litres out, nitrogen in them, and how much a garden bed may take
 * under a published nitrogen limit. Figures and sources: DOMAIN.md §4.
 */
import { type GramsPerLitre, type Litres, gramsPerLitre, litres } from "../units";
import { type ScrapMix, nitrogenKgFromMix } from "./scraps";
import { DIGESTATE_CAUTIONS } from "./safety";

/** Share of the volume fed (scraps + water) that overflows as digestate [read: 90–95 %, NNFCC biogas-info.co.uk "digestate"]. */
export const DEFAULT_DIGESTATE_OUT_FRACTION = 0.92;
/** Nitrogen limit from manure-type inputs, kg N/ha/yr [read: Council Directive 91/676/EEC, Annex III(2)]; a reference, local rules may differ. */
export const DEFAULT_N_LIMIT_KG_PER_HA_YEAR = 170;
/** Reference nitrogen of whole food-based digestate, g N/L (≈ 5 kg N/t) [2ary: WRAP 2016 DC-Agri, via trade press]. */
export const REFERENCE_DIGESTATE_N_G_PER_L = 5;

/** How to dilute digestate before use [2ary: extension practice, DOMAIN.md §4]. */
export const DILUTION_ADVICE =
  "Dilute at least 1:1 with water before watering (one part digestate to one part water or more); use more water for seedlings and young plants.";

/**
 * Cautions for gardeners: the digestate cautions of DOMAIN.md §4/§6 and a note
 * that the nitrogen limit is a reference.
 */
export const FERTILISER_CAUTIONS: readonly string[] = [
  ...DIGESTATE_CAUTIONS,
  "The yearly amount follows the 170 kg N per hectare reference limit (Directive 91/676/EEC); local rules may differ, and other fertilisers on the same bed count too.",
];

/**
 * Digestate out for a volume fed: L out = L fed × 0.92 by default
 * [read: 90–95 %, NNFCC]. Units: L → L.
 */
export function digestateLitresFromFed(
  volumeFedLitres: number,
  outFraction: number = DEFAULT_DIGESTATE_OUT_FRACTION,
): Litres {
  return litres(Math.max(0, volumeFedLitres) * outFraction);
}

/**
 * Nitrogen concentration of the digestate: g N/L = g N fed / L out (nitrogen
 * stays in the digestate, DOMAIN.md §4); use the last 30 days. 0 when nothing
 * came out.
 */
export function digestateNitrogenGPerL(nitrogenFedG: number, digestateLitres: number): GramsPerLitre {
  return gramsPerLitre(digestateLitres > 0 ? nitrogenFedG / digestateLitres : 0);
}

/** Result of {@link estimateDigestate}. */
export interface DigestateEstimate {
  readonly volumeFedLitres: Litres;
  readonly volumeOutLitres: Litres;
  readonly nitrogenFedG: number;
  readonly nitrogenGPerL: GramsPerLitre;
}

/**
 * Digestate from a period's feeding (use 30 days): volume fed = scraps kg
 * (≈ 1 L/kg) + dilution water L; out = fed × 0.92 [read: NNFCC]; nitrogen fed
 * = given g, else fresh kg × TS × N/TS of the mix (default mix N 3.2 % of TS
 * [memory: Zhang et al. 2007]); g N/L = N fed / L out. Compare with the
 * reference ≈ 5 g/L [2ary: WRAP 2016].
 */
export function estimateDigestate(input: {
  readonly scrapsFreshKg: number;
  readonly dilutionWaterLitres: number;
  readonly mix?: ScrapMix;
  readonly nitrogenFedG?: number;
  readonly outFraction?: number;
}): DigestateEstimate {
  const volumeFedLitres = Math.max(0, input.scrapsFreshKg) + Math.max(0, input.dilutionWaterLitres);
  const volumeOutLitres = digestateLitresFromFed(volumeFedLitres, input.outFraction);
  const nitrogenFedG = input.nitrogenFedG ?? nitrogenKgFromMix(Math.max(0, input.scrapsFreshKg), input.mix) * 1000;
  return {
    volumeFedLitres: litres(volumeFedLitres),
    volumeOutLitres,
    nitrogenFedG,
    nitrogenGPerL: digestateNitrogenGPerL(nitrogenFedG, volumeOutLitres),
  };
}

/** Result of {@link fertiliserAllowance}. */
export interface FertiliserAllowance {
  readonly litresPerYear: Litres;
  readonly litresPerM2Year: number;
  /** The limit as g N per m² per year (kg/ha ÷ 10). */
  readonly nitrogenGPerM2Year: number;
  readonly dilution: string;
  readonly cautions: readonly string[];
}

/**
 * Undiluted digestate a bed may take in a year under a nitrogen limit:
 * g N/m²/yr = kg N/ha/yr ÷ 10 (170 → 17); L/m²/yr = that ÷ g N per L;
 * L/yr = L/m²/yr × area. Check: 10 m² at 5 g N/L → 34 L/yr (DOMAIN.md §4
 * [derived]; limit read: Council Directive 91/676/EEC, Annex III(2)).
 */
export function fertiliserAllowance(input: {
  readonly bedAreaM2: number;
  readonly nitrogenGPerL: number;
  readonly limitKgNPerHaYear?: number;
}): FertiliserAllowance {
  const nitrogenGPerM2Year = (input.limitKgNPerHaYear ?? DEFAULT_N_LIMIT_KG_PER_HA_YEAR) / 10;
  const litresPerM2Year = input.nitrogenGPerL > 0 ? nitrogenGPerM2Year / input.nitrogenGPerL : 0;
  return {
    litresPerYear: litres(litresPerM2Year * Math.max(0, input.bedAreaM2)),
    litresPerM2Year,
    nitrogenGPerM2Year,
    dilution: DILUTION_ADVICE,
    cautions: FERTILISER_CAUTIONS,
  };
}
