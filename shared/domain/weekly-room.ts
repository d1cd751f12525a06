/**
 * A digester's expected room for the coming week (PRODUCT.md §5 scheduler).
 *
 * Method (a projection, not a forecast of the weather): today's feed budget
 * limits are held for 7 days and the two limits that depend on what was fed
 * (week-on-week rise and rolling week, DOMAIN.md §2 limits 5–6 [judgement])
 * are rolled forward day by day, assuming each day is fed up to its cap:
 *
 *   cap_k = min(static, weekRamp_k, rollingWeek_k)
 *   static = min(organicLoad, hydraulic, stability, startUpRamp) (today's values)
 *   weekRamp_k = max(1.2 × mean(last 7 loads), 0.25 × organicLoad)
 *   rollingWeek_k = max(0, 7 × organicLoad − Σ last 6 loads)
 *   room_0 = max(0, cap_0 − fedToday); room_k = cap_k for k = 1…6
 *   weekly room = Σ_k room_k (kg VS), turned into fresh kg with the default
 *   scraps composition ({@link freshKgFromKgVs}).
 *
 * Temperature and stability are today's (the latest readings); a start-up
 * ramp is held at today's share, which under-states the room a little while
 * it rises (the safe side). Closed (resting/offline) digesters and an unknown
 * temperature give 0.
 */
import { type Kg, type KgVs, kg, kgVs } from "../units";
import { WEEK_RAMP_FACTOR, WEEK_RAMP_FLOOR_SHARE, type FeedLimitName } from "./feed-budget";
import { freshKgFromKgVs } from "./scraps";

/** Input of {@link projectWeeklyRoom}: today's limits and feeding history from the feed budget. */
export interface WeeklyRoomInput {
  /** Today's limits on the total daily load, kg VS/day (null = not applied); the feed budget's `limits`. */
  readonly limits: Readonly<Record<FeedLimitName, number | null>>;
  /** The 7 daily loads before today, oldest first, kg VS; null when there is no history (limits 5–6 not applied). */
  readonly previous7DaysKgVs: readonly number[] | null;
  /** kg VS already fed or accepted today. */
  readonly fedTodayKgVs: number;
  /** Resting, offline or excluded: no room. */
  readonly closed: boolean;
  /** Scraps composition for the fresh-kg figure (defaults as in the feed budget). */
  readonly scrapsTsPercent?: number;
  readonly scrapsVsPercentOfTs?: number;
}

/** Result of {@link projectWeeklyRoom}. */
export interface WeeklyRoom {
  /** Room on each of the 7 days from today, kg VS. */
  readonly dailyKgVs: readonly KgVs[];
  /** Σ dailyKgVs, kg VS. */
  readonly weeklyKgVs: KgVs;
  /** The same in fresh kg of scraps. */
  readonly weeklyKgScraps: Kg;
}

/** Plain statement of the method, shown in the UI beside the figures. */
export const WEEKLY_ROOM_METHOD =
  "Weekly room = the next 7 days' feed budgets, holding today's temperature and acid check and rolling the week-on-week and rolling-week limits forward as if each day were fed to its limit; 0 when resting, offline or without a temperature reading.";

/** Projects the next 7 days' feed budgets (see the module comment for the formula and sources). */
export function projectWeeklyRoom(input: WeeklyRoomInput): WeeklyRoom {
  const l = input.limits;
  const daily: KgVs[] = [];
  if (input.closed || l.organicLoad === null) {
    for (let k = 0; k < 7; k++) daily.push(kgVs(0));
    return { dailyKgVs: daily, weeklyKgVs: kgVs(0), weeklyKgScraps: kg(0) };
  }
  const organic = Math.max(0, l.organicLoad);
  const staticCap = Math.min(
    ...[l.organicLoad, l.hydraulic, l.stability, l.startUpRamp].filter((v): v is number => v !== null),
  );
  const history =
    input.previous7DaysKgVs === null ? null : input.previous7DaysKgVs.slice(-7).map((v) => Math.max(0, v));
  while (history !== null && history.length < 7) history.unshift(0);
  const fedToday = Math.max(0, input.fedTodayKgVs);
  for (let k = 0; k < 7; k++) {
    let cap = Math.max(0, staticCap);
    if (history !== null) {
      const last7 = history.slice(-7);
      const mean = last7.reduce((a, b) => a + b, 0) / 7;
      const weekRamp = Math.max(WEEK_RAMP_FACTOR * mean, WEEK_RAMP_FLOOR_SHARE * organic);
      const rolling = Math.max(0, 7 * organic - last7.slice(-6).reduce((a, b) => a + b, 0));
      cap = Math.min(cap, weekRamp, rolling);
    }
    const room = k === 0 ? Math.max(0, cap - fedToday) : cap;
    daily.push(kgVs(room));
    history?.push(k === 0 ? Math.max(cap, fedToday) : cap);
  }
  const weekly = daily.reduce((a, b) => a + b, 0);
  return {
    dailyKgVs: daily,
    weeklyKgVs: kgVs(weekly),
    weeklyKgScraps: freshKgFromKgVs(weekly, input.scrapsTsPercent, input.scrapsVsPercentOfTs),
  };
}
