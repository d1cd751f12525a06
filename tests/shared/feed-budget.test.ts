import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  FEED_LIMIT_LABELS,
  FEED_LIMIT_NAMES,
  type FeedBudgetInput,
  computeFeedBudget,
} from "../../shared/domain/feed-budget";

// A warm, healthy, established digester; each test changes what it is about.
const base: FeedBudgetInput = { workingVolumeM3: 2.0, temperatureC: 35, ph: 7.1 };
const budget = (overrides: Partial<FeedBudgetInput>) => computeFeedBudget({ ...base, ...overrides });
const codes = (overrides: Partial<FeedBudgetInput>) => budget(overrides).warnings.map((w) => w.code);

describe("feed budget check values", () => {
  it("when V is 2.0 m³ at OLR 1.0 with the default mix, then 8.84 kg of scraps are welcome", () => {
    // DOMAIN.md §2 check: V 2.0 m³, OLR 1.0 kg VS/m³/d, default mix → 8.84 kg scraps/d [derived]
    const result = budget({ olrRefKgVsPerM3Day: 1.0 });
    expect(result.budgetKgVs).toBeCloseTo(2.0, 9);
    expect(result.budgetKgScraps).toBeCloseTo(8.84, 2);
    expect(result.binding).toBe("organicLoad");
  });

  it("when V is 2.0 m³ at ≥ 20 °C, then the hydraulic limit allows 50 L of slurry a day", () => {
    // DOMAIN.md §2 check: V 2.0 m³, HRTmin 40 d → 50 L slurry/d [derived from Biogas Digest Vol. II p. 40]
    // Scraps at 25 % TS take 2.125 kg water per kg (DOMAIN.md §2 check [derived]) → 50 / 3.125 = 16 kg scraps
    const result = budget({ scrapsTsPercent: 25, scrapsVsPercentOfTs: 87, targetTsPercent: 8 });
    expect(result.dilutionWaterLitresPerKg).toBeCloseTo(2.125, 12);
    expect(result.limits.hydraulic).toBeCloseTo(16 * 0.25 * 0.87, 9);
  });

  it("when the digester is below 20 °C, then the hydraulic limit uses 100 days (20 L/day for 2 m³)", () => {
    // DOMAIN.md §2 limit 7: HRTmin 100 d below 20 °C [read: Sasse 1988 §2]
    const result = budget({ temperatureC: 19, scrapsTsPercent: 8 });
    expect(result.dilutionWaterLitresPerKg).toBe(0);
    expect(result.limits.hydraulic).toBeCloseTo(20 * 0.08 * 0.87, 9);
  });

  it("when the temperature is 20 °C, then the organic limit is f(20) = 0.352 of the warm one", () => {
    // DOMAIN.md §2: f(20) = 0.352 [derived]
    expect(budget({ temperatureC: 20 }).limits.organicLoad! / budget({}).limits.organicLoad!).toBeCloseTo(0.352, 3);
  });
});

describe("which limit binds", () => {
  const cases: { name: (typeof FEED_LIMIT_NAMES)[number]; input: Partial<FeedBudgetInput> }[] = [
    { name: "organicLoad", input: { temperatureC: 17 } },
    { name: "hydraulic", input: { olrRefKgVsPerM3Day: 2.0, scrapsTsPercent: 40 } },
    { name: "stability", input: { ph: 6.6 } },
    { name: "startUpRamp", input: { daysSinceStart: 10, gasBurns: true } },
    { name: "weekRamp", input: { fedKgVsPrevious7Days: [1, 1, 1, 1, 1, 1, 1] } },
    { name: "rollingWeek", input: { fedKgVsPrevious7Days: [0, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2] } },
  ];
  for (const { name, input } of cases) {
    it(`when ${JSON.stringify(input)}, then ${name} binds and the explanation names it`, () => {
      const result = budget(input);
      expect(result.binding).toBe(name);
      expect(result.budgetKgVs).toBeCloseTo(result.limits[name]!, 12);
      expect(result.explanation.toLowerCase()).toContain(FEED_LIMIT_LABELS[name]);
    });
  }

  it("when it is a cold week at 17 °C, then the explanation says about a quarter of a warm day's feed", () => {
    // DOMAIN.md §2 example sentence; f(17) = 1.11^-13 = 0.257 [derived]
    const result = budget({ temperatureC: 17 });
    expect(result.explanation).toContain("17 °C");
    expect(result.explanation).toContain("a quarter of a warm day's feed");
  });

  it("when 1.0 kg VS was already fed today, then it is taken off the smallest limit", () => {
    const result = budget({ olrRefKgVsPerM3Day: 1.0, fedTodayKgVs: 1.0 });
    expect(result.budgetKgVs).toBeCloseTo(1.0, 12);
    expect(result.explanation).toContain("already fed");
  });

  it("when more than the limit was already fed, then the budget is 0 with a warning", () => {
    const result = budget({ olrRefKgVsPerM3Day: 1.0, fedTodayKgVs: 2.5 });
    expect(result.budgetKgVs).toBe(0);
    expect(result.warnings.map((w) => w.code)).toContain("overLimitToday");
  });

  it("when buckets are 12 L at 0.5 kg/L, then the budget counts 6 kg buckets", () => {
    const result = budget({ olrRefKgVsPerM3Day: 1.0, bucketLitres: 12, bucketKgPerLitre: 0.5 });
    expect(result.budgetBuckets).toBeCloseTo(result.budgetKgScraps / 6, 12);
    expect(result.explanation).toContain("12 L");
  });
});

