import { describe, it, expect } from "vitest";
import {
  dailySlurryLitresFromVolume,
  dilutionWaterPerKg,
  minimumRetentionDays,
  retentionDaysFromVolume,
  sizeDigesterForScraps,
  workingVolumeM3FromSlurry,
} from "../../shared/domain/sizing";
import { temperatureFactor } from "../../shared/domain/temperature";

describe("sizing", () => {
  it("when 60 L/day stay 80 days, then the working volume is 4.8 m³", () => {
    // DOMAIN.md §3 [read: Sasse 1988 Biogas Plants §4.2, V_D = S_d × RT, example 60 L/d × 80 d]
    expect(workingVolumeM3FromSlurry(60, 80)).toBeCloseTo(4.8, 12);
    expect(retentionDaysFromVolume(4.8, 60)).toBeCloseTo(80, 12);
  });

  it("when V is 2.0 m³ and HRTmin 40 d, then 50 L of slurry a day", () => {
    // DOMAIN.md §2 check [derived from Biogas Digest Vol. II p. 40]
    expect(dailySlurryLitresFromVolume(2.0, 40)).toBeCloseTo(50, 12);
  });

  it("when scraps at 25 % TS are diluted to 8 %, then 2.125 kg water per kg", () => {
    // DOMAIN.md §2 check [derived]: w = 25/8 − 1
    expect(dilutionWaterPerKg(25, 8)).toBeCloseTo(2.125, 12);
    expect(dilutionWaterPerKg(6, 8)).toBe(0);
  });

  it("when the digester is at 20 °C or warmer, then HRTmin is 40 d; colder or unknown, 100 d", () => {
    // DOMAIN.md §2 limit 7 [read: Biogas Digest Vol. II p. 40; Sasse 1988 §2]
    expect(minimumRetentionDays(20)).toBe(40);
    expect(minimumRetentionDays(19.9)).toBe(100);
    expect(minimumRetentionDays(null)).toBe(100);
  });

  it("when scraps are sized warm, then the larger of the retention-rule and organic-load volumes is chosen", () => {
    // [derived] 10 kg/d at 14 % TS → w = 0.75, slurry 17.5 L/d × 40 d = 0.7 m³;
    // organic check: 10 × 0.14 × 0.89 = 1.246 kg VS/d ÷ 1.5 = 0.83 m³ → organic governs here
    const wet = sizeDigesterForScraps({
      dailyScrapsKg: 10,
      scrapsTsPercent: 14,
      scrapsVsPercentOfTs: 89,
      temperatureC: 35,
    });
    expect(wet.dailySlurryLitres).toBeCloseTo(17.5, 12);
    expect(wet.dilutionWaterLitresPerDay).toBeCloseTo(7.5, 12);
    expect(wet.minimumRetentionDays).toBe(40);
    expect(wet.governedBy).toBe("organicLoad");
    expect(wet.workingVolumeM3).toBeCloseTo(1.246 / 1.5, 9);
    // at a low TS target the slurry is larger and the retention rule governs: 10 × (14/4) = 35 L/d × 40 = 1.4 m³
    const dilute = sizeDigesterForScraps({
      dailyScrapsKg: 10,
      scrapsTsPercent: 14,
      scrapsVsPercentOfTs: 89,
      targetTsPercent: 4,
      temperatureC: 35,
    });
    expect(dilute.governedBy).toBe("hydraulic");
    expect(dilute.workingVolumeM3).toBeCloseTo(1.4, 12);
    expect(dilute.retentionDays).toBe(40);
  });

  it("when the digester is cold, then the organic limit at f(T) sets a larger volume and a longer retention", () => {
    // DOMAIN.md §2 limits 1–2: OLRmax = 1.5 × f(T)
    const sized = sizeDigesterForScraps({ dailyScrapsKg: 10, temperatureC: 15 });
    const feedKgVs = 10 * 0.26 * 0.87;
    expect(sized.workingVolumeM3).toBeCloseTo(feedKgVs / (1.5 * temperatureFactor(15)), 9);
    expect(sized.retentionDays).toBeGreaterThan(100);
    expect(sized.organicLoadKgVsPerM3Day).toBeCloseTo(1.5 * temperatureFactor(15), 9);
  });

  it("when sized below 10 °C, then it refuses: no volume digests in that cold", () => {
    expect(() => sizeDigesterForScraps({ dailyScrapsKg: 10, temperatureC: 8 })).toThrow(RangeError);
  });
});
