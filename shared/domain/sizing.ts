/**
 * Digester sizing and the hydraulic side of feeding: working volume, daily
 * slurry, retention time and dilution water. Sources: DOMAIN.md §2 limit 7
 * and §3 (Sasse 1988 §4.2).
 */
import { type CubicMetres, type Days, type Litres, cubicMetres, days, litres } from "../units";
import { DEFAULT_SCRAPS_TS_PERCENT, DEFAULT_SCRAPS_VS_PERCENT_OF_TS, kgVsFromFreshKg } from "./scraps";
import { TOO_COLD_BELOW_C, temperatureFactor } from "./temperature";

/** Minimum retention at ≥ 20 °C for simple plants, days [read: *Biogas Digest Vol. II* p. 40]. */
export const MIN_RETENTION_WARM_DAYS = 40;
/** Minimum retention below 20 °C (psychrophilic), days [read: Sasse 1988 *Biogas Plants*, GTZ, §2]. */
export const MIN_RETENTION_COLD_DAYS = 100;
/** Temperature from which the warm retention applies, °C (DOMAIN.md §2 limit 7). */
export const WARM_RETENTION_FROM_C = 20;
/** Target total solids of the slurry, % [read: 4–8 %, *Biogas Digest Vol. II* p. 40; 5–10 %, Sasse 1988 §2.1]. */
export const DEFAULT_TARGET_TS_PERCENT = 8;
/** Reference organic loading rate for simple, unstirred plants, kg VS/m³/d [read: Werner, Stöhr & Hees 1989, GTZ/GATE, §5.1 p. 42]. */
export const DEFAULT_OLR_REF_KG_VS_PER_M3_DAY = 1.5;

/**
 * Minimum hydraulic retention time: 40 d at ≥ 20 °C, 100 d below; 100 d when
 * the temperature is unknown (never assume warm). Source: DOMAIN.md §2 limit 7
 * [read: *Biogas Digest Vol. II* p. 40; Sasse 1988 §2].
 */
export function minimumRetentionDays(temperatureC: number | null): Days {
  return days(
    temperatureC !== null && temperatureC >= WARM_RETENTION_FROM_C ? MIN_RETENTION_WARM_DAYS : MIN_RETENTION_COLD_DAYS,
  );
}

/**
 * Dilution water per kg of scraps to reach a target TS:
 * w = TS_scraps / TS_target − 1 (kg water per kg scraps ≈ L/kg); 0 when the
 * scraps are already at or below the target. Check: 25 % → 8 % gives 2.125.
 * Source: DOMAIN.md §2 limit 7 [derived from a mass balance on solids].
 */
export function dilutionWaterPerKg(
  scrapsTsPercent: number = DEFAULT_SCRAPS_TS_PERCENT,
  targetTsPercent: number = DEFAULT_TARGET_TS_PERCENT,
): number {
  return Math.max(0, scrapsTsPercent / targetTsPercent - 1);
}

/**
 * Working volume from daily slurry and retention time: V_D = S_d × RT.
 * Units: L/d × d → m³ (÷ 1000). Check: 60 L/d × 80 d = 4.8 m³.
 * Source: Sasse 1988 *Biogas Plants* §4.2 [read].
 */
export function workingVolumeM3FromSlurry(dailySlurryLitres: number, retentionDays: number): CubicMetres {
  return cubicMetres((dailySlurryLitres * retentionDays) / 1000);
}

/**
 * Daily slurry a working volume takes at a retention time: S_d = V_D / RT.
 * Units: m³, d → L/d. Check: 2.0 m³ at 40 d → 50 L/d. Source: Sasse 1988 §4.2 [read].
 */
export function dailySlurryLitresFromVolume(workingVolumeM3: number, retentionDays: number): Litres {
  return litres((workingVolumeM3 * 1000) / retentionDays);
}

/**
 * Retention time of a working volume at a daily slurry: RT = V_D / S_d.
 * Units: m³, L/d → d. Source: Sasse 1988 §4.2 [read].
 */
