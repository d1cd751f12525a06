import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  DEFAULT_B0_M3_PER_KG_VS,
  ESTIMATES_STATEMENT,
  GAS_CAUTIONS,
  PRESSURE_CAUTIONS,
  addedMassForPressure,
  biogasEnergyMj,
  chenHashimotoMethane,
  cookingMinutes,
  expectedDailyGas,
  floatingDrumPressure,
  gasHolderFillHours,
  kineticParameterK,
  muMaxPerDay,
  storedLitresFromDrumRise,
} from "../../shared/domain/gas";
import { temperatureFactor } from "../../shared/domain/temperature";

describe("Chen–Hashimoto methane model", () => {
  it("when B0 0.45, S0 40, θ 40 d at 30 °C, then μm 0.261, K ≈ 0.758 and γ ≈ 0.4165", () => {
    // DOMAIN.md §3 check [derived]: Chen & Hashimoto 1978, Biotechnol. Bioeng. Symp. 8:269; μm(T) Hashimoto, Chen & Varel 1981;
    // K swine-manure form, Hashimoto 1984, Agric. Wastes 9:299 [memory for the constants]
    expect(muMaxPerDay(30)).toBeCloseTo(0.261, 6);
    expect(kineticParameterK(40)).toBeCloseTo(0.758, 3);
    const result = chenHashimotoMethane({ b0M3PerKgVs: 0.45, s0KgVsPerM3: 40, retentionDays: 40, temperatureC: 30 });
    expect(result.muMaxPerDay).toBeCloseTo(0.261, 6);
    expect(result.k).toBeCloseTo(0.758, 3);
    expect(result.methaneM3PerM3Day).toBeCloseTo(0.4165, 4);
    expect(result.washout).toBe(false);
  });

  it("when θ·μm ≤ 1, then the microbes wash out and γ is 0", () => {
    // DOMAIN.md §3: washout when θ·μm ≤ 1 (Chen & Hashimoto 1978); 3 d × 0.261 = 0.78
    const washed = chenHashimotoMethane({ b0M3PerKgVs: 0.4, s0KgVsPerM3: 40, retentionDays: 3, temperatureC: 30 });
    expect(washed).toMatchObject({ methaneM3PerM3Day: 0, washout: true });
    expect(
      chenHashimotoMethane({ b0M3PerKgVs: 0.4, s0KgVsPerM3: 40, retentionDays: 5, temperatureC: 30 }).washout,
    ).toBe(false);
  });

  it("when the digester is below 20 °C, then the 20 °C result is scaled by f(T)/f(20)", () => {
    // DOMAIN.md §3: below 20 °C scale the 20 °C result by f(T)/f(20)
    const at = (temperatureC: number) =>
      chenHashimotoMethane({ b0M3PerKgVs: 0.4, s0KgVsPerM3: 50, retentionDays: 100, temperatureC }).methaneM3PerM3Day;
    expect(at(15)).toBeCloseTo((at(20) * temperatureFactor(15)) / temperatureFactor(20), 12);
    expect(at(9)).toBe(0);
  });

  it("when μm is asked outside 20–60 °C, then the fitted range's end is used", () => {
    expect(muMaxPerDay(10)).toBeCloseTo(muMaxPerDay(20), 12);
    expect(muMaxPerDay(70)).toBeCloseTo(0.013 * 60 - 0.129, 12);
  });

  it("when any loading is fed, then daily methane never exceeds B0 × loading (1000 runs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 200, noNaN: true }),
        fc.double({ min: -30, max: 90, noNaN: true }),
        (workingVolumeM3, loadingKgVsPerDay, temperatureC) => {
          const gas = expectedDailyGas({ workingVolumeM3, loadingKgVsPerDay, temperatureC });
          expect(gas.methaneM3PerDay).toBeGreaterThanOrEqual(0);
          expect(gas.methaneM3PerDay).toBeLessThanOrEqual(DEFAULT_B0_M3_PER_KG_VS * loadingKgVsPerDay + 1e-12);
        },
      ),
      { numRuns: 1000 },
    );
  });
});

describe("expected daily gas", () => {
  it("when 1 kg VS/day of the default mix at 8 % TS goes into 2 m³, then θ and S0 follow from the slurry", () => {
    // [derived] slurry = 1 / 0.2262 × (1 + 26/8 − 1) = 14.37 L/d; S0 = 8 % TS × 87 % VS = 69.6 kg VS/m³; θ = 2000 / 14.37 d
    const gas = expectedDailyGas({ workingVolumeM3: 2, loadingKgVsPerDay: 1, temperatureC: 35 });
    expect(gas.s0KgVsPerM3).toBeCloseTo(69.6, 9);
    expect(gas.retentionDays).toBeCloseTo(2000 / ((1 / 0.2262) * 3.25), 6);
    const model = chenHashimotoMethane({
      b0M3PerKgVs: 0.4,
      s0KgVsPerM3: 69.6,
      retentionDays: gas.retentionDays!,
      temperatureC: 35,
    });
    expect(gas.methaneM3PerDay).toBeCloseTo(model.methaneM3PerM3Day * 2, 12);
    expect(gas.biogasM3PerDay).toBeCloseTo(gas.methaneM3PerDay / 0.6, 12);
    expect(gas.biogasLitresPerDay).toBeCloseTo(gas.biogasM3PerDay * 1000, 9);
  });

  it("when the daily slurry is given, then it sets θ and S0", () => {
    const gas = expectedDailyGas({ workingVolumeM3: 2, loadingKgVsPerDay: 2, temperatureC: 30, dailySlurryLitres: 50 });
    expect(gas.retentionDays).toBeCloseTo(40, 12);
    expect(gas.s0KgVsPerM3).toBeCloseTo(40, 12);
  });

  it("when nothing is fed, then no gas is expected and θ is unknown", () => {
    expect(expectedDailyGas({ workingVolumeM3: 2, loadingKgVsPerDay: 0, temperatureC: 30 })).toMatchObject({
      methaneM3PerDay: 0,
      retentionDays: null,
    });
  });
});

