/**
 * The simulated weather and digester conditions: each digester's temperatures through the
 * day, the cold spell three to four weeks ago, pH strips and acid titrations, and the orchard
 * digester's acid episode after a harvest supper.
 */
import { FIRST_DAY } from "./clock";
import type { DigesterSpec } from "./digesters";
import { DIGESTER_KEYS } from "./keys";
import { clamp, round1, round2 } from "./numbers";
import { demoRandom } from "./random";

/** The orchard digester's acid episode: overfed on days −44…−42, rested −39…−34. */
export const OVERFEED_DAYS = [-44, -43, -42];
export const ACID_REST_FIRST_DAY = -39;
export const ACID_REST_LAST_DAY = -34;
// prettier-ignore
const ACID_PH: ReadonlyMap<number, readonly [ph: number, vfaTaRatio: number]> = new Map([
  [-42, [6.95, 0.42]],
  [-41, [6.8, 0.48]],
  [-40, [6.6, 0.57]],
  [-39, [6.45, 0.64]],
  [-38, [6.3, 0.7]],
  [-37, [6.34, 0.68]],
  [-36, [6.48, 0.61]],
  [-35, [6.6, 0.55]],
  [-34, [6.74, 0.48]],
  [-33, [6.88, 0.42]],
  [-32, [6.98, 0.38]],
  [-31, [7.04, 0.35]],
  [-30, [7.08, 0.33]],
]);
/** Share of normal gas production while the orchard digester was sour. */
// prettier-ignore
export const ACID_GAS_SHARE: ReadonlyMap<number, number> = new Map([
  [-41, 0.8], [-40, 0.55], [-39, 0.35], [-38, 0.2], [-37, 0.2], [-36, 0.3], [-35, 0.4],
  [-34, 0.5], [-33, 0.6], [-32, 0.7], [-31, 0.8], [-30, 0.9],
]);

/** f(T) = 1.11^(T − 30) for 10 ≤ T < 30 °C, 1 above, 0 below (DOMAIN.md §2.2). Local copy: the demo must not move when budget code changes. */
export const temperatureFactor = (temperatureC: number): number =>
  temperatureC < 10 ? 0 : temperatureC >= 30 ? 1 : 1.11 ** (temperatureC - 30);

export interface SimProfile {
  key: string;
  /** Local reading times; single-reading digesters also get a morning check today (keeps one within 24 h). */
  slots: readonly (readonly [hour: number, minute: number])[];
  baseTemperatureC: number;
  swingC: number;
  eveningLiftC: number;
  coldTargetC: number;
  coldMinimumC: number;
  /** How deep the cold spell reaches on each day, 0…1: the uninsulated tank follows the air, an insulated one lags. */
  coldShape: ReadonlyMap<number, number>;
  phDaily: boolean;
  /** Share of the organic limit the stewards actually feed. */
  utilisation: readonly [number, number];
  size: "small" | "large";
  /** Minutes of cooking on a normal day. */
  normalGasMinutes: number;
}

// prettier-ignore
const SHAPE_FOLLOWS_AIR: ReadonlyMap<number, number> = new Map([
  [-29, 0.35], [-28, 1], [-27, 1], [-26, 1], [-25, 1], [-24, 1], [-23, 1], [-22, 0.55], [-21, 0.25], [-20, 0.1],
]);
// prettier-ignore
const SHAPE_LAGS: ReadonlyMap<number, number> = new Map([
  [-29, 0.1], [-28, 0.4], [-27, 0.7], [-26, 0.95], [-25, 1], [-24, 1], [-23, 0.95], [-22, 0.7], [-21, 0.45], [-20, 0.25], [-19, 0.1],
]);

