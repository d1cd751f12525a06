/**
 * The public calculator API (issue 4 part 3): every endpoint's contract with DOMAIN.md's check
 * values, 400s naming each bad field with its allowed range, no session or cookie, and the
 * per-IP rate limit.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type http from "node:http";
import request from "supertest";
import { createApp } from "../../server/app";
import { CALC_REQUESTS_PER_MINUTE } from "../../server/modules/calc/calc.routes";
import {
  FeedBudgetResponseSchema,
  FertiliserAllowanceResponseSchema,
  GasHolderResponseSchema,
  MethaneYieldResponseSchema,
  SizingFromScrapsResponseSchema,
  SizingFromSlurryResponseSchema,
  TitrationResponseSchema,
  WeightsForPressureResponseSchema,
} from "../../shared/schemas/calc";
import { ApiErrorSchema } from "../../shared/schemas/error";
import { sql } from "../helpers/db";

// One app for the contract tests; the rate-limit test builds its own so the counts start at 0.
const app = createApp({ requestLogging: false });
const post = (path: string, body: unknown) =>
  request(app)
    .post(`/api/calc/${path}`)
    .send(body as object);

/** A 400 in the app's error shape; returns its `fields`. */
function fieldsOf(res: request.Response): Record<string, string> {
  expect(res.status).toBe(400);
  const parsed = ApiErrorSchema.parse(res.body);
  expect(parsed.error.code).toBe("invalid_input");
  return parsed.error.fields ?? {};
}

describe("POST /api/calc/feed-budget", () => {
  it("when V is 2.0 m³ at OLR 1.0 with the default mix, then 2 kg VS = 8.84 kg of scraps are welcome and the organic load binds", async () => {
    // DOMAIN.md §2 check: V 2.0 m³, OLR 1.0 kg VS/m³/d, default mix → 8.84 kg scraps/d [derived]
    const res = await post("feed-budget", { workingVolumeM3: 2, temperatureC: 35, olrRefKgVsPerM3Day: 1.0, ph: 7.0 });
    expect(res.status).toBe(200);
    const body = FeedBudgetResponseSchema.parse(res.body);
    expect(body.budgetKgVs).toBeCloseTo(2.0, 9);
    expect(body.budgetKgScraps).toBeCloseTo(8.84, 2);
    expect(body.binding).toBe("organicLoad");
    expect(body.explanation).toMatch(/organic load limit/i);
    // Default mix TS 26 % to 8 % slurry: w = 26/8 − 1 = 2.25 kg water per kg (DOMAIN.md §2 limit 7 formula) [derived]
    expect(body.dilutionWaterLitresPerKg).toBeCloseTo(2.25, 9);
    // Hydraulic: 2.0 m³ / 40 d = 50 L slurry/d [derived from Biogas Digest Vol. II p. 40];
    // 50 L ÷ 3.25 L per kg scraps × 0.2262 kg VS/kg (Zhang et al. 2007 mix, DOMAIN.md §1) = 3.48 kg VS [derived]
    expect(body.limits.hydraulic).toBeCloseTo(3.48, 2);
    // No history given: limits 5 and 6 are not applied, and a warning says so (DOMAIN.md §2 limit 6).
    expect(body.limits.weekRamp).toBeNull();
    expect(body.limits.rollingWeek).toBeNull();
    expect(body.warnings.map((w) => w.code)).toContain("noHistory");
  });

  it("when the digester is at 20 °C, then the organic limit is 1.5 × f(20) × V with f(20) = 0.352", async () => {
    // DOMAIN.md §2: OLRref 1.5 [read: Werner, Stöhr & Hees 1989, GTZ/GATE §5.1 p. 42]; f(20) = 0.352 [derived]
    const res = await post("feed-budget", { workingVolumeM3: 2, temperatureC: 20, ph: 7.0 });
    expect(res.status).toBe(200);
    const body = FeedBudgetResponseSchema.parse(res.body);
    expect(body.limits.organicLoad).toBeCloseTo(1.5 * 0.352 * 2, 2);
    expect(body.binding).toBe("organicLoad");
  });

  it("when the temperature is null, then nothing is fed and the answer asks for a temperature", async () => {
    // DOMAIN.md §2 limit 2: with no reading, never assume warm.
    const res = await post("feed-budget", { workingVolumeM3: 2, temperatureC: null });
    expect(res.status).toBe(200);
    const body = FeedBudgetResponseSchema.parse(res.body);
    expect(body.budgetKgVs).toBe(0);
    expect(body.binding).toBe("temperatureUnknown");
    expect(body.warnings.map((w) => w.code)).toContain("temperatureUnknown");
  });

  it("when pH is below 6.5, then the acid check stops feeding", async () => {
    // DOMAIN.md §2 limit 3: pH < 6.5 → s = 0 [read: Gerardi 2003; bands judgement]
    const res = await post("feed-budget", { workingVolumeM3: 2, temperatureC: 35, ph: 6.4 });
    expect(res.status).toBe(200);
    const body = FeedBudgetResponseSchema.parse(res.body);
    expect(body.budgetKgVs).toBe(0);
    expect(body.binding).toBe("stability");
    expect(body.limits.stability).toBe(0);
  });
});

