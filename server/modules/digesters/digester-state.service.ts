/**
 * Today's state of each digester: the feed budget from shared/domain computed with its
 * volume, settings, latest readings and the last week's loads. Every screen that shows or
 * checks room (map, drop-offs, the steward's day, the scheduler) goes through here, in three
 * queries whatever the number of digesters.
 */
import type { Transaction } from "sequelize";
import {
  closedPhrase,
  closedReason,
  computeFeedBudget,
  latestReadingWithin,
  pickDigesterTemperature,
  startUpDay,
  type FeedBudget,
  type PickedTemperature,
} from "../../../shared/domain";
import { addDays, localDate } from "../../lib/clock";
import * as repo from "./digester-state.repository";

export interface DigesterToday {
  digester: repo.DigesterRow;
  today: string;
  budget: FeedBudget;
  temperature: PickedTemperature;
  latestPh: { value: number; at: Date } | null;
  latestVfaTa: { value: number; at: Date } | null;
  /** kg VS fed or accepted today. */
  committedTodayKgVs: number;
  /** kg VS of drop-offs waiting for a steward today. */
  pendingTodayKgVs: number;
  pendingTodayKgScraps: number;
  /** The 7 daily loads before today, oldest first (kg VS). */
  previous7DaysKgVs: number[];
  /** True when the digester takes no drop-offs at all (resting or offline). */
  closed: boolean;
}

const HOURS_7_DAYS = 7 * 24;

/** The digester's feed budget for `today`, from rows already loaded. Pure apart from its inputs. */
export function digesterToday(
  digester: repo.DigesterRow,
  readings: repo.RecentReadingRow[],
  loads: repo.DailyLoadRow[],
  now: Date,
  today: string,
): DigesterToday {
  const temperature = pickDigesterTemperature(
    readings.filter((r) => r.temperatureC !== null).map((r) => ({ at: r.takenAt, value: r.temperatureC! })),
    now,
  );
  const latestPh = latestReadingWithin(
    readings.filter((r) => r.ph !== null).map((r) => ({ at: r.takenAt, value: r.ph! })),
    now,
    HOURS_7_DAYS,
  );
  const latestVfaTa = latestReadingWithin(
    readings.filter((r) => r.vfaTaRatio !== null).map((r) => ({ at: r.takenAt, value: r.vfaTaRatio! })),
    now,
    HOURS_7_DAYS,
  );
  const committed = new Map<string, number>();
  let pendingTodayKgVs = 0;
  let pendingTodayKgScraps = 0;
  for (const l of loads) {
    if (l.kind === "committed") committed.set(l.day, (committed.get(l.day) ?? 0) + l.kgVs);
    else if (l.day === today) {
      pendingTodayKgVs += l.kgVs;
      pendingTodayKgScraps += l.freshKg;
    }
  }
  const previous7DaysKgVs = Array.from({ length: 7 }, (_, i) => committed.get(addDays(today, i - 7)) ?? 0);
  // In start-up for its first START_UP_RAMP_DAYS days (DOMAIN.md §2 limit 4); its first day is day 0.
  const { startUpDay: daysSinceStart, hasWeekOfHistory: hasHistory } = startUpDay(digester.startedOn, today);
  const inStartUp = daysSinceStart !== null;
  const budget = computeFeedBudget({
    workingVolumeM3: digester.workingVolumeM3,
    temperatureC: temperature.temperatureC,
    olrRefKgVsPerM3Day: digester.olrRefKgVsPerM3Day,
    olrOverrideReason: digester.olrOverrideReason,
    daysSinceStart: inStartUp ? daysSinceStart : null,
    gasBurns: inStartUp ? digester.gasFirstBurnedOn !== null && digester.gasFirstBurnedOn <= today : null,
    ph: latestPh?.value ?? null,
    vfaTaRatio: latestVfaTa?.value ?? null,
    // A digester younger than a week has real zeros, not missing history, once it has fed.
    fedKgVsPrevious7Days: hasHistory || previous7DaysKgVs.some((v) => v > 0) ? previous7DaysKgVs : null,
    fedTodayKgVs: committed.get(today) ?? 0,
    targetTsPercent: digester.targetTsPercent,
    bucketKgPerLitre: digester.bucketKgPerLitre,
  });
  const closed = digester.status !== "active";
  return {
    digester,
    today,
    budget: closed ? closedBudget(budget, digester) : budget,
    temperature,
    latestPh,
    latestVfaTa,
    committedTodayKgVs: committed.get(today) ?? 0,
    pendingTodayKgVs,
    pendingTodayKgScraps,
    previous7DaysKgVs,
    closed,
  };
}

function closedBudget(budget: FeedBudget, digester: repo.DigesterRow): FeedBudget {
  return {
    ...budget,
    budgetKgVs: 0 as FeedBudget["budgetKgVs"],
    budgetKgScraps: 0 as FeedBudget["budgetKgScraps"],
    budgetBuckets: 0,
    explanation: `${closedPhrase("This digester", closedReason(digester)!)}: it takes no scraps until a steward sets it active again.`,
  };
}

/** Today's state of the given digesters (all when `ids` is null). */
export async function loadDigestersToday(
  ids: number[] | null,
  options: { now?: Date; transaction?: Transaction; lock?: boolean } = {},
): Promise<DigesterToday[]> {
  const now = options.now ?? new Date();
  const today = localDate(now);
  const digesters = await repo.findDigesters(ids, options);
  if (digesters.length === 0) return [];
  const digesterIds = digesters.map((d) => d.id);
  const [readings, loads] = await Promise.all([
    repo.findRecentReadings(digesterIds, new Date(now.getTime() - HOURS_7_DAYS * 3_600_000), options.transaction),
    repo.findDailyLoads(digesterIds, addDays(today, -7), today, options.transaction),
  ]);
  return digesters.map((d) =>
    digesterToday(
      d,
      readings.filter((r) => r.digesterId === d.id),
      loads.filter((l) => l.digesterId === d.id),
      now,
      today,
    ),
  );
}