describe("gas holder and burner", () => {
  it("when 70 kg sits on a Ø 1.00 m drum, then the pressure is 874 Pa = 8.74 mbar = 89.1 mm WC", () => {
    // DOMAIN.md §3 check [derived]: p = m·g/A, g = 9.80665, A = π·D²/4
    const p = floatingDrumPressure({ drumDiameterM: 1.0, drumMassKg: 50, addedMassKg: 20 });
    expect(p.pressurePa).toBeCloseTo(874, 0);
    expect(p.pressureMbar).toBeCloseTo(8.74, 2);
    expect(p.pressureMmWc).toBeCloseTo(89.1, 1);
  });

  it("when a target pressure is asked, then the added mass brings the drum to it", () => {
    const added = addedMassForPressure({ drumDiameterM: 1.0, drumMassKg: 30, targetPressurePa: 874.05 });
    expect(added.addedMassKg).toBeCloseTo(40, 2);
    expect(added.drumAloneExceeds).toBe(false);
    expect(added.note).toBeNull();
  });

  it("when the drum alone exceeds the target, then no weights are added and a note says why", () => {
    const added = addedMassForPressure({ drumDiameterM: 1.0, drumMassKg: 100, targetPressurePa: 500 });
    expect(added.addedMassKg).toBe(0);
    expect(added.drumAloneExceeds).toBe(true);
    expect(added.note).toMatch(/no weights are needed/);
  });

  it("when any drum and target are given, then pressure and added mass round-trip (1000 runs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.2, max: 5, noNaN: true }),
        fc.double({ min: 1, max: 500, noNaN: true }),
        fc.double({ min: 10, max: 10_000, noNaN: true }),
        (drumDiameterM, drumMassKg, targetPressurePa) => {
          const added = addedMassForPressure({ drumDiameterM, drumMassKg, targetPressurePa });
          const p = floatingDrumPressure({ drumDiameterM, drumMassKg, addedMassKg: added.addedMassKg });
          expect(p.pressurePa).toBeCloseTo(Math.max(targetPressurePa, added.drumAlonePressurePa), 6);
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("when a Ø 1.00 m drum rises 0.10 m, then it holds 78.5 L", () => {
    // [derived] A × rise = 0.7854 m² × 0.10 m
    expect(storedLitresFromDrumRise(1.0, 0.1)).toBeCloseTo(78.54, 2);
  });

  it("when 350 L are stored, then a 350 L/h burner cooks for 60 minutes", () => {
    // DOMAIN.md §3: minutes = stored L / flow × 60; default 350 L/h [read: Tilley et al. 2014, Eawag Compendium D.7]
    expect(cookingMinutes(350)).toBeCloseTo(60, 12);
    expect(cookingMinutes(100, 400)).toBeCloseTo(15, 12);
  });

  it("when 1 m³ of 60 % biogas burns, then it gives about 21.5 MJ", () => {
    // DOMAIN.md §3: CH4 LHV 35.8 MJ/Nm³ [memory, ISO 6976] → 60 % biogas ≈ 21.5 MJ/m³
    expect(biogasEnergyMj(1)).toBeCloseTo(21.5, 1);
  });

  it("when a 500 L holder fills at 1000 L/day, then it takes 12 hours; with no gas it never fills", () => {
    expect(gasHolderFillHours({ holderLitres: 500, biogasLitresPerDay: 1000 })).toBeCloseTo(12, 12);
    expect(gasHolderFillHours({ holderLitres: 500, biogasLitresPerDay: 1000, storedLitres: 250 })).toBeCloseTo(6, 12);
    expect(gasHolderFillHours({ holderLitres: 500, biogasLitresPerDay: 0 })).toBeNull();
  });

  it("when cautions are shown, then they cover flames, H2S, entering tanks, flame trap, the drum bottoming out and local rules", () => {
    // DOMAIN.md §6 [2ary: 5–15 %; read: OMAFRA factsheet Table 1, ~100 ppm, OSHA ceiling 20 ppm]
    const gas = GAS_CAUTIONS.join(" ");
    expect(gas).toMatch(/5–15 %/);
    expect(gas).toMatch(/hydrogen sulphide/i);
    expect(gas).toMatch(/100 ppm/);
    expect(gas).toMatch(/20 ppm/);
    expect(gas).toMatch(/never enter a tank/i);
    expect(gas).toMatch(/flame trap/i);
    expect(PRESSURE_CAUTIONS.join(" ")).toMatch(/never let the drum bottom out/i);
    expect(ESTIMATES_STATEMENT).toMatch(/estimates/i);
    expect(ESTIMATES_STATEMENT).toMatch(/licensed practitioners decide/);
  });
});
