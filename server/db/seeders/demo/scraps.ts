/**
 * What goes in a bucket: each scrap mix's solids, the dilution water it needs, bucket sizes,
 * and how a day's buckets are planned to stay within the day's allowance.
 */
import type { SeededRandom } from "../../../../shared/random";
import type { SimProfile } from "./conditions";
import type { DemoScrapMix } from "./types";

/**
 * kg VS per fresh kg of each mix: TS × VS/TS with DOMAIN.md §1's defaults
 * (mixed 26 % × 87 %, fruit & veg 14 × 89, cooked 27 × 90, bread 55 × 96, coffee 40 × 98).
 */
export const KG_VS_PER_FRESH_KG: Record<DemoScrapMix, number> = {
  mixed: 0.26 * 0.87,
  fruitVeg: 0.14 * 0.89,
  cooked: 0.27 * 0.9,
  breadGrains: 0.55 * 0.96,
  coffee: 0.4 * 0.98,
};
const TS_FRACTION: Record<DemoScrapMix, number> = {
  mixed: 0.26,
  fruitVeg: 0.14,
  cooked: 0.27,
  breadGrains: 0.55,
  coffee: 0.4,
};
/** Slurry target, 8 % TS (DOMAIN.md §2.7). */
const TARGET_TS_FRACTION = 0.08;
/** Bucket bulk density, kg/L (DOMAIN.md §1 default [judgement]). */
const BUCKET_KG_PER_LITRE = 0.5;

export interface DropOffPlan {
  mix: DemoScrapMix;
  bucketCount: number;
  bucketLitres: number;
  weightKg: number | null;
  freshKg: number;
}

const freshKgOf = (plan: Pick<DropOffPlan, "bucketCount" | "bucketLitres" | "weightKg">): number =>
  plan.weightKg ?? plan.bucketCount * plan.bucketLitres * BUCKET_KG_PER_LITRE;

export const waterLitresFor = (mix: DemoScrapMix, freshKg: number): number =>
  freshKg * (TS_FRACTION[mix] / TARGET_TS_FRACTION - 1);

function pickMix(rng: SeededRandom, size: SimProfile["size"]): DemoScrapMix {
  return rng.weighted<DemoScrapMix>([
    ["mixed", 55],
    ["fruitVeg", 25],
    ["cooked", size === "large" ? 8 : 5],
    ["coffee", 7],
    ["breadGrains", size === "large" ? 5 : 0],
  ]);
}

/** Buckets that add up to no more than the day's allowance (kg VS) and slurry (litres). */
export function planDropOffs(
  rng: SeededRandom,
  size: SimProfile["size"],
  allowanceKgVs: number,
  slurryLitres: number,
  forceMix?: readonly DemoScrapMix[],
): DropOffPlan[] {
  const plans: DropOffPlan[] = [];
  let kgVsLeft = allowanceKgVs;
  let slurryLeft = slurryLitres;
  // A weighed caddy of peelings can be small; nobody carries less than this.
  const minimumKg = size === "small" ? 0.25 : 0.5;
  // Stewards top up close to the allowance with a weighed caddy rather than stop short.
  const weighedKg = (maxFreshKg: number, low: number, high: number): number =>
    Math.floor((maxFreshKg < high ? maxFreshKg * rng.range(0.96, 1) : rng.range(low, high)) * 10) / 10;
  let misses = 0;
  for (let guard = 0; guard < 60 && misses < 6; guard++) {
    const mix = forceMix ? rng.pick(forceMix) : pickMix(rng, size);
    // About a litre per kg of scraps, plus its dilution water.
    const perKgSlurry = 1 + waterLitresFor(mix, 1);
    const maxFreshKg = Math.min(kgVsLeft / KG_VS_PER_FRESH_KG[mix], slurryLeft / perKgSlurry);
    if (maxFreshKg < minimumKg) {
      misses += 1;
      continue;
    }
    const buckets: (readonly [Omit<DropOffPlan, "mix" | "freshKg">, number])[] =
      size === "large"
        ? [
            [{ bucketCount: 1, bucketLitres: 10, weightKg: null }, 5],
            [{ bucketCount: 1, bucketLitres: 15, weightKg: null }, 3],
            [{ bucketCount: 2, bucketLitres: 10, weightKg: null }, 1],
            [{ bucketCount: 1, bucketLitres: 5, weightKg: null }, 1],
            [{ bucketCount: 1, bucketLitres: 15, weightKg: weighedKg(maxFreshKg, 3, 8.5) }, 1.5],
          ]
        : [
            [{ bucketCount: 1, bucketLitres: 5, weightKg: null }, 3],
            [{ bucketCount: 1, bucketLitres: 10, weightKg: null }, 1],
            [{ bucketCount: 1, bucketLitres: 5, weightKg: weighedKg(maxFreshKg, 0.6, 2.4) }, 3],
          ];
    const fitting = buckets.filter(
      ([bucket]) =>
        (bucket.weightKg === null || bucket.weightKg >= minimumKg) && freshKgOf(bucket) <= maxFreshKg + 1e-9,
    );
    if (fitting.length === 0) {
      misses += 1;
      continue;
    }
    const bucket = rng.weighted(fitting);
    const freshKg = freshKgOf(bucket);
    plans.push({ ...bucket, mix, freshKg });
    kgVsLeft -= freshKg * KG_VS_PER_FRESH_KG[mix];
    slurryLeft -= freshKg * perKgSlurry;
  }
  return plans;
}
