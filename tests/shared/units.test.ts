import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  circleAreaM2,
  cubicMetres,
  cubicMetresToLitres,
  fraction,
  fractionToPercent,
  kg,
  kgToGrams,
  gramsToKg,
  litres,
  litresToCubicMetres,
  millibar,
  millibarToMmWaterColumn,
  millibarToPascal,
  mmWaterColumn,
  mmWaterColumnToMillibar,
  mmWaterColumnToPascal,
  pascal,
  pascalToMillibar,
  pascalToMmWaterColumn,
  percent,
  percentToFraction,
} from "../../shared/units";

const finite = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });
const closeRel = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));

describe("unit conversions", () => {
  it("when 100 Pa is converted, then it is 1 mbar (SI definition, exact)", () => {
    expect(pascalToMillibar(pascal(100))).toBe(1);
    expect(millibarToPascal(millibar(8.74))).toBeCloseTo(874, 9);
  });

  it("when 9.80665 Pa is converted, then it is 1 mm of water column (conventional g = 9.80665 m/s², water 1000 kg/m³)", () => {
    expect(pascalToMmWaterColumn(pascal(9.80665))).toBeCloseTo(1, 12);
    expect(mmWaterColumnToPascal(mmWaterColumn(100))).toBeCloseTo(980.665, 9);
    // 1 mbar = 100 / 9.80665 mm WC ≈ 10.197 mm WC [derived]
    expect(millibarToMmWaterColumn(millibar(1))).toBeCloseTo(10.197, 3);
  });

  it("when 1000 L is converted, then it is 1 m³", () => {
    expect(litresToCubicMetres(litres(1000))).toBe(1);
    expect(cubicMetresToLitres(cubicMetres(4.8))).toBeCloseTo(4800, 9);
  });

  it("when a 1.00 m diameter is given, then the circle area is π/4 m²", () => {
    expect(circleAreaM2(1)).toBeCloseTo(0.785398, 6);
  });

  it("when any pressure goes Pa → mbar → Pa or Pa → mm WC → Pa, then it comes back unchanged (1000 runs)", () => {
    fc.assert(
      fc.property(finite, (value) => {
        expect(closeRel(millibarToPascal(pascalToMillibar(pascal(value))), value)).toBe(true);
        expect(closeRel(mmWaterColumnToPascal(pascalToMmWaterColumn(pascal(value))), value)).toBe(true);
        expect(closeRel(mmWaterColumnToMillibar(millibarToMmWaterColumn(millibar(value))), value)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });

  it("when any volume, mass or share goes there and back, then it comes back unchanged (1000 runs)", () => {
    fc.assert(
      fc.property(finite, (value) => {
        expect(closeRel(cubicMetresToLitres(litresToCubicMetres(litres(value))), value)).toBe(true);
        expect(closeRel(gramsToKg(kgToGrams(kg(value))), value)).toBe(true);
        expect(closeRel(percentToFraction(fractionToPercent(fraction(value))), value)).toBe(true);
        expect(closeRel(fractionToPercent(percentToFraction(percent(value))), value)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });
});
