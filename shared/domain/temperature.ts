/**
 * Digester temperature: the factor that scales the organic load, and which
 * reading to trust. Source: DOMAIN.md §2 limit 2.
 */
import { type DegreesC, type Fraction, degreesC, fraction } from "../units";

/** Below this the digester is too cold to digest; feeding only stores acid (DOMAIN.md §2 limit 2). */
export const TOO_COLD_BELOW_C = 10;
/** At and above this the temperature factor is 1 (DOMAIN.md §2 limit 2). */
export const FULL_RATE_FROM_C = 30;

/**
 * Temperature factor on the organic loading rate:
 * f(T) = 1.11^(T − 30) for 10 ≤ T < 30 °C, 1 for T ≥ 30 °C, 0 below 10 °C.
 * Checks: f(20) = 0.352, f(10) = 0.124, f(30) = 1, f(9.9) = 0.
 * Source: DOMAIN.md §2 limit 2 [memory: Henze & Harremoës 1983, Water Sci.
 * Technol. 15:1; cross-check van't Hoff–Arrhenius, Mangino et al. 2001].
 * Non-decreasing in T; a non-finite T gives 0 (never assume warm).
 */
export function temperatureFactor(temperatureC: number): Fraction {
  if (!Number.isFinite(temperatureC) || temperatureC < TOO_COLD_BELOW_C) return fraction(0);
  if (temperatureC >= FULL_RATE_FROM_C) return fraction(1);
  return fraction(Math.pow(1.11, temperatureC - FULL_RATE_FROM_C));
}

/** A timestamped reading. `at` may be a Date, an ISO string or epoch milliseconds. */
export interface TimedReading {
  readonly at: Date | string | number;
  readonly value: number;
}

/** Which rule chose the temperature in {@link pickDigesterTemperature}. */
export type TemperatureBasis = "latestWithin48h" | "coldestOfLast3Days" | "none";

/** Result of {@link pickDigesterTemperature}. */
export interface PickedTemperature {
  readonly temperatureC: DegreesC | null;
  readonly basis: TemperatureBasis;
  /** When the chosen reading was taken; null when none was usable. */
  readonly readingAt: Date | null;
}

const HOUR_MS = 3_600_000;

const toMs = (at: Date | string | number): number => (at instanceof Date ? at.getTime() : new Date(at).getTime());

/** Readings taken in (now − maxAgeHours, now], valid time and finite value; readings "from the future" are ignored. */
function readingsWithin(readings: readonly TimedReading[], nowMs: number, maxAgeHours: number) {
  const fromMs = nowMs - maxAgeHours * HOUR_MS;
  const out: { atMs: number; value: number }[] = [];
  for (const r of readings) {
    const atMs = toMs(r.at);
    if (Number.isFinite(atMs) && Number.isFinite(r.value) && atMs <= nowMs && atMs >= fromMs) {
      out.push({ atMs, value: r.value });
    }
  }
  return out;
}

/**
 * The latest reading taken within `maxAgeHours` before `now` (inclusive), or
 * null. Use it for pH and VFA/TA (168 h = 7 days, DOMAIN.md §2 limit 3).
 */
export function latestReadingWithin(
  readings: readonly TimedReading[],
  now: Date | number,
  maxAgeHours: number,
): { value: number; at: Date } | null {
  let best: { atMs: number; value: number } | null = null;
  for (const r of readingsWithin(readings, toMs(now), maxAgeHours)) {
    if (best === null || r.atMs > best.atMs) best = r;
  }
  return best === null ? null : { value: best.value, at: new Date(best.atMs) };
}

/**
 * The temperature to budget with: the latest digester reading within 48 h;
 * else the coldest reading of the last 3 days; else null, meaning "budget
 * unknown — log a temperature" (never assume warm). Source: DOMAIN.md §2 limit 2.
 */
export function pickDigesterTemperature(readings: readonly TimedReading[], now: Date | number): PickedTemperature {
  const latest = latestReadingWithin(readings, now, 48);
  if (latest !== null) {
    return { temperatureC: degreesC(latest.value), basis: "latestWithin48h", readingAt: latest.at };
  }
  let coldest: { atMs: number; value: number } | null = null;
  for (const r of readingsWithin(readings, toMs(now), 72)) {
    if (coldest === null || r.value < coldest.value) coldest = r;
  }
  if (coldest !== null) {
    return { temperatureC: degreesC(coldest.value), basis: "coldestOfLast3Days", readingAt: new Date(coldest.atMs) };
  }
  return { temperatureC: null, basis: "none", readingAt: null };
}