describe("POST /api/calc/gas-holder", () => {
  it("when 50 kg of drum and 20 kg of weights sit on a Ø 1.00 m drum, then 874 Pa = 8.74 mbar = 89.1 mm WC with the cautions", async () => {
    // DOMAIN.md §3 check: 70 kg on a Ø 1.00 m drum → 874 Pa = 8.74 mbar = 89.1 mm WC [derived]
    const res = await post("gas-holder", { drumDiameterM: 1.0, drumMassKg: 50, addedMassKg: 20 });
    expect(res.status).toBe(200);
    const body = GasHolderResponseSchema.parse(res.body);
    expect(body.pressurePa).toBeCloseTo(874, 0);
    expect(body.pressureMbar).toBeCloseTo(8.74, 2);
    expect(body.pressureMmWc).toBeCloseTo(89.1, 1);
    expect(body.storedLitres).toBeUndefined();
    expect(body.cookingMinutes).toBeUndefined();
    // DOMAIN.md §3 and §6: the bottoming-out caution beside pressure, the gas cautions, and the estimates statement.
    expect(body.cautions.join(" ")).toMatch(/bottom out/);
    expect(body.cautions.join(" ")).toMatch(/hydrogen sulphide/i);
    expect(body.cautions.join(" ")).toMatch(/licensed practitioners decide/);
  });

  it("when the drum has risen 0.20 m, then 157 L are stored, 26.9 minutes at the default 350 L/h burner", async () => {
    // Stored gas = A × rise = π/4 × 1.00² × 0.20 m³ = 157.08 L (DOMAIN.md §3) [derived];
    // 157.08 L ÷ 350 L/h × 60 = 26.93 min [derived; 350 L/h default, read: Tilley et al. 2014, Eawag Compendium D.7]
    const res = await post("gas-holder", { drumDiameterM: 1.0, drumMassKg: 70, drumRiseM: 0.2 });
    const body = GasHolderResponseSchema.parse(res.body);
    expect(body.storedLitres).toBeCloseTo(157.08, 2);
    expect(body.cookingMinutes).toBeCloseTo(26.93, 2);
  });

  it("when the burner flow is given, then the cooking minutes follow it", async () => {
    // 157.08 L ÷ 200 L/h × 60 = 47.12 min [derived]
    const res = await post("gas-holder", {
      drumDiameterM: 1.0,
      drumMassKg: 70,
      drumRiseM: 0.2,
      burnerLitresPerHour: 200,
    });
    expect(GasHolderResponseSchema.parse(res.body).cookingMinutes).toBeCloseTo(47.12, 2);
  });
});