describe("stability gate", () => {
  it("when pH is 6.49, then feeding stops with stir, bicarbonate and re-test actions", () => {
    // DOMAIN.md §2 limit 3: pH < 6.5 → s = 0 [judgement after Lossie & Pütz; Gerardi 2003 read]
    const result = budget({ ph: 6.49 });
    expect(result.budgetKgVs).toBe(0);
    expect(result.limits.stability).toBe(0);
    const acid = result.warnings.find((w) => w.code === "acidStop")!;
    expect(acid.severity).toBe("stop");
    expect(acid.actions.join(" ")).toMatch(/stop feeding/i);
    expect(acid.actions.join(" ")).toMatch(/stir/i);
    expect(acid.actions.join(" ")).toMatch(/sodium bicarbonate/i);
    expect(acid.actions.join(" ")).toMatch(/2–3 days/);
  });

  it("when pH is 6.5 or VFA/TA is 0.6, then the limit is half the organic one", () => {
    // DOMAIN.md §2 limit 3: pH 6.5–6.8 or VFA/TA 0.5–0.6 → s = 0.5
    for (const readings of [{ ph: 6.5 }, { ph: 7.0, vfaTaRatio: 0.6 }]) {
      const result = budget(readings);
      expect(result.limits.stability).toBeCloseTo(0.5 * result.limits.organicLoad!, 12);
      expect(result.warnings.map((w) => w.code)).toContain("acidHalve");
    }
  });

  it("when VFA/TA is 0.61, then feeding stops", () => {
    expect(budget({ vfaTaRatio: 0.61 }).budgetKgVs).toBe(0);
  });

  it("when VFA/TA is 0.45 with history, then the limit is last week's mean", () => {
    // DOMAIN.md §2 limit 3: VFA/TA 0.4–0.5 → hold at the 7-day mean
    const result = budget({ vfaTaRatio: 0.45, fedKgVsPrevious7Days: [1, 1, 1, 1, 1.7, 1, 1] });
    expect(result.limits.stability).toBeCloseTo(7.7 / 7, 12);
    expect(result.binding).toBe("stability");
  });

  it("when VFA/TA is 0.4 and pH 6.8, then there is no stability cut", () => {
    // DOMAIN.md §2 limit 3: optimum VFA/TA 0.3–0.4 [read: ManTech #127]; pH 6.8–7.2 [read: Gerardi 2003]
    const result = budget({ ph: 6.8, vfaTaRatio: 0.4 });
    expect(result.limits.stability).toBeCloseTo(result.limits.organicLoad!, 12);
    expect(result.warnings).toEqual(result.warnings.filter((w) => w.code === "noHistory"));
  });

  it("when no pH was read in 7 days, then the limit is 0.8 of the organic one and a prompt to measure", () => {
    // DOMAIN.md §2 limit 3: no pH reading in 7 days → s = 0.8 [judgement]
    const result = budget({ ph: undefined });
    expect(result.limits.stability).toBeCloseTo(0.8 * result.limits.organicLoad!, 12);
    expect(result.binding).toBe("stability");
    expect(result.warnings.find((w) => w.code === "noRecentPh")?.message).toMatch(/measure pH/);
  });
});

