import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  DEFAULT_KG_VS_PER_FRESH_KG,
  PASTEURISATION_NOTE,
  REFUSE_ITEMS,
  REFUSE_ITEM_INFO,
  SCRAP_CATEGORIES,
  SCRAP_CATEGORY_PROFILES,
  assessScraps,
  describeMix,
  estimateFreshKg,
  freshKgFromKgVs,
  kgVsFromFreshKg,
  kgVsFromMix,
  nitrogenKgFromMix,
} from "../../shared/domain/scraps";

describe("scrap composition", () => {
  it("when the default mix is used, then one fresh kg holds 0.2262 kg VS", () => {
    // DOMAIN.md §1: TS 26 %, VS 87 % of TS → 0.2262 kg VS/kg [read: Zhang et al. 2007, Bioresour. Technol. 98:929]
    expect(DEFAULT_KG_VS_PER_FRESH_KG).toBeCloseTo(0.2262, 6);
    expect(kgVsFromFreshKg(1)).toBeCloseTo(0.2262, 6);
    expect(kgVsFromMix(1, {})).toBeCloseTo(0.2262, 6);
  });

  it("when 2.0 kg VS is wanted from the default mix, then it takes 8.84 kg of scraps", () => {
    // DOMAIN.md §2 check: V 2.0 m³ × OLR 1.0 → 8.84 kg scraps/d [derived]
    expect(freshKgFromKgVs(2.0)).toBeCloseTo(8.84, 2);
  });

  it("when the categories' defaults are read, then they match DOMAIN.md §1", () => {
    // DOMAIN.md §1 table: TS/VS defaults [memory: Bouallagui et al. 2005; read: Zhang et al. 2007]
    expect(SCRAP_CATEGORY_PROFILES.fruitVeg.tsPercent).toBe(14);
    expect(SCRAP_CATEGORY_PROFILES.fruitVeg.vsPercentOfTs).toBe(89);
    expect(SCRAP_CATEGORY_PROFILES.cooked.tsPercent).toBe(27);
    expect(SCRAP_CATEGORY_PROFILES.cooked.vsPercentOfTs).toBe(90);
    expect(SCRAP_CATEGORY_PROFILES.breadGrains.tsPercent).toBe(55);
    expect(SCRAP_CATEGORY_PROFILES.breadGrains.vsPercentOfTs).toBe(96);
    expect(SCRAP_CATEGORY_PROFILES.coffee.tsPercent).toBe(40);
    expect(SCRAP_CATEGORY_PROFILES.coffee.vsPercentOfTs).toBe(98);
    expect(SCRAP_CATEGORY_PROFILES.mixed.nPercentOfTs).toBe(3.2);
    for (const id of SCRAP_CATEGORIES) {
      const p = SCRAP_CATEGORY_PROFILES[id];
      if (p.tsRangePercent) {
        expect(p.tsPercent).toBeGreaterThanOrEqual(p.tsRangePercent[0]);
        expect(p.tsPercent).toBeLessThanOrEqual(p.tsRangePercent[1]);
      }
      if (p.cToN !== null && p.cToNRange) {
        expect(p.cToN).toBeGreaterThanOrEqual(p.cToNRange[0]);
        expect(p.cToN).toBeLessThanOrEqual(p.cToNRange[1]);
      }
    }
  });

  it("when the default mix's C:N is derived from VS/1.8 and N 3.2 %, then it is about 15", () => {
    // (87 / 1.8) / 3.2 = 15.1 [derived: DOMAIN.md §1 figures; C = VS/1.8, memory: Haug 1993]
    expect(describeMix({}).cToN).toBeCloseTo(15.1, 1);
  });

  it("when half fruit and half bread by fresh mass, then TS and VS follow the mass balance", () => {
    // [derived] TS = 0.5×14 + 0.5×55 = 34.5 %; VS mass = 0.5×0.14×0.89 + 0.5×0.55×0.96 = 0.3263 kg/kg
    const mix = describeMix({ fruitVeg: 3, breadGrains: 3 });
    expect(mix.tsPercent).toBeCloseTo(34.5, 9);
    expect(mix.kgVsPerFreshKg).toBeCloseTo(0.3263, 9);
    expect(mix.vsPercentOfTs).toBeCloseTo((0.3263 / 0.345) * 100, 6);
    expect(kgVsFromMix(10, { fruitVeg: 1, breadGrains: 1 })).toBeCloseTo(3.263, 9);
  });

  // Zero or a real weight: subnormal weights would underflow to an all-zero (default) mix when scaled.
  const weight = fc.oneof(fc.constant(0), fc.double({ min: 0.001, max: 50, noNaN: true }));

  it("when a mix is given in kg or in shares, then only the proportions matter", () => {
    fc.assert(
      fc.property(
        fc.record({ fruitVeg: weight, cooked: weight, citrus: weight }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        (mix, scale) => {
          const a = describeMix(mix);
          const b = describeMix({
            fruitVeg: mix.fruitVeg * scale,
            cooked: mix.cooked * scale,
            citrus: mix.citrus * scale,
          });
          expect(b.kgVsPerFreshKg).toBeCloseTo(a.kgVsPerFreshKg, 9);
          const sum = SCRAP_CATEGORIES.reduce((s, id) => s + a.shares[id], 0);
          expect(sum).toBeCloseTo(1, 9);
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("when cooked food replaces fruit, then the mix's C:N falls and nitrogen rises", () => {
    // DOMAIN.md §1: cooked C:N 13–20 is below fruit & veg 20–35 [memory]
    const fruit = describeMix({ fruitVeg: 1 });
    const cooked = describeMix({ cooked: 1 });
    expect(cooked.cToN!).toBeLessThan(fruit.cToN!);
    expect(cooked.nPercentOfTs).toBeGreaterThan(fruit.nPercentOfTs);
    expect(nitrogenKgFromMix(100, {})).toBeCloseTo(100 * 0.26 * 0.032, 9);
  });

  it("when only eggshells are given, then the mix has no C:N", () => {
    expect(describeMix({ eggshells: 1 }).cToN).toBeNull();
  });
});

describe("bucket to mass", () => {
  it("when a 10 L bucket is not weighed, then it is estimated at 5 kg (0.5 kg/L default, judgement)", () => {
    // DOMAIN.md §1: 0.5 kg/L [judgement] within 0.235–0.90 kg/L (US EPA 2016 [2ary])
    const estimate = estimateFreshKg({ bucketLitres: 10 });
    expect(estimate.freshKg).toBeCloseTo(5, 12);
    expect(estimate.method).toBe("estimated");
    expect(estimate.kgPerLitre).toBe(0.5);
  });

  it("when a bucket was weighed, then the weight wins and is marked weighed", () => {
    const estimate = estimateFreshKg({ bucketLitres: 10, weighedKg: 6.3, kgPerLitre: 0.4 });
    expect(estimate).toEqual({ freshKg: 6.3, method: "weighed", kgPerLitre: null });
  });

  it("when a custom density is given, then it is used", () => {
    expect(estimateFreshKg({ bucketLitres: 12, kgPerLitre: 0.7 }).freshKg).toBeCloseTo(8.4, 9);
  });
});

describe("scrap flags", () => {
  it("when citrus is 11 % of a day's fresh mass, then it is flagged; at 10 % it is not", () => {
    // DOMAIN.md §1: citrus ≤ 10 % of a day's fresh mass [judgement; inhibition: Ruiz & Flotats 2014]
    expect(assessScraps({ mix: { citrus: 11, mixed: 89 } }).map((f) => f.code)).toContain("citrusOverLimit");
    expect(assessScraps({ mix: { citrus: 10, mixed: 90 } })).toEqual([]);
  });

  it("when bread is a large share, then a bread warning is raised", () => {
    const flags = assessScraps({ mix: { breadGrains: 30, fruitVeg: 70 } });
    expect(flags.map((f) => f.code)).toEqual(["breadOverLimit"]);
    expect(flags[0]!.severity).toBe("limit");
  });

  it("when eggshells are a large share, then they are flagged", () => {
    expect(assessScraps({ mix: { eggshells: 1, mixed: 9 } }).map((f) => f.code)).toEqual(["eggshellsOverLimit"]);
  });

  it("when refused items are seen, then each is flagged once with a plain label", () => {
    const flags = assessScraps({ mix: {}, refuseItems: ["glass", "glass", "medicines"] });
    expect(flags.map((f) => f.item)).toEqual(["glass", "medicines"]);
    expect(flags.every((f) => f.severity === "refuse")).toBe(true);
    expect(flags[0]!.message).toContain("Glass");
  });

  it("when meat arrives, then it is refused with the pasteurisation note unless the site pasteurises", () => {
    // DOMAIN.md §1: 70 °C, 60 min, ≤ 12 mm [read: Reg. (EU) 142/2011 Annex V Ch. I Sec. 1]
    const refused = assessScraps({ mix: {}, refuseItems: ["meat", "plastics"] });
    expect(refused.map((f) => f.item)).toEqual(["meat", "plastics"]);
    expect(refused[0]!.message).toContain(PASTEURISATION_NOTE);
    expect(PASTEURISATION_NOTE).toMatch(/70 °C.*60 minutes.*12 mm/);
    const pasteurising = assessScraps({ mix: {}, refuseItems: ["meat", "plastics"], sitePasteurises: true });
    expect(pasteurising.map((f) => f.item)).toEqual(["plastics"]);
  });

  it("when the refuse list is read, then it holds every item of DOMAIN.md §1", () => {
    expect([...REFUSE_ITEMS].sort()).toEqual([
      "bones",
      "dairy",
      "detergents",
      "disinfectants",
      "fish",
      "glass",
      "meat",
      "medicines",
      "metal",
      "oilsFats",
      "plastics",
    ]);
    expect(REFUSE_ITEM_INFO.plastics.label).toMatch(/compostable/i);
  });
});