describe("POST /api/calc/weights-for-pressure", () => {
  it("when 874 Pa is wanted under a 50 kg Ø 1.00 m drum, then about 20 kg must be added", async () => {
    // Inverse of the DOMAIN.md §3 check: 874 Pa × 0.7854 m² ÷ 9.80665 = 70.0 kg in all, 50 kg of it the drum [derived]
    const res = await post("weights-for-pressure", { drumDiameterM: 1.0, drumMassKg: 50, targetPressurePa: 874 });
    expect(res.status).toBe(200);
    const body = WeightsForPressureResponseSchema.parse(res.body);
    expect(body.addedMassKg).toBeCloseTo(20, 1);
    expect(body.cautions.join(" ")).toMatch(/bottom out/);
  });

  it("when the drum alone gives more than the target, then 0 kg and a note first", async () => {
    // 100 kg on Ø 1.00 m → 1,249 Pa > 500 Pa [derived from the DOMAIN.md §3 formula]
    const res = await post("weights-for-pressure", { drumDiameterM: 1.0, drumMassKg: 100, targetPressurePa: 500 });
    const body = WeightsForPressureResponseSchema.parse(res.body);
    expect(body.addedMassKg).toBe(0);
    expect(body.cautions[0]).toMatch(/drum alone already gives 1249 Pa/);
  });
});

describe("POST /api/calc/sizing", () => {
  it("when 60 L of slurry a day stay 80 days, then the working volume is 4.8 m³ and nothing else comes back", async () => {
    // Sasse 1988 *Biogas Plants* §4.2 [read]: V_D = S_d × RT, 60 L/d × 80 d = 4.8 m³
    const res = await post("sizing", { dailySlurryLitres: 60, retentionDays: 80 });
    expect(res.status).toBe(200);
    expect(SizingFromSlurryResponseSchema.strict().parse(res.body).workingVolumeM3).toBeCloseTo(4.8, 9);
  });

  it("when 10 kg of scraps at 25 % TS go to a 30 °C digester, then the organic load sets 1.45 m³ at 46.4 days", async () => {
    // DOMAIN.md §2 check: 25 % → 8 % TS takes 2.125 kg water per kg [derived] → 21.25 L water, 31.25 L slurry a day.
    // Hydraulic: 31.25 L × 40 d = 1.25 m³ [Biogas Digest Vol. II p. 40, read]; organic: 10 kg × 0.25 × 0.87 VS/TS
    // = 2.175 kg VS ÷ 1.5 kg VS/m³/d [Werner et al. 1989, read] = 1.45 m³, the larger; 1,450 L ÷ 31.25 L/d = 46.4 d [derived]
    const res = await post("sizing", { dailyScrapsKg: 10, scrapsTsPercent: 25, temperatureC: 30 });
    expect(res.status).toBe(200);
    const body = SizingFromScrapsResponseSchema.parse(res.body);
    expect(body.dilutionWaterLitresPerDay).toBeCloseTo(21.25, 9);
    expect(body.dailySlurryLitres).toBeCloseTo(31.25, 9);
    expect(body.workingVolumeM3).toBeCloseTo(1.45, 9);
    expect(body.retentionDays).toBeCloseTo(46.4, 9);
  });

  it("when only half a shape is sent, then the missing field is named with its range", async () => {
    const fields = fieldsOf(await post("sizing", { dailySlurryLitres: 60 }));
    expect(fields).toEqual({ retentionDays: "Retention time must be a number from 5 to 400 days." });
  });

  it("when both shapes are mixed or the body is empty, then the answer says to give one shape", async () => {
    for (const body of [{ dailySlurryLitres: 60, dailyScrapsKg: 5 }, {}]) {
      const fields = fieldsOf(await post("sizing", body));
      expect(fields.body).toMatch(/Give either dailySlurryLitres and retentionDays, or dailyScrapsKg and temperatureC/);
    }
  });

  it("when the sizing temperature is below 10 °C, then it is refused because digestion stops", async () => {
    const fields = fieldsOf(await post("sizing", { dailyScrapsKg: 10, temperatureC: 5 }));
    expect(fields.temperatureC).toMatch(/from 10 to 90 °C \(below 10 °C digestion stops\)/);
  });
});

