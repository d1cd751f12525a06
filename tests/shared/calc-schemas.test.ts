import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  FeedBudgetRequestSchema,
  FeedBudgetResponseSchema,
  FertiliserAllowanceRequestSchema,
  FertiliserAllowanceResponseSchema,
  GasHolderRequestSchema,
  GasHolderResponseSchema,
  MethaneYieldRequestSchema,
  MethaneYieldResponseSchema,
  SizingRequestSchema,
  SizingResponseSchema,
  TitrationRequestSchema,
  TitrationResponseSchema,
  WeightsForPressureRequestSchema,
  WeightsForPressureResponseSchema,
} from "../../shared/schemas/calc";
import {
  calcFeedBudget,
  calcFertiliserAllowance,
  calcGasHolder,
  calcMethaneYield,
  calcSizing,
  calcTitration,
  calcWeightsForPressure,
} from "../../shared/domain";

const messages = (result: { success: boolean; error?: { issues: { message: string; path: PropertyKey[] }[] } }) =>
  (result.error?.issues ?? []).map((issue) => `${issue.path.join(".")}: ${issue.message}`).join(" | ");

describe("feed-budget contract", () => {
  const body = { workingVolumeM3: 2, temperatureC: 25, ph: 7.0, fedKgVsPrevious7Days: [1, 1, 1], fedTodayKgVs: 0.5 };

  it("when a valid body is sent, then it parses and the answer fits the response schema", () => {
    const parsed = FeedBudgetRequestSchema.parse(body);
    expect(FeedBudgetResponseSchema.parse(calcFeedBudget(parsed)).binding).toBe("weekRamp");
  });

  it("when an unknown key is sent, then it is rejected", () => {
    const result = FeedBudgetRequestSchema.safeParse({ ...body, isAdmin: true });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.code).toBe("unrecognized_keys");
  });

  it("when a value is out of range, then the message names the allowed range", () => {
    expect(messages(FeedBudgetRequestSchema.safeParse({ ...body, workingVolumeM3: 0.01 }))).toContain(
      "from 0.05 to 100 m³",
    );
    expect(messages(FeedBudgetRequestSchema.safeParse({ ...body, ph: 15 }))).toContain(
      "pH must be a number from 0 to 14",
    );
    expect(messages(FeedBudgetRequestSchema.safeParse({ ...body, temperatureC: 120 }))).toContain("-30 to 90 °C");
    expect(
      messages(FeedBudgetRequestSchema.safeParse({ ...body, fedKgVsPrevious7Days: [1, 1, 1, 1, 1, 1, 1, 1] })),
    ).toContain("up to 7");
    expect(messages(FeedBudgetRequestSchema.safeParse({ ...body, daysSinceStart: 2.5 }))).toContain("whole number");
  });

  it("when the temperature is null, then it parses; when it is missing, then it is rejected", () => {
    expect(FeedBudgetRequestSchema.safeParse({ ...body, temperatureC: null }).success).toBe(true);
    const { temperatureC: _omitted, ...withoutTemperature } = body;
    expect(messages(FeedBudgetRequestSchema.safeParse(withoutTemperature))).toContain(
      "temperatureC: Temperature must be",
    );
  });

  it("when OLRref is above 2.0 without a reason, then it is rejected; with one, then it parses", () => {
    const missing = FeedBudgetRequestSchema.safeParse({ ...body, olrRefKgVsPerM3Day: 2.5 });
    expect(messages(missing)).toContain("olrOverrideReason: A reference loading rate above 2.0");
    expect(
      FeedBudgetRequestSchema.safeParse({ ...body, olrRefKgVsPerM3Day: 2.5, olrOverrideReason: "Heated, stirred" })
        .success,
    ).toBe(true);
  });

  it("when random valid bodies are sent, then every answer fits the response schema (1000 runs)", () => {
    const maybe = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
    fc.assert(
      fc.property(
        fc.record(
          {
            workingVolumeM3: fc.double({ min: 0.05, max: 100, noNaN: true }),
            temperatureC: fc.option(fc.double({ min: -30, max: 90, noNaN: true }), { nil: null }),
            olrRefKgVsPerM3Day: maybe(fc.double({ min: 0.1, max: 2, noNaN: true })),
            daysSinceStart: maybe(fc.integer({ min: 0, max: 3650 })),
            gasBurns: maybe(fc.boolean()),
            ph: maybe(fc.double({ min: 0, max: 14, noNaN: true })),
            vfaTaRatio: maybe(fc.double({ min: 0, max: 5, noNaN: true })),
            fedKgVsPrevious7Days: maybe(fc.array(fc.double({ min: 0, max: 1000, noNaN: true }), { maxLength: 7 })),
            fedTodayKgVs: maybe(fc.double({ min: 0, max: 1000, noNaN: true })),
            scrapsTsPercent: maybe(fc.double({ min: 1, max: 95, noNaN: true })),
            scrapsVsPercentOfTs: maybe(fc.double({ min: 1, max: 100, noNaN: true })),
            targetTsPercent: maybe(fc.double({ min: 2, max: 15, noNaN: true })),
            bucketLitres: maybe(fc.double({ min: 0.5, max: 100, noNaN: true })),
            bucketKgPerLitre: maybe(fc.double({ min: 0.1, max: 1.2, noNaN: true })),
          },
          { requiredKeys: ["workingVolumeM3", "temperatureC"] },
        ),
        (raw) => {
          const parsed = FeedBudgetRequestSchema.parse(raw);
          const answer = FeedBudgetResponseSchema.safeParse(calcFeedBudget(parsed));
          expect(answer.success, messages(answer)).toBe(true);
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe("gas-holder and weights-for-pressure contracts", () => {
  it("when 70 kg sits on a Ø 1.00 m drum risen 0.2 m, then pressure, stored gas and cooking time come back with cautions", () => {
    // DOMAIN.md §3 check [derived]: 874 Pa = 8.74 mbar = 89.1 mm WC; stored = π/4 × 0.2 m³ = 157 L; 157 / 350 × 60 = 26.9 min
    const answer = GasHolderResponseSchema.parse(
      calcGasHolder(
        GasHolderRequestSchema.parse({ drumDiameterM: 1, drumMassKg: 45, addedMassKg: 25, drumRiseM: 0.2 }),
      ),
    );
    expect(answer.pressurePa).toBeCloseTo(874, 0);
    expect(answer.pressureMbar).toBeCloseTo(8.74, 2);
    expect(answer.pressureMmWc).toBeCloseTo(89.1, 1);
    expect(answer.storedLitres).toBeCloseTo(157.08, 2);
    expect(answer.cookingMinutes).toBeCloseTo((157.08 / 350) * 60, 2);
    expect(answer.cautions.join(" ")).toMatch(/never let the drum bottom out/i);
  });

  it("when no drum rise is given, then stored gas and cooking time are left out", () => {
    const answer = calcGasHolder(GasHolderRequestSchema.parse({ drumDiameterM: 1, drumMassKg: 70 }));
    expect(answer).not.toHaveProperty("storedLitres");
    expect(answer).not.toHaveProperty("cookingMinutes");
  });

  it("when the drum alone exceeds the target, then 0 kg and the note comes first", () => {
    const answer = WeightsForPressureResponseSchema.parse(
      calcWeightsForPressure(
        WeightsForPressureRequestSchema.parse({ drumDiameterM: 1, drumMassKg: 100, targetPressurePa: 500 }),
      ),
    );
    expect(answer.addedMassKg).toBe(0);
    expect(answer.cautions[0]).toMatch(/drum alone/);
  });

  it("when a drum diameter is out of range or a key is unknown, then the request is rejected", () => {
    expect(messages(GasHolderRequestSchema.safeParse({ drumDiameterM: 9, drumMassKg: 70 }))).toContain(
      "from 0.2 to 5 m",
    );
    expect(GasHolderRequestSchema.safeParse({ drumDiameterM: 1, drumMassKg: 70, colour: "red" }).success).toBe(false);
  });
});

describe("sizing contract", () => {
  it("when daily slurry and retention are given, then only the working volume comes back", () => {
    // Sasse 1988 §4.2 [read]: 60 L/d × 80 d = 4.8 m³
    const answer = SizingResponseSchema.parse(
      calcSizing(SizingRequestSchema.parse({ dailySlurryLitres: 60, retentionDays: 80 })),
    );
    expect(answer).toEqual({ workingVolumeM3: expect.closeTo(4.8, 12) });
  });

  it("when daily scraps and temperature are given, then volume, slurry, retention and water come back", () => {
    const answer = calcSizing(SizingRequestSchema.parse({ dailyScrapsKg: 10, scrapsTsPercent: 25, temperatureC: 30 }));
    expect(Object.keys(answer).sort()).toEqual([
      "dailySlurryLitres",
      "dilutionWaterLitresPerDay",
      "retentionDays",
      "workingVolumeM3",
    ]);
    // DOMAIN.md §2 check: 25 % → 8 % takes 2.125 kg water per kg [derived]
    expect("dilutionWaterLitresPerDay" in answer && answer.dilutionWaterLitresPerDay).toBeCloseTo(21.25, 12);
    expect(SizingResponseSchema.safeParse(answer).success).toBe(true);
  });

  it("when both shapes are mixed or the sizing temperature is below 10 °C, then a clear message comes back", () => {
    expect(messages(SizingRequestSchema.safeParse({ dailySlurryLitres: 60, dailyScrapsKg: 5 }))).toContain(
      "Give either dailySlurryLitres and retentionDays, or dailyScrapsKg",
    );
    // A complete slurry body with one stray key fails only on that key, which zod names.
    expect(
      messages(SizingRequestSchema.safeParse({ dailySlurryLitres: 60, retentionDays: 80, dailyScrapsKg: 5 })),
    ).toContain('Unrecognized key: "dailyScrapsKg"');
    expect(messages(SizingRequestSchema.safeParse({ dailyScrapsKg: 10, temperatureC: 5 }))).toContain(
      "below 10 °C digestion stops",
    );
  });
});

describe("methane-yield, titration and fertiliser-allowance contracts", () => {
  it("when the Chen–Hashimoto check case is sent, then μm 0.261, K ≈ 0.758, γ ≈ 0.4165", () => {
    // DOMAIN.md §3 check [derived]
    const answer = MethaneYieldResponseSchema.parse(
      calcMethaneYield(
        MethaneYieldRequestSchema.parse({ b0M3PerKgVs: 0.45, s0KgVsPerM3: 40, retentionDays: 40, temperatureC: 30 }),
      ),
    );
    expect(answer.muMaxPerDay).toBeCloseTo(0.261, 6);
    expect(answer.k).toBeCloseTo(0.758, 3);
    expect(answer.methaneM3PerM3Day).toBeCloseTo(0.4165, 4);
    expect(answer.washout).toBe(false);
    expect(
      messages(
        MethaneYieldRequestSchema.safeParse({
          b0M3PerKgVs: 0.45,
          s0KgVsPerM3: 40,
          retentionDays: 40,
          temperatureC: 70,
        }),
      ),
    ).toContain("fitted up to 60 °C");
  });

  it("when the Nordmann check titration is sent, then FOS 622, TAC ≈ 2,245, ratio 0.28 and advice", () => {
    // DOMAIN.md §5 check [read: ManTech Method Abstract #127]; formula gives TAC 2,242.5 (source prints 2,245)
    const answer = TitrationResponseSchema.parse(calcTitration(TitrationRequestSchema.parse({ aMl: 8.97, bMl: 0.84 })));
    expect(answer.fosMgPerL).toBeCloseTo(622, 0);
    expect(Math.abs(answer.tacMgPerL - 2245) / 2245).toBeLessThan(0.002);
    expect(answer.ratio).toBeCloseTo(0.28, 2);
    expect(answer.advice).toMatch(/ratio 0\.28/);
    expect(messages(TitrationRequestSchema.safeParse({ aMl: 0, bMl: 1 }))).toContain("from 0.1 to 100 mL");
  });

  it("when 10 m² and 5 g N/L are sent, then 34 L a year with dilution and cautions", () => {
    // DOMAIN.md §4 check [derived; limit read: Council Directive 91/676/EEC, Annex III(2)]
    const answer = FertiliserAllowanceResponseSchema.parse(
      calcFertiliserAllowance(FertiliserAllowanceRequestSchema.parse({ bedAreaM2: 10, nitrogenGPerL: 5 })),
    );
    expect(answer.litresPerYear).toBeCloseTo(34, 12);
    expect(answer.dilution).toMatch(/1:1/);
    expect(answer.cautions.join(" ")).toMatch(/not sanitised/);
    expect(answer.cautions.join(" ")).toMatch(/licensed practitioners decide/);
  });
});