// prettier-ignore
const SIM_PROFILES: ReadonlyMap<string, SimProfile> = new Map<string, SimProfile>([
  [DIGESTER_KEYS.school, {
    key: DIGESTER_KEYS.school, slots: [[15, 40]], baseTemperatureC: 19, swingC: 2.2, eveningLiftC: 0, coldTargetC: 9.6, coldMinimumC: 8,
    coldShape: SHAPE_FOLLOWS_AIR, phDaily: false, utilisation: [0.7, 0.95], size: "small", normalGasMinutes: 25,
  }],
  [DIGESTER_KEYS.orchard, {
    key: DIGESTER_KEYS.orchard, slots: [[17, 30]], baseTemperatureC: 22.5, swingC: 1.4, eveningLiftC: 0, coldTargetC: 11.6, coldMinimumC: 10.5,
    coldShape: SHAPE_LAGS, phDaily: false, utilisation: [0.75, 0.95], size: "small", normalGasMinutes: 45,
  }],
  [DIGESTER_KEYS.meadow, {
    key: DIGESTER_KEYS.meadow, slots: [[8, 30], [18, 15]], baseTemperatureC: 27, swingC: 1.8, eveningLiftC: 1.2, coldTargetC: 18, coldMinimumC: 15,
    coldShape: SHAPE_FOLLOWS_AIR, phDaily: true, utilisation: [0.8, 0.98], size: "large", normalGasMinutes: 150,
  }],
  [DIGESTER_KEYS.green, {
    key: DIGESTER_KEYS.green, slots: [[8, 10], [18, 40]], baseTemperatureC: 35.3, swingC: 0.4, eveningLiftC: 0.2, coldTargetC: 32.8, coldMinimumC: 32,
    coldShape: SHAPE_LAGS, phDaily: true, utilisation: [0.4, 0.55], size: "large", normalGasMinutes: 300,
  }],
]);

/** The simulation profile of one digester; throws for an unknown key. */
export function simProfile(key: string): SimProfile {
  const profile = SIM_PROFILES.get(key);
  if (!profile) throw new Error(`demo data: no profile for ${key}`);
  return profile;
}

export interface DayConditions {
  temperatures: number[];
  ph: number | null;
  vfaTaRatio: number | null;
}

/** Temperatures, pH and acid ratio per day for one digester (before any feeding is decided). */
export function simulateConditions(spec: DigesterSpec, profile: SimProfile): Map<number, DayConditions> {
  const rng = demoRandom(`conditions-${spec.key}`);
  const phase1 = rng.range(0, 2 * Math.PI);
  const phase2 = rng.range(0, 2 * Math.PI);
  const phPhase = rng.range(0, 2 * Math.PI);
  const out = new Map<number, DayConditions>();
  const firstDay = Math.max(FIRST_DAY, spec.startedDay);
  for (let day = firstDay; day <= 0; day++) {
    const drift =
      profile.swingC *
      (0.65 * Math.sin((2 * Math.PI * day) / 17 + phase1) + 0.35 * Math.sin((2 * Math.PI * day) / 6.3 + phase2));
    const normal = profile.baseTemperatureC + drift;
    const cold = profile.coldShape.get(day) ?? 0;
    const coldTemperature = profile.coldTargetC + rng.range(-0.8, 0.8);
    const temperatures = profile.slots.map((_, slot) => {
      const lift = slot === profile.slots.length - 1 && profile.slots.length > 1 ? profile.eveningLiftC : 0;
      const value = (1 - cold) * (normal + lift) + cold * coldTemperature + rng.range(-0.3, 0.3);
      return round1(cold > 0 ? Math.max(profile.coldMinimumC, value) : value);
    });

    let ph: number | null = null;
    let vfaTaRatio: number | null = null;
    const sinceStart = day - spec.startedDay;
    const normalPh = round2(
      clamp(7.17 + 0.09 * Math.sin((2 * Math.PI * day) / 11 + phPhase) + rng.range(-0.05, 0.05) - 0.06 * cold, 7, 7.4),
    );
    if (spec.key === DIGESTER_KEYS.orchard && ACID_PH.has(day)) {
      const acid = ACID_PH.get(day);
      if (acid) [ph, vfaTaRatio] = acid;
    } else if (profile.phDaily) {
      // A new digester runs a little low while the methane-formers catch up.
      ph = sinceStart < 12 ? round2(6.86 + 0.015 * sinceStart + rng.range(-0.03, 0.03)) : normalPh;
    } else if (spec.key === DIGESTER_KEYS.school) {
      // Weekly strips, the last one nine days ago: the demo shows the "measure pH" prompt here.
      if (day <= -9 && (day + 9) % 7 === 0) ph = normalPh;
    } else if ((day + 2) % 7 === 0) {
      ph = normalPh;
    }

    if (vfaTaRatio === null && ph !== null) {
      const titrationDay =
        (spec.key === DIGESTER_KEYS.green && day % 7 === 0) ||
        (spec.key === DIGESTER_KEYS.meadow && sinceStart % 3 === 0) ||
        (spec.key === DIGESTER_KEYS.orchard && (day === -58 || day === -23));
      if (titrationDay) vfaTaRatio = round2(sinceStart < 12 ? rng.range(0.36, 0.42) : rng.range(0.24, 0.36));
    }
    out.set(day, { temperatures, ph, vfaTaRatio });
  }
  return out;
}