describe("POST /api/calc/methane-yield", () => {
  it("when B0 0.45, S0 40, θ 40 d at 30 °C, then μm 0.261, K ≈ 0.758 and γ ≈ 0.4165", async () => {
    // DOMAIN.md §3 check [derived from Chen & Hashimoto 1978; μm fit Hashimoto, Chen & Varel 1981; K Hashimoto 1984, memory]
    const res = await post("methane-yield", {
      b0M3PerKgVs: 0.45,
      s0KgVsPerM3: 40,
      retentionDays: 40,
      temperatureC: 30,
    });
    expect(res.status).toBe(200);
    const body = MethaneYieldResponseSchema.parse(res.body);
    expect(body.muMaxPerDay).toBeCloseTo(0.261, 6);
    expect(body.k).toBeCloseTo(0.758, 3);
    expect(body.methaneM3PerM3Day).toBeCloseTo(0.4165, 4);
    expect(body.washout).toBe(false);
  });

  it("when θ·μm ≤ 1, then the microbes wash out and γ is 0", async () => {
    // 3 d × 0.261 d⁻¹ = 0.78 ≤ 1 → washout (DOMAIN.md §3) [derived]
    const res = await post("methane-yield", { b0M3PerKgVs: 0.45, s0KgVsPerM3: 40, retentionDays: 3, temperatureC: 30 });
    const body = MethaneYieldResponseSchema.parse(res.body);
    expect(body.washout).toBe(true);
    expect(body.methaneM3PerM3Day).toBe(0);
  });
});

describe("POST /api/calc/titration", () => {
  it("when A is 8.97 mL and B 0.84 mL, then FOS ≈ 622, TAC ≈ 2,245 and the ratio 0.28 with advice", async () => {
    // DOMAIN.md §5 check [read: ManTech Method Abstract #127]; TAC = 8.97 × 250 = 2,242.5, within 0.2 % of the quoted 2,245
    const res = await post("titration", { aMl: 8.97, bMl: 0.84 });
    expect(res.status).toBe(200);
    const body = TitrationResponseSchema.parse(res.body);
    expect(body.fosMgPerL).toBeCloseTo(622, 0);
    expect(Math.abs(body.tacMgPerL - 2245) / 2245).toBeLessThan(0.002);
    expect(body.ratio).toBeCloseTo(0.28, 2);
    expect(body.advice).toMatch(/0\.28/);
  });
});

describe("POST /api/calc/fertiliser-allowance", () => {
  it("when 10 m² get digestate of 5 g N/L, then 34 L a year with dilution advice and the digestate cautions", async () => {
    // DOMAIN.md §4 check: 170 kg N/ha/yr = 17 g N/m²/yr [read: Council Directive 91/676/EEC, Annex III(2)];
    // 10 m² × 17 ÷ 5 = 34 L/yr [derived]
    const res = await post("fertiliser-allowance", { bedAreaM2: 10, nitrogenGPerL: 5 });
    expect(res.status).toBe(200);
    const body = FertiliserAllowanceResponseSchema.parse(res.body);
    expect(body.litresPerYear).toBeCloseTo(34, 9);
    expect(body.dilution).toMatch(/1:1/);
    expect(body.cautions.join(" ")).toMatch(/not sanitised/);
  });

  it("when a stricter limit is given, then the allowance follows it", async () => {
    // 10 m² × (85 kg/ha ÷ 10 = 8.5 g/m²) ÷ 5 g N/L = 17 L/yr [derived]
    const res = await post("fertiliser-allowance", { bedAreaM2: 10, nitrogenGPerL: 5, limitKgNPerHaYear: 85 });
    expect(FertiliserAllowanceResponseSchema.parse(res.body).litresPerYear).toBeCloseTo(17, 9);
  });
});

