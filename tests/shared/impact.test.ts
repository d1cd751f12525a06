import { describe, expect, it } from "vitest";
import { DEFAULT_IMPACT_FACTORS, fedScrapsImpact, impactMethodSentence } from "../../shared/domain/impact";

describe("fedScrapsImpact", () => {
  it("when 1 kg VS is fed, then methane is B0 = 0.40 m³ and biogas 0.40 ÷ 0.60 m³", () => {
    // B0 0.40 m³ CH4/kg VS: a judgement within 0.348–0.435 [read: Zhang et al. 2007, Bioresour. Technol. 98:929];
    // methane share 0.60 [read: FAO/CMS 1996, Biogas technology training manual, Table 1, 50–70 %].
    const out = fedScrapsImpact({ fedKgVs: 1, fedFreshKg: 0, waterLitres: 0 });
    expect(out.methaneM3).toBeCloseTo(0.4, 10);
    expect(out.biogasM3).toBeCloseTo(0.4 / 0.6, 10);
  });

  it("when the biogas is 0.35 m³, then it cooks 60 minutes at the 350 L/h burner", () => {
    // 350 L/h household burner [read: Tilley et al. 2014, Eawag Compendium, D.7: 200–450 L/h]; 350 L ÷ 350 L/h = 1 h.
    const kgVs = (0.35 * 0.6) / 0.4; // methane 0.21 m³ → biogas 0.35 m³
    expect(fedScrapsImpact({ fedKgVs: kgVs, fedFreshKg: 0, waterLitres: 0 }).cookingMinutes).toBeCloseTo(60, 10);
  });

  it("when 10 kg of scraps went in with 15 L of water, then 0.92 × 25 L = 23 L of digestate come out", () => {
    // Digestate ≈ 92 % of what is fed [read: NNFCC, anaerobic digestion factsheet]; fresh kg taken as litres.
    expect(fedScrapsImpact({ fedKgVs: 0, fedFreshKg: 10, waterLitres: 15 }).digestateLitres).toBeCloseTo(23, 10);
  });

  it("when nothing was fed, then every figure is 0", () => {
    expect(fedScrapsImpact({ fedKgVs: 0, fedFreshKg: 0, waterLitres: 0 })).toEqual({
      methaneM3: 0,
      biogasM3: 0,
      cookingMinutes: 0,
      digestateLitres: 0,
    });
  });

  it("when the method is written, then it names each default factor", () => {
    const sentence = impactMethodSentence();
    expect(sentence).toContain(`${DEFAULT_IMPACT_FACTORS.b0M3PerKgVs} m³ of methane per kg`);
    expect(sentence).toContain("60 % methane");
    expect(sentence).toContain("350 litres an hour");
    expect(sentence).toContain("92 % of the scraps");
  });
});
