import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { latestReadingWithin, pickDigesterTemperature, temperatureFactor } from "../../shared/domain/temperature";

describe("temperature factor f(T)", () => {
  it("when T is 20, 10 and 30 °C, then f is 0.352, 0.124 and 1", () => {
    // DOMAIN.md §2 check values [derived from f(T) = 1.11^(T−30); memory: Henze & Harremoës 1983, Water Sci. Technol. 15:1]
    expect(temperatureFactor(20)).toBeCloseTo(0.352, 3);
    expect(temperatureFactor(10)).toBeCloseTo(0.124, 3);
    expect(temperatureFactor(30)).toBe(1);
  });

  it("when T is 9.9 °C, then f is 0 (too cold to digest)", () => {
    // DOMAIN.md §2 check value: f(9.9) = 0
    expect(temperatureFactor(9.9)).toBe(0);
  });

  it("when T is above 30 °C, then f stays 1; when T is not a number, then f is 0", () => {
    expect(temperatureFactor(38)).toBe(1);
    expect(temperatureFactor(Number.NaN)).toBe(0);
  });

  it("when T rises, then f never falls (1000 runs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -30, max: 90, noNaN: true }),
        fc.double({ min: 0, max: 60, noNaN: true }),
        (t, rise) => {
          expect(temperatureFactor(t + rise)).toBeGreaterThanOrEqual(temperatureFactor(t));
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe("which temperature to budget with", () => {
  const now = new Date("2025-01-10T12:00:00Z");
  const hoursAgo = (h: number) => new Date(now.getTime() - h * 3_600_000);

  it("when there is a reading within 48 h, then the latest one is used even if warmer", () => {
    const picked = pickDigesterTemperature(
      [
        { at: hoursAgo(40), value: 15 },
        { at: hoursAgo(2), value: 22 },
        { at: hoursAgo(30), value: 12 },
      ],
      now,
    );
    expect(picked).toEqual({ temperatureC: 22, basis: "latestWithin48h", readingAt: hoursAgo(2) });
  });

  it("when the newest reading is 2–3 days old, then the coldest of the last 3 days is used", () => {
    const picked = pickDigesterTemperature(
      [
        { at: hoursAgo(50).toISOString(), value: 18 },
        { at: hoursAgo(70).getTime(), value: 14 },
        { at: hoursAgo(100), value: 5 },
      ],
      now,
    );
    expect(picked.temperatureC).toBe(14);
    expect(picked.basis).toBe("coldestOfLast3Days");
  });

  it("when no reading is from the last 3 days, then the temperature is unknown", () => {
    expect(pickDigesterTemperature([{ at: hoursAgo(80), value: 30 }], now)).toEqual({
      temperatureC: null,
      basis: "none",
      readingAt: null,
    });
  });

  it("when a reading is timestamped in the future, then it is ignored", () => {
    const picked = pickDigesterTemperature(
      [
        { at: hoursAgo(-5), value: 35 },
        { at: hoursAgo(10), value: 19 },
      ],
      now,
    );
    expect(picked.temperatureC).toBe(19);
  });

  it("when the latest pH within 7 days is asked for, then older readings are skipped", () => {
    expect(latestReadingWithin([{ at: hoursAgo(200), value: 6.1 }], now, 168)).toBeNull();
    expect(
      latestReadingWithin(
        [
          { at: hoursAgo(100), value: 7.0 },
          { at: hoursAgo(20), value: 6.9 },
        ],
        now,
        168,
      )?.value,
    ).toBe(6.9);
  });
});