describe("bad input on every calculator", () => {
  // One valid body per endpoint; each case below breaks it in one or more ways.
  const valid: Record<string, Record<string, unknown>> = {
    "feed-budget": { workingVolumeM3: 2, temperatureC: 25 },
    "gas-holder": { drumDiameterM: 1, drumMassKg: 70 },
    "weights-for-pressure": { drumDiameterM: 1, drumMassKg: 50, targetPressurePa: 900 },
    sizing: { dailyScrapsKg: 10, temperatureC: 30 },
    "methane-yield": { b0M3PerKgVs: 0.4, s0KgVsPerM3: 40, retentionDays: 40, temperatureC: 30 },
    titration: { aMl: 9, bMl: 0.8 },
    "fertiliser-allowance": { bedAreaM2: 10, nitrogenGPerL: 5 },
  };

  it("when each valid body is sent, then it is accepted (so the cases below fail only for what they break)", async () => {
    for (const [path, body] of Object.entries(valid)) {
      expect((await post(path, body)).status, path).toBe(200);
    }
  });

  it("when a volume or size is negative, then that field is named with its allowed range", async () => {
    const cases: [string, string, RegExp][] = [
      ["feed-budget", "workingVolumeM3", /Working volume must be a number from 0\.05 to 100 m³/],
      ["gas-holder", "drumDiameterM", /Drum diameter must be a number from 0\.2 to 5 m/],
      ["weights-for-pressure", "drumMassKg", /Drum mass must be a number from 0\.5 to 5000 kg/],
      ["sizing", "dailyScrapsKg", /Daily scraps must be a number from 0\.1 to 2000 kg/],
      ["methane-yield", "retentionDays", /Retention time must be a number from 1 to 400 days/],
      ["titration", "aMl", /from 0\.1 to 100 mL/],
      ["fertiliser-allowance", "bedAreaM2", /Bed area must be a number from 0\.1 to 100000 m²/],
    ];
    for (const [path, field, message] of cases) {
      const fields = fieldsOf(await post(path, { ...valid[path], [field]: -1 }));
      expect(Object.keys(fields), path).toEqual([field]);
      expect(fields[field], path).toMatch(message);
    }
  });

  it("when a temperature is 200 °C, then it is refused with the allowed range", async () => {
    const cases: [string, RegExp][] = [
      ["feed-budget", /from -30 to 90 °C/],
      ["sizing", /from 10 to 90 °C/],
      ["methane-yield", /from -30 to 60 °C/],
    ];
    for (const [path, message] of cases) {
      const fields = fieldsOf(await post(path, { ...valid[path], temperatureC: 200 }));
      expect(fields.temperatureC, path).toMatch(message);
    }
  });

  it('when numbers come as "NaN" strings, then every such field is named', async () => {
    const fields = fieldsOf(await post("gas-holder", { drumDiameterM: "NaN", drumMassKg: "70", addedMassKg: "NaN" }));
    expect(Object.keys(fields).sort()).toEqual(["addedMassKg", "drumDiameterM", "drumMassKg"]);
    expect(fields.drumDiameterM).toMatch(/from 0\.2 to 5 m/);
    expect(fields.addedMassKg).toMatch(/from 0 to 5000 kg/);
    const titration = fieldsOf(await post("titration", { aMl: "NaN", bMl: "0.8" }));
    expect(Object.keys(titration).sort()).toEqual(["aMl", "bMl"]);
  });

  it("when required fields are missing, then each is named with its range", async () => {
    const fields = fieldsOf(await post("methane-yield", {}));
    expect(Object.keys(fields).sort()).toEqual(["b0M3PerKgVs", "retentionDays", "s0KgVsPerM3", "temperatureC"]);
    expect(fields.b0M3PerKgVs).toMatch(/from 0\.05 to 1 m³ CH4\/kg VS/);
    const feed = fieldsOf(await post("feed-budget", { workingVolumeM3: 2 }));
    // Missing is not unknown: the temperature must be sent, as null when there is no reading.
    expect(feed).toEqual({ temperatureC: expect.stringMatching(/or null when unknown/) });
  });

  it("when unknown keys are sent, then each is named as not allowed", async () => {
    for (const [path, body] of Object.entries(valid)) {
      const fields = fieldsOf(await post(path, { ...body, isAdmin: true, volumeLitres: 5 }));
      expect(fields, path).toEqual({ isAdmin: "is not an allowed field", volumeLitres: "is not an allowed field" });
    }
  });

  it("when several fields are wrong at once, then all of them are named in one answer", async () => {
    const res = await post("feed-budget", {
      workingVolumeM3: -2,
      temperatureC: 200,
      ph: "NaN",
      fedKgVsPrevious7Days: [1, -1],
      colour: "red",
    });
    const fields = fieldsOf(res);
    expect(Object.keys(fields).sort()).toEqual([
      "colour",
      "fedKgVsPrevious7Days.1",
      "ph",
      "temperatureC",
      "workingVolumeM3",
    ]);
    expect(res.body.error.message).toMatch(/workingVolumeM3/);
  });

  it("when the body is not JSON, then it is a 400 in the error shape", async () => {
    const res = await request(app).post("/api/calc/titration").set("Content-Type", "application/json").send("{aMl: 9");
    expect(res.status).toBe(400);
    expect(ApiErrorSchema.parse(res.body).error.code).toBe("malformed_json");
  });
});

