/**
 * Feedings: how the stewards fed each digester day by day over the history — within the
 * organic, week-on-week, start-up and hydraulic limits as they apply them — and the fed
 * drop-offs each day's feeding took in.
 */
import type { Clock } from "./clock";
import { FIRST_DAY } from "./clock";
import {
  ACID_REST_FIRST_DAY,
  ACID_REST_LAST_DAY,
  OVERFEED_DAYS,
  simProfile,
  temperatureFactor,
  type DayConditions,
} from "./conditions";
import type { DigesterSpec } from "./digesters";
import type { DropOffLog } from "./drop-offs";
import { DIGESTER_KEYS, PERSON_KEYS } from "./keys";
import { at, round1 } from "./numbers";
import { demoRandom } from "./random";
import { KG_VS_PER_FRESH_KG, planDropOffs, waterLitresFor } from "./scraps";
import type { DemoFeeding, DemoScrapMix } from "./types";

export interface DigesterFeedings {
  feedings: DemoFeeding[];
  /** kg VS fed on each day number, for the gas the readings show. */
  vsFedByDay: Map<number, number>;
}

/**
 * One digester's daily feedings up to yesterday (today's feed has not happened yet: today has
 * only pending drop-offs). Each fed drop-off goes into `log`; households come from its pool,
 * and every third day the Green digester's first bucket is the demo resident's.
 */
export function feedDigester(
  spec: DigesterSpec,
  conditions: ReadonlyMap<number, DayConditions>,
  log: DropOffLog,
  clock: Clock,
  residentHouseholdKey: string,
): DigesterFeedings {
  const profile = simProfile(spec.key);
  const stewardKey = PERSON_KEYS[spec.steward];
  const rng = demoRandom(`feeding-${spec.key}`);
  const pool = log.poolFor(spec.key);
  const vsFedByDay = new Map<number, number>();
  const firstDay = Math.max(FIRST_DAY, spec.startedDay);
  const historyBeforeWindow = spec.startedDay < FIRST_DAY;
  const feedings: DemoFeeding[] = [];

  let latestPh: { day: number; ph: number; vfaTaRatio: number | null } | null = null;
  for (let day = firstDay; day <= -1; day++) {
    const c = conditions.get(day);
    if (!c) continue;
    if (c.ph !== null) latestPh = { day, ph: c.ph, vfaTaRatio: c.vfaTaRatio };
    const temperatureC = c.temperatures.reduce((sum, t) => sum + t, 0) / c.temperatures.length;
    const volumeM3 = spec.workingVolumeM3;
    const organicKgVs = spec.olrRefKgVsPerM3Day * temperatureFactor(temperatureC) * volumeM3;

    // Stability gate, as the stewards apply it (DOMAIN.md §2.3).
    let stability = 1;
    if (latestPh === null || day - latestPh.day > 7) stability = 0.8;
    else if (latestPh.ph < 6.5 || (latestPh.vfaTaRatio ?? 0) > 0.6) stability = 0;
    else if (latestPh.ph < 6.8 || (latestPh.vfaTaRatio ?? 0) > 0.5) stability = 0.5;

    // Start-up: nothing until the gas burns, then 25 % rising to 100 % over 42 days (DOMAIN.md §2.4).
    const sinceGas = day - spec.gasFirstBurnedDay;
    const startUp = sinceGas < 0 ? 0 : Math.min(1, 0.25 + (0.75 * sinceGas) / 42);

    // Week-on-week: ≤ 1.2 × the previous 7 days' mean, never below a quarter of the organic limit (DOMAIN.md §2.5).
    let weekCap = Infinity;
    if (!historyBeforeWindow || day - 7 >= FIRST_DAY) {
      let sum = 0;
      for (let back = 1; back <= 7; back++) sum += vsFedByDay.get(day - back) ?? 0;
      weekCap = Math.max((1.2 * sum) / 7, 0.25 * organicKgVs);
    }
    const hydraulicLitres = (volumeM3 * 1000) / (temperatureC >= 20 ? 40 : 100);

    let allowanceKgVs = Math.min(
      rng.range(...profile.utilisation) * stability * organicKgVs,
      weekCap,
      startUp * organicKgVs,
    );
    let forceMix: readonly DemoScrapMix[] | undefined;
    let feedingNote: string | null = null;
    if (spec.key === DIGESTER_KEYS.orchard) {
      if (OVERFEED_DAYS.includes(day)) {
        // The story of the acid episode: a harvest supper's leftovers, well over the limit.
        allowanceKgVs = 2.3 * organicKgVs;
        forceMix = ["cooked", "breadGrains", "cooked", "mixed"];
        feedingNote = "Harvest supper leftovers.";
      } else if (day >= ACID_REST_FIRST_DAY && day <= ACID_REST_LAST_DAY) {
        allowanceKgVs = 0;
      }
    }

    const plans = planDropOffs(rng, profile.size, allowanceKgVs, forceMix ? Infinity : hydraulicLitres, forceMix);
    if (plans.length === 0) continue;
    const times = plans.map(() => rng.int(7 * 60, 19 * 60 + 30)).sort((a, b) => a - b);
    const fed = plans.map((plan, index) => {
      const minutes = at(times, index);
      const householdKey =
        spec.key === DIGESTER_KEYS.green && index === 0 && (day + 90) % 3 === 0
          ? residentHouseholdKey
          : rng.weighted(pool);
      return log.add(rng, {
        householdKey,
        digesterKey: spec.key,
        day,
        createdAt: clock.at(day, Math.floor(minutes / 60), minutes % 60),
        bucketCount: plan.bucketCount,
        bucketLitres: plan.bucketLitres,
        weightKg: plan.weightKg,
        mix: plan.mix,
        citrusPercent: plan.mix === "fruitVeg" ? rng.int(0, 10) : rng.int(0, 4),
        status: "fed",
        turnedAwayReason: null,
      });
    });
    const freshKg = plans.reduce((sum, plan) => sum + plan.freshKg, 0);
    const waterLitres = plans.reduce((sum, plan) => sum + waterLitresFor(plan.mix, plan.freshKg), 0);
    vsFedByDay.set(
      day,
      plans.reduce((sum, plan) => sum + plan.freshKg * KG_VS_PER_FRESH_KG[plan.mix], 0),
    );
    feedings.push({
      key: `feeding-${spec.key.replace("digester-", "")}-${clock.date(day)}`,
      digesterKey: spec.key,
      personKey: stewardKey,
      fedOn: clock.date(day),
      freshKg: round1(freshKg),
      waterLitres: round1(waterLitres),
      dropOffKeys: fed.map((dropOff) => dropOff.key),
      note: feedingNote,
    });
  }
  return { feedings, vsFedByDay };
}