describe("temperature warnings", () => {
  it("when the temperature is unknown, then the budget is 0 and says to log a temperature", () => {
    // DOMAIN.md §2 limit 2: no reading → "unknown — log a temperature" (never assume warm)
    const result = budget({ temperatureC: null });
    expect(result.budgetKgVs).toBe(0);
    expect(result.budgetKgScraps).toBe(0);
    expect(result.binding).toBe("temperatureUnknown");
    expect(result.limits.organicLoad).toBeNull();
    expect(result.explanation).toContain("log a temperature");
    expect(result.warnings[0]!.code).toBe("temperatureUnknown");
  });

  it("when the digester is at 9 °C, then nothing is fed and it is too cold", () => {
    const result = budget({ temperatureC: 9 });
    expect(result.budgetKgVs).toBe(0);
    expect(result.binding).toBe("organicLoad");
    expect(result.warnings.find((w) => w.code === "tooCold")?.severity).toBe("stop");
    expect(result.explanation).toMatch(/too cold/i);
  });
});

describe("start-up and history", () => {
  it("when the gas does not burn yet during start-up, then nothing is fed", () => {
    // DOMAIN.md §2 limit 4: no feed until the gas burns [read: GTZ Biogas Digest Vol. II]
    const result = budget({ daysSinceStart: 5, gasBurns: false });
    expect(result.limits.startUpRamp).toBe(0);
    expect(result.budgetKgVs).toBe(0);
    expect(result.warnings.map((w) => w.code)).toContain("startUpNoGas");
  });

  it("when the ramp is on day 0, 21 and 42, then it allows 25 %, 62.5 % and no cap", () => {
    // DOMAIN.md §2 limit 4: 25 % rising linearly to 100 % over 42 days [judgement]
    const organic = budget({}).limits.organicLoad!;
    expect(budget({ daysSinceStart: 0, gasBurns: true }).limits.startUpRamp).toBeCloseTo(0.25 * organic, 12);
    expect(budget({ daysSinceStart: 21, gasBurns: true }).limits.startUpRamp).toBeCloseTo(0.625 * organic, 12);
    expect(budget({ daysSinceStart: 42, gasBurns: true }).limits.startUpRamp).toBeNull();
    expect(codes({ daysSinceStart: 3 })).toContain("startUpConfirmGas");
  });

  it("when there is no history, then limits 5 and 6 are not applied and a warning says so", () => {
    // DOMAIN.md §2 limit 6: with no feeding history limits 5 and 6 are not applied
    const result = budget({});
    expect(result.limits.weekRamp).toBeNull();
    expect(result.limits.rollingWeek).toBeNull();
    expect(codes({})).toContain("noHistory");
  });

  it("when nothing was fed for a week, then the week-on-week limit falls back to a quarter of the organic limit", () => {
    // DOMAIN.md §2 limit 5: never below 0.25 × OLRmax × V [judgement]
    const result = budget({ fedKgVsPrevious7Days: [] });
    expect(result.limits.weekRamp).toBeCloseTo(0.25 * result.limits.organicLoad!, 12);
    expect(codes({ fedKgVsPrevious7Days: [] })).not.toContain("noHistory");
  });

  it("when the last 6 days were fed, then the rolling week leaves 7 × the organic limit minus their sum", () => {
    // DOMAIN.md §2 limit 6 [judgement]; the oldest of the 7 days is outside the rolling week
    const result = budget({ fedKgVsPrevious7Days: [9, 2, 2, 2, 2, 2, 2] });
    expect(result.limits.rollingWeek).toBeCloseTo(7 * result.limits.organicLoad! - 12, 12);
  });
});

describe("loading-rate cap", () => {
  it("when OLRref is 3.0 without a reason, then 2.0 is used with a warning", () => {
    // DOMAIN.md §2 limit 1: cap at 2.0 unless overridden with a recorded reason [2ary: Energies 2020 13:1279]
    const result = budget({ olrRefKgVsPerM3Day: 3.0 });
    expect(result.limits.organicLoad).toBeCloseTo(4.0, 12);
    expect(result.warnings.map((w) => w.code)).toContain("olrCapped");
  });

  it("when OLRref is 3.0 with a recorded reason, then 3.0 is used", () => {
    const result = budget({ olrRefKgVsPerM3Day: 3.0, olrOverrideReason: "Heated to 37 °C and stirred daily" });
    expect(result.limits.organicLoad).toBeCloseTo(6.0, 12);
    expect(result.warnings.find((w) => w.code === "olrOverride")?.message).toContain("Heated to 37 °C");
  });
});

