/**
 * A drop-off as residents log it (buckets or a weight, one main category and a citrus
 * share) turned into the quantities the feed budget works in.
 */
import { describeMix, estimateFreshKg, type MassMethod, type ScrapCategory, type ScrapMix } from "./scraps";

/** The quick choices a resident picks from when logging a drop-off. */
export const DROP_OFF_MIXES = [
  "mixed",
  "fruitVeg",
  "cooked",
  "breadGrains",
  "coffee",
] as const satisfies readonly ScrapCategory[];
export type DropOffMix = (typeof DROP_OFF_MIXES)[number];

/**
 * The fresh-mass mix of a drop-off: its main category with the stated citrus share split off.
 * `citrusPercent` is the share of the drop-off's fresh mass that is citrus peel (0–100).
 */
export function dropOffMix(category: DropOffMix, citrusPercent = 0): ScrapMix {
  const citrus = Math.min(100, Math.max(0, citrusPercent)) / 100;
  return citrus > 0 ? { [category]: 1 - citrus, citrus } : { [category]: 1 };
}

export interface DropOffQuantities {
  /** Fresh kg: weighed when a weight was given, else bucket litres × bulk density. */
  freshKg: number;
  massSource: MassMethod;
  /** Volatile solids, kg = fresh kg × TS × VS/TS of the mix (DOMAIN.md §1). */
  kgVs: number;
  /** Nitrogen in the drop-off, kg (from the mix's N % of TS where known). */
  nitrogenKg: number;
}

/**
 * Fresh kg, kg VS and N of a drop-off. Buckets: count × litres × kg/L (default 0.5 kg/L
 * [judgement, DOMAIN.md §1]); a weight, when given, wins and is marked "weighed".
 */
export function dropOffQuantities(input: {
  bucketCount?: number | null;
  bucketLitres?: number | null;
  weightKg?: number | null;
  mix?: DropOffMix;
  citrusPercent?: number;
  kgPerLitre?: number;
}): DropOffQuantities {
  const litres = (input.bucketCount ?? 0) * (input.bucketLitres ?? 0);
  const mass = estimateFreshKg({
    bucketLitres: litres,
    kgPerLitre: input.kgPerLitre,
    weighedKg: input.weightKg ?? null,
  });
  const composition = describeMix(dropOffMix(input.mix ?? "mixed", input.citrusPercent ?? 0));
  const freshKg = mass.freshKg as number;
  const nPercentOfTs = composition.nPercentOfTs as number;
  return {
    freshKg,
    massSource: mass.method,
    kgVs: freshKg * composition.kgVsPerFreshKg,
    nitrogenKg: freshKg * (composition.tsPercent / 100) * (nPercentOfTs / 100),
  };
}
