/**
 * Readings: what the stewards wrote down at each digester — temperature at each reading time,
 * pH and acid ratio when they measured, the gas drum's level, minutes of cooking — and the
 * notes that tell the history's story.
 */
import type { Clock } from "./clock";
import { FIRST_DAY } from "./clock";
import { ACID_GAS_SHARE, simProfile, temperatureFactor, type DayConditions } from "./conditions";
import type { DigesterSpec } from "./digesters";
import { DIGESTER_KEYS, PERSON_KEYS } from "./keys";
import { at, clamp, round1 } from "./numbers";
import { demoRandom } from "./random";
import type { DemoReading } from "./types";

const READING_NOTES: ReadonlyMap<string, ReadonlyMap<number, string>> = new Map([
  [
    DIGESTER_KEYS.green,
    new Map([
      [-55, "Drained the condensate trap."],
      [-41, "Lunch club cooked for forty today."],
      [-26, "Cold snap: heating loop running flat out, tank a little cooler."],
      [-12, "Flame trap checked and cleaned."],
      [-3, "Stirred; broke up the crust."],
    ]),
  ],
  [
    DIGESTER_KEYS.orchard,
    new Map([
      [-44, "Leftovers from the harvest supper: a lot of bread and rice over three days."],
      [-41, "Flame weaker than usual."],
      [-40, "Sour smell; flame orange and weak. Halving the feed."],
      [-39, "pH below 6.5: stopped feeding, stirred, added 1 kg of sodium bicarbonate."],
      [-37, "Re-tested: acids still high. Resting."],
      [-35, "pH climbing. Resting two more days."],
      [-33, "Restarting at a quarter of the usual feed."],
      [-27, "Cold snap: wrapped the inlet pipe."],
      [-16, "Flame steady and blue again."],
    ]),
  ],
  [
    DIGESTER_KEYS.school,
    new Map([
      [-27, "Frost overnight. Lid covered with an old duvet."],
      [-25, "Too cold to feed today."],
      [-20, "Warming up again; the class timed the flame."],
      [-3, "Out of pH strips; new pack ordered."],
    ]),
  ],
  [
    DIGESTER_KEYS.meadow,
    new Map([
      [-20, "Filled with water and 200 L of digestate from the Green digester as a starter."],
      [-15, "Gas will not light yet; vented the drum."],
      [-11, "First steady blue flame."],
      [-5, "Solar loop pump restarted after the storm."],
    ]),
  ],
]);

/**
 * One digester's readings from its first day in the window up to `today` (none later). Gas
 * follows how much it was fed over the last week, the cold and the acid episode.
 */
export function readDigester(
  spec: DigesterSpec,
  conditions: ReadonlyMap<number, DayConditions>,
  vsFedByDay: ReadonlyMap<number, number>,
  clock: Clock,
): DemoReading[] {
  const profile = simProfile(spec.key);
  const stewardKey = PERSON_KEYS[spec.steward];
  const gasRng = demoRandom(`gas-${spec.key}`);
  const firstDay = Math.max(FIRST_DAY, spec.startedDay);
  const historyBeforeWindow = spec.startedDay < FIRST_DAY;
  const readings: DemoReading[] = [];

  const notes = READING_NOTES.get(spec.key) ?? new Map<number, string>();
  const normalKgVs =
    spec.olrRefKgVsPerM3Day *
    temperatureFactor(profile.baseTemperatureC) *
    spec.workingVolumeM3 *
    profile.utilisation[0];
  let readingNumber = 0;
  for (let day = firstDay; day <= 0; day++) {
    const c = conditions.get(day);
    if (!c) continue;
    let recentKgVs = 0;
    for (let back = 0; back < 7; back++) recentKgVs += vsFedByDay.get(day - back) ?? 0;
    const coldShare = temperatureFactor(at(c.temperatures, 0)) / temperatureFactor(profile.baseTemperatureC);
    const acidShare = spec.key === DIGESTER_KEYS.orchard ? (ACID_GAS_SHARE.get(day) ?? 1) : 1;
    const fedShare = historyBeforeWindow && day - 7 < FIRST_DAY ? 1 : recentKgVs / 7 / normalKgVs;
    const health = clamp(Math.min(fedShare, 1) * Math.min(1, 0.5 + 0.5 * coldShare) * acidShare, 0, 1);
    const gasBurns = day >= spec.gasFirstBurnedDay;

    // Today a single-reading digester also gets a morning check, so one reading is always less than a day old.
    const morningCheck = day === 0 && profile.slots.length === 1;
    const slots: (readonly [number, number])[] = morningCheck ? [[7, 45], ...profile.slots] : [...profile.slots];
    slots.forEach(([hour, minute], slot) => {
      const takenAt = clock.at(day, hour, minute + gasRng.int(0, 9));
      if (takenAt.getTime() > clock.today.getTime()) return;
      const isMorningCheck = morningCheck && slot === 0;
      const regular = morningCheck ? slot - 1 : slot;
      const temperatureC = isMorningCheck ? round1(at(c.temperatures, 0) - 0.6) : at(c.temperatures, regular);
      let gasLevelPercent: number;
      if (!gasBurns) gasLevelPercent = round1(clamp(15 + 2.5 * (day - spec.startedDay) + gasRng.range(-5, 5), 5, 60));
      else if (profile.slots.length > 1)
        gasLevelPercent = round1(
          clamp((regular === 0 ? 45 + 45 * health : 18 + 30 * health) + gasRng.range(-4, 4), 3, 97),
        );
      else gasLevelPercent = round1(clamp(28 + 50 * health + gasRng.range(-6, 6), 3, 97));
      const lastRegular = regular === profile.slots.length - 1;
      const gasUsedMinutes =
        gasBurns && lastRegular
          ? Math.round((profile.normalGasMinutes * health * gasRng.range(0.8, 1.1)) / 5) * 5
          : null;
      const phHere = regular === 0 ? c.ph : null;
      readingNumber += 1;
      readings.push({
        key: `reading-${spec.key.replace("digester-", "")}-${String(readingNumber).padStart(3, "0")}`,
        digesterKey: spec.key,
        personKey: stewardKey,
        takenAt: takenAt.toISOString(),
        temperatureC,
        ph: phHere,
        vfaTaRatio: phHere === null ? null : c.vfaTaRatio,
        gasLevelPercent,
        gasUsedMinutes,
        note: regular === 0 ? (notes.get(day) ?? null) : null,
      });
    });
  }
  return readings;
}