export function retentionDaysFromVolume(workingVolumeM3: number, dailySlurryLitres: number): Days {
  return days((workingVolumeM3 * 1000) / dailySlurryLitres);
}

/** Which criterion set the volume in {@link sizeDigesterForScraps}. */
export type SizingCriterion = "hydraulic" | "organicLoad";

/** Result of {@link sizeDigesterForScraps}. */
export interface ScrapSizing {
  readonly workingVolumeM3: CubicMetres;
  /** Scraps plus dilution water, ≈ 1 kg/L. */
  readonly dailySlurryLitres: Litres;
  /** Retention at the chosen volume; ≥ the minimum for the temperature. */
  readonly retentionDays: Days;
  readonly minimumRetentionDays: Days;
  readonly dilutionWaterLitresPerDay: Litres;
  /** Organic loading at the chosen volume, kg VS/m³/d; ≤ OLRref × f(T). */
  readonly organicLoadKgVsPerM3Day: number;
  readonly governedBy: SizingCriterion;
}

/**
 * Working volume for a daily amount of scraps at a digester temperature.
 * Slurry S_d = scraps kg × (1 + w) (≈ 1 kg/L), w from {@link dilutionWaterPerKg};
 * hydraulic volume = S_d × HRTmin(T) (Sasse 1988 §4.2 [read]; HRTmin per
 * {@link minimumRetentionDays}). The volume is then raised, where needed, so
 * the organic load stays within the feed budget's limit 1:
 * V ≥ kg VS/d ÷ (OLRref × f(T)) (DOMAIN.md §2 limits 1–2) — otherwise the
 * digester would be refused part of its own scraps every day. Retention is
 * reported at the chosen volume. Throws RangeError below 10 °C, where f(T) = 0
 * and no volume suffices.
 */
export function sizeDigesterForScraps(input: {
  readonly dailyScrapsKg: number;
  readonly temperatureC: number;
  readonly scrapsTsPercent?: number;
  readonly scrapsVsPercentOfTs?: number;
  readonly targetTsPercent?: number;
  readonly olrRefKgVsPerM3Day?: number;
}): ScrapSizing {
  const factor = temperatureFactor(input.temperatureC);
  if (factor <= 0) {
    throw new RangeError(
      `Digestion stops below ${TOO_COLD_BELOW_C} °C: size for the temperature the digester is kept at.`,
    );
  }
  const tsPercent = input.scrapsTsPercent ?? DEFAULT_SCRAPS_TS_PERCENT;
  const waterPerKg = dilutionWaterPerKg(tsPercent, input.targetTsPercent ?? DEFAULT_TARGET_TS_PERCENT);
  const dailySlurryLitres = input.dailyScrapsKg * (1 + waterPerKg);
  const minRetention = minimumRetentionDays(input.temperatureC);
  const hydraulicM3 = workingVolumeM3FromSlurry(dailySlurryLitres, minRetention);
  const feedKgVsPerDay = kgVsFromFreshKg(
    input.dailyScrapsKg,
    tsPercent,
    input.scrapsVsPercentOfTs ?? DEFAULT_SCRAPS_VS_PERCENT_OF_TS,
  );
  const olrMax = (input.olrRefKgVsPerM3Day ?? DEFAULT_OLR_REF_KG_VS_PER_M3_DAY) * factor;
  const organicM3 = feedKgVsPerDay / olrMax;
  const governedBy: SizingCriterion = organicM3 > hydraulicM3 ? "organicLoad" : "hydraulic";
  const volumeM3 = Math.max(hydraulicM3, organicM3);
  return {
    workingVolumeM3: cubicMetres(volumeM3),
    dailySlurryLitres: litres(dailySlurryLitres),
    retentionDays: governedBy === "hydraulic" ? minRetention : retentionDaysFromVolume(volumeM3, dailySlurryLitres),
    minimumRetentionDays: minRetention,
    dilutionWaterLitresPerDay: litres(input.dailyScrapsKg * waterPerKg),
    organicLoadKgVsPerM3Day: volumeM3 > 0 ? feedKgVsPerDay / volumeM3 : 0,
    governedBy,
  };
}
