import { describe, expect, it } from "vitest";
import { formatNumber, readNumber, readNumbers } from "@/features/planning/utils/numbers";
import { planSeasonGas, seasonGasPoint, SeasonGasFormSchema } from "@/features/planning/utils/season-gas";

describe("reading numbers typed in the planning forms", () => {
  it("when a number is typed with a point, a comma or spaces, then it is read as that number", () => {
    expect(readNumber("0.2")).toBe(0.2);
    expect(readNumber("0,2")).toBe(0.2);
    expect(readNumber(" 1 250 ")).toBe(1250);
    expect(readNumber("-3")).toBe(-3);
    expect(readNumber(".5")).toBe(0.5);
  });

  it("when the text is empty, then it is left out; when it is not a number, then the text is kept for the schema to refuse", () => {
    expect(readNumber("  ")).toBeUndefined();
    expect(readNumber("NaN")).toBe("NaN");
    expect(readNumber("eight")).toBe("eight");
    expect(readNumber("1,234.5")).toBe("1,234.5");
    expect(readNumbers({ a: "1", b: "", c: "x" })).toEqual({ a: 1, c: "x" });
  });

  it("formats figures with thousands separators and never shows -0", () => {
    expect(formatNumber(2242.5, 0)).toBe("2,243");
    expect(formatNumber(-0)).toBe("0");
    expect(formatNumber(1.4567, 2)).toBe("1.46");
  });
});

describe("expected gas by season", () => {
  const digester = { workingVolumeM3: 2, dailyScrapsKg: 8, burnerLitresPerHour: 350 };

  it("when the digester is warm, then all the planned scraps are fed", () => {
    // At 30 °C the organic limit is 1.5 × 1 × 2 = 3 kg VS [DOMAIN.md §2, OLRref read: Werner et al. 1989] and the
    // hydraulic limit 3.48 kg VS [derived]; 8 kg × 0.2262 = 1.81 kg VS [derived, default mix Zhang et al. 2007] is below both.
    const point = seasonGasPoint(digester, 30);
    expect(point.limitedByBudget).toBe(false);
    expect(point.fedKgScraps).toBeCloseTo(8, 9);
    expect(point.biogasLitresPerDay).toBeGreaterThan(0);
    // Minutes of cooking = litres / burner L/h × 60 (DOMAIN.md §3).
    expect(point.cookingMinutesPerDay).toBeCloseTo((point.biogasLitresPerDay / 350) * 60, 9);
  });

  it("when the digester is at 15 °C, then the organic limit 1.5 × f(15) × V caps the feed", () => {
    // f(15) = 1.11^(15 − 30) = 0.2090 [derived from DOMAIN.md §2]; 1.5 × 0.2090 × 2 = 0.627 kg VS ÷ 0.2262 = 2.77 kg [derived]
    const point = seasonGasPoint(digester, 15);
    expect(point.limitedByBudget).toBe(true);
    expect(point.fedKgScraps).toBeCloseTo(2.772, 2);
  });

  it("when the digester is below 10 °C, then nothing is fed and no gas is expected", () => {
    // f(T) = 0 below 10 °C (DOMAIN.md §2)
    const point = seasonGasPoint(digester, 9);
    expect(point.fedKgScraps).toBe(0);
    expect(point.biogasLitresPerDay).toBe(0);
  });

  it("when the seasons are 12 and 30 °C, then the curve spans 5–40 °C and the table has every 5 °C plus both seasons", () => {
    const plan = planSeasonGas({ ...digester, coldTemperatureC: 12, warmTemperatureC: 30 });
    expect(plan.curve[0]?.temperatureC).toBe(5);
    expect(plan.curve.at(-1)?.temperatureC).toBe(40);
    expect(plan.tableRows.map((row) => row.temperatureC)).toEqual([5, 10, 12, 15, 20, 25, 30, 35, 40]);
    expect(plan.cold.biogasLitresPerDay).toBeLessThan(plan.warm.biogasLitresPerDay);
  });

  it("when a season temperature is out of the gas model's range, then the form schema names it", () => {
    const result = SeasonGasFormSchema.safeParse({ ...digester, coldTemperatureC: 200, warmTemperatureC: 30 });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.path).toEqual(["coldTemperatureC"]);
    expect(result.error?.issues[0]?.message).toMatch(/from -30 to 60 °C/);
  });
});
