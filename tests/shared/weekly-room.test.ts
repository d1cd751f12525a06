import { describe, it, expect } from "vitest";
import { projectWeeklyRoom } from "../../shared/domain/weekly-room";
import { computeFeedBudget } from "../../shared/domain/feed-budget";

const limits = (over: Partial<Record<string, number | null>> = {}) => ({
  organicLoad: 3,
  hydraulic: 10,
  stability: 3,
  startUpRamp: null,
  weekRamp: null,
  rollingWeek: null,
  ...over,
});

describe("projectWeeklyRoom", () => {
  it("is zero when closed or without a temperature", () => {
    expect(
      projectWeeklyRoom({ limits: limits(), previous7DaysKgVs: null, fedTodayKgVs: 0, closed: true }).weeklyKgVs,
    ).toBe(0);
    expect(
      projectWeeklyRoom({
        limits: limits({ organicLoad: null }),
        previous7DaysKgVs: null,
        fedTodayKgVs: 0,
        closed: false,
      }).weeklyKgVs,
    ).toBe(0);
  });

  it("without history is 7 × the static cap minus today's feed", () => {
    const r = projectWeeklyRoom({
      limits: limits({ stability: 2.4 }),
      previous7DaysKgVs: null,
      fedTodayKgVs: 1,
      closed: false,
    });
    // Hand-computed: min(3, 10, 2.4) = 2.4 a day; 7 × 2.4 − 1 = 15.8.
    expect(r.weeklyKgVs).toBeCloseTo(15.8, 9);
  });

  it("rolls the week-on-week rise forward from a light week", () => {
    // History 1 kg VS/day, organic 3: day 0 cap = max(1.2 × 1, 0.75) = 1.2; day 1 mean = (6 × 1 + 1.2)/7 …
    const hist = [1, 1, 1, 1, 1, 1, 1];
    const r = projectWeeklyRoom({ limits: limits(), previous7DaysKgVs: hist, fedTodayKgVs: 0, closed: false });
    const h = [...hist];
    let expected = 0;
    for (let k = 0; k < 7; k++) {
      const cap = Math.min(3, Math.max((1.2 * h.slice(-7).reduce((a, b) => a + b, 0)) / 7, 0.75));
      expected += cap;
      h.push(cap);
    }
    expect(r.weeklyKgVs).toBeCloseTo(expected, 9);
    // The daily room rises (the ramp lets the load grow) but never above the organic limit.
    for (let k = 1; k < 7; k++) expect(r.dailyKgVs[k]!).toBeGreaterThanOrEqual(r.dailyKgVs[k - 1]! - 1e-12);
    expect(Math.max(...r.dailyKgVs)).toBeLessThanOrEqual(3);
  });

  it("day 0 equals today's feed budget from the science core", () => {
    const input = {
      workingVolumeM3: 2,
      temperatureC: 28,
      ph: 7.1,
      fedKgVsPrevious7Days: [1, 1.2, 0.8, 1, 1, 1.1, 0.9],
      fedTodayKgVs: 0.3,
    };
    const budget = computeFeedBudget(input);
    const r = projectWeeklyRoom({
      limits: budget.limits,
      previous7DaysKgVs: input.fedKgVsPrevious7Days,
      fedTodayKgVs: 0.3,
      closed: false,
    });
    expect(r.dailyKgVs[0]!).toBeCloseTo(budget.budgetKgVs, 9);
    expect(r.weeklyKgScraps).toBeGreaterThan(r.weeklyKgVs);
  });
});
