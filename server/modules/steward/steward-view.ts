/** Turns a digester's state today and its rows into what the steward's screens show. Pure. */
import { CITRUS_MAX_SHARE, DEFAULT_BUCKET_LITRES, fitsRoom, freshKgFromKgVs } from "../../../shared/domain";
import type { LatestReadings, LatestValue, StewardBudget, StewardDropOff } from "../../../shared/schemas/steward";
import { READING_MAX_AGE_HOURS } from "../../../shared/schemas/steward";
import {
  suggestedWaterLitres,
  toSummary,
  type DigesterToday,
  type DropOffRow,
  type LatestReadingRow,
} from "../digesters";

const round = (v: number, places: number) => Math.round(v * 10 ** places) / 10 ** places;
const roundOrNull = (v: number | null, places: number) => (v === null ? null : round(v, places));

/** Today's budget with the figures a steward feeds with. */
export function stewardBudget(state: DigesterToday): StewardBudget {
  const b = state.budget;
  const limits = b.limits;
  return {
    ...toSummary(state).today,
    committedKgVs: round(state.committedTodayKgVs, 3),
    committedKgScraps: round(freshKgFromKgVs(state.committedTodayKgVs), 1),
    dilutionWaterLitresPerKg: round(b.dilutionWaterLitresPerKg, 3),
    targetTsPercent: state.digester.targetTsPercent,
    limits: {
      organicLoad: roundOrNull(limits.organicLoad, 3),
      hydraulic: roundOrNull(limits.hydraulic, 3),
      stability: roundOrNull(limits.stability, 3),
      startUpRamp: roundOrNull(limits.startUpRamp, 3),
      weekRamp: roundOrNull(limits.weekRamp, 3),
      rollingWeek: roundOrNull(limits.rollingWeek, 3),
    },
    bucketLitres: DEFAULT_BUCKET_LITRES,
    bucketKg: round(DEFAULT_BUCKET_LITRES * state.digester.bucketKgPerLitre, 2),
    closed: state.closed,
  };
}

function latest(value: number | null, at: Date | null, now: Date, maxAgeHours: number): LatestValue {
  if (value === null || at === null) return null;
  const ageHours = Math.max(0, (now.getTime() - new Date(at).getTime()) / 3_600_000);
  return {
    value,
    takenAt: new Date(at).toISOString(),
    ageHours: round(ageHours, 1),
    stale: ageHours > maxAgeHours,
    maxAgeHours,
  };
}

/** The last readings and how old they are; stale beyond DOMAIN.md's limits (temperature 48 h, pH and acids 7 days). */
export function latestReadings(row: LatestReadingRow | undefined, now: Date): LatestReadings {
  if (!row) return { temperatureC: null, ph: null, vfaTaRatio: null, gasLevelPercent: null, lastReadingAt: null };
  return {
    temperatureC: latest(row.temperatureC, row.temperatureAt, now, READING_MAX_AGE_HOURS.temperature),
    ph: latest(row.ph, row.phAt, now, READING_MAX_AGE_HOURS.ph),
    vfaTaRatio: latest(row.vfaTaRatio, row.vfaTaAt, now, READING_MAX_AGE_HOURS.vfaTa),
    // The gas level does not enter the budget; a day old is old for a gas holder.
    gasLevelPercent: latest(row.gasLevelPercent, row.gasLevelAt, now, 24),
    lastReadingAt: row.lastAt ? new Date(row.lastAt).toISOString() : null,
  };
}

/** A drop-off as the steward handles it, with whether it fits in today's room now. */
export function stewardDropOff(row: DropOffRow, state: DigesterToday | undefined): StewardDropOff {
  const alreadyCounted = row.status === "accepted" && state !== undefined && row.forDate === state.today;
  const room = state && !state.closed ? state.budget.budgetKgVs : 0;
  return {
    ...row,
    createdAt: new Date(row.createdAt).toISOString(),
    fitsToday: alreadyCounted || (state !== undefined && !state.closed && fitsRoom(row.kgVs, room)),
    citrusOverLimit: row.citrusPercent > CITRUS_MAX_SHARE * 100,
    suggestedWaterLitres: state
      ? suggestedWaterLitres(row.freshKg, row.mix, row.citrusPercent, state.digester.targetTsPercent)
      : 0,
  };
}