describe("no sign-in, no session, no CSRF token", () => {
  it("when a visitor without a cookie or token calls any calculator, then it answers and sets no cookie nor session row", async () => {
    const sessionCount = async () => (await sql<{ count: string }>(`SELECT count(*) FROM sessions`))[0]?.count;
    const before = await sessionCount();
    for (const path of ["titration", "gas-holder"]) {
      const res = await post(path, path === "titration" ? { aMl: 9, bMl: 0.8 } : { drumDiameterM: 1, drumMassKg: 70 });
      expect(res.status).toBe(200);
      expect(res.headers["set-cookie"]).toBeUndefined();
      expect(res.headers["cache-control"]).toBe("no-store");
    }
    expect(before).toBeDefined();
    expect(await sessionCount()).toBe(before);
  });

  it("when a calculator is asked with GET, then it is a 404 (only POST exists)", async () => {
    const res = await request(app).get("/api/calc/titration");
    expect(res.status).toBe(404);
  });
});

describe("rate limit per IP", () => {
  const limited = createApp({ requestLogging: false });
  let server: http.Server;

  beforeAll(async () => {
    server = await new Promise((resolve) => {
      const s = limited.listen(0, "127.0.0.1", () => resolve(s));
    });
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
  });

  it(`when one address sends more than ${CALC_REQUESTS_PER_MINUTE} calculations in a minute, then the next gets 429 with Retry-After`, async () => {
    // The contract asks for at least 120 a minute.
    expect(CALC_REQUESTS_PER_MINUTE).toBeGreaterThanOrEqual(120);
    const agent = request.agent(server);
    const statuses: number[] = [];
    // Sequential in small batches: the counts are exact and the machine is not flooded.
    for (let i = 0; i < CALC_REQUESTS_PER_MINUTE; i += 25) {
      const batch = Array.from({ length: Math.min(25, CALC_REQUESTS_PER_MINUTE - i) }, () =>
        agent.post("/api/calc/titration").send({ aMl: 9, bMl: 0.8 }),
      );
      statuses.push(...(await Promise.all(batch)).map((res) => res.status));
    }
    expect(statuses.filter((status) => status === 200)).toHaveLength(CALC_REQUESTS_PER_MINUTE);

    const res = await agent.post("/api/calc/sizing").send({ dailySlurryLitres: 60, retentionDays: 80 });
    expect(res.status).toBe(429);
    expect(ApiErrorSchema.parse(res.body).error.code).toBe("rate_limited");
    const retryAfter = Number(res.headers["retry-after"]);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(60);

    // The limit is for the calculators only: the rest of the API still answers.
    expect((await agent.get("/api/health")).status).not.toBe(429);
  });
});