describe("feed budget properties", () => {
  const maybe = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
  const inputArb: fc.Arbitrary<FeedBudgetInput> = fc.record({
    workingVolumeM3: fc.double({ min: 0.05, max: 100, noNaN: true }),
    temperatureC: fc.option(fc.double({ min: -30, max: 90, noNaN: true }), { nil: null }),
    olrRefKgVsPerM3Day: maybe(fc.double({ min: 0.1, max: 2.0, noNaN: true })),
    daysSinceStart: fc.option(fc.integer({ min: 0, max: 100 }), { nil: null }),
    gasBurns: maybe(fc.boolean()),
    ph: maybe(fc.double({ min: 0, max: 14, noNaN: true })),
    vfaTaRatio: maybe(fc.double({ min: 0, max: 5, noNaN: true })),
    fedKgVsPrevious7Days: maybe(fc.array(fc.double({ min: 0, max: 50, noNaN: true }), { maxLength: 7 })),
    fedTodayKgVs: maybe(fc.double({ min: 0, max: 50, noNaN: true })),
    scrapsTsPercent: maybe(fc.double({ min: 5, max: 60, noNaN: true })),
    scrapsVsPercentOfTs: maybe(fc.double({ min: 50, max: 99, noNaN: true })),
    targetTsPercent: maybe(fc.double({ min: 4, max: 12, noNaN: true })),
    bucketLitres: maybe(fc.double({ min: 1, max: 30, noNaN: true })),
    bucketKgPerLitre: maybe(fc.double({ min: 0.2, max: 0.9, noNaN: true })),
  });

  it("when any input is given, then the budget is never negative (1000 runs)", () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const result = computeFeedBudget(input);
        expect(result.budgetKgVs).toBeGreaterThanOrEqual(0);
        expect(result.budgetKgScraps).toBeGreaterThanOrEqual(0);
        expect(result.budgetBuckets).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 1000 },
    );
  });

  it("when any input is given, then the budget exceeds no single applied limit (1000 runs)", () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const result = computeFeedBudget(input);
        for (const name of FEED_LIMIT_NAMES) {
          const limit = result.limits[name];
          if (limit !== null) expect(result.budgetKgVs).toBeLessThanOrEqual(limit);
        }
      }),
      { numRuns: 1000 },
    );
  });

  it("when only the temperature rises, then the budget does not fall (1000 runs)", () => {
    fc.assert(
      fc.property(
        inputArb,
        fc.double({ min: -30, max: 90, noNaN: true }),
        fc.double({ min: 0, max: 60, noNaN: true }),
        (input, lowC, riseC) => {
          const cold = computeFeedBudget({ ...input, temperatureC: lowC });
          const warm = computeFeedBudget({ ...input, temperatureC: Math.min(90, lowC + riseC) });
          expect(warm.budgetKgVs).toBeGreaterThanOrEqual(cold.budgetKgVs - 1e-9 * Math.max(1, cold.budgetKgVs));
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("when pH is below 6.5 or VFA/TA above 0.6, then the budget is 0 (1000 runs)", () => {
    const acid = fc.oneof(
      fc.record({ ph: fc.double({ min: 0, max: 6.5, maxExcluded: true, noNaN: true }) }),
      fc.record({ vfaTaRatio: fc.double({ min: 0.6, max: 5, minExcluded: true, noNaN: true }) }),
    );
    fc.assert(
      fc.property(inputArb, acid, (input, readings) => {
        expect(computeFeedBudget({ ...input, ...readings }).budgetKgVs).toBe(0);
      }),
      { numRuns: 1000 },
    );
  });

  it("when the temperature is unknown, then the budget is 0 whatever else is given (1000 runs)", () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const result = computeFeedBudget({ ...input, temperatureC: null });
        expect(result.budgetKgVs).toBe(0);
        expect(result.binding).toBe("temperatureUnknown");
      }),
      { numRuns: 1000 },
    );
  });
});
