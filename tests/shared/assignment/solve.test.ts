import { describe, it, expect, beforeAll } from "vitest";
import fc from "fast-check";
import {
  type AssignmentDigester,
  type AssignmentHousehold,
  type AssignmentInput,
  type AssignmentModel,
  type LpSolver,
  auditAssignment,
  buildAssignmentLp,
  lagrangianBound,
  nearestWithRoomBaseline,
  prepareAssignmentModel,
  readAssignmentSolution,
  solveAssignment,
  unplacedPenaltyM,
} from "../../../shared/domain/assignment";
import { destinationPoint } from "../../../shared/domain/geo";

let solver: LpSolver;
beforeAll(async () => {
  const highs = await (await import("highs")).default();
  solver = (lp, options) => highs.solve(lp, options);
});

// Everything sits on one meridian, so distances along it are exactly the metres given (haversine along a meridian = R·Δφ).
const origin = { lat: 52.09, lng: 5.12 };
const onLine = (m: number) => destinationPoint(origin, m >= 0 ? 0 : 180, Math.abs(m));
const household = (id: string, atM: number, weeklyKg: number, pinnedDigesterId?: string): AssignmentHousehold => ({
  id,
  ...onLine(atM),
  weeklyKg,
  pinnedDigesterId,
});
const digester = (id: string, atM: number, weeklyRoomKg: number, available = true): AssignmentDigester => ({
  id,
  ...onLine(atM),
  weeklyRoomKg,
  available,
});
const digesterOf = (r: { assignments: readonly { householdId: string; digesterId: string }[] }, h: string) =>
  r.assignments.find((a) => a.householdId === h)?.digesterId;

/*
 * Hand-solved instance. D1 at 0 m takes one 2 kg household, D2 at 1000 m takes all.
 * H1 at 300 m (D1 300, D2 700), H2 at −200 m (D1 200, D2 1200), H3 at 900 m (D1 900, D2 100).
 * Who gets D1: H1 → 300+1200+100 = 1600; H2 → 200+700+100 = 1000; H3 → 900+700+1200 = 2800;
 * nobody → 700+1200+100 = 2000. Optimum 1000 m with H2 at D1 [derived by enumeration].
 * The nearest-with-room rule in order H1, H2, H3 takes D1 for H1 and ends at 1600 m.
 */
const threeByTwo: AssignmentInput = {
  households: [household("H1", 300, 2), household("H2", -200, 2), household("H3", 900, 2)],
  digesters: [digester("D1", 0, 2), digester("D2", 1000, 10)],
};

describe("assignment: hand-solved instances", () => {
  it("when greedy takes the shared digester first, then the exact plan is 1000 m and the baseline 1600 m", () => {
    const result = solveAssignment(threeByTwo, solver);
    expect(result.method).toBe("exactMip");
    expect(result.provenOptimal).toBe(true);
    expect(digesterOf(result, "H1")).toBe("D2");
    expect(digesterOf(result, "H2")).toBe("D1");
    expect(digesterOf(result, "H3")).toBe("D2");
    expect(result.totalDistanceM).toBeCloseTo(1000, 2);
    expect(result.unplaced).toEqual([]);
    const baseline = nearestWithRoomBaseline(threeByTwo);
    expect(digesterOf(baseline, "H1")).toBe("D1");
    expect(baseline.totalDistanceM).toBeCloseTo(1600, 2);
  });

  it("when the capacity binds, then loads, rooms and utilisation are reported per digester", () => {
    const result = solveAssignment(threeByTwo, solver);
    const d1 = result.digesterLoads.find((d) => d.digesterId === "D1")!;
    const d2 = result.digesterLoads.find((d) => d.digesterId === "D2")!;
    expect(d1).toMatchObject({ loadKg: 2, roomKg: 2, utilisation: 1, householdCount: 1 });
    expect(d2).toMatchObject({ loadKg: 4, roomKg: 10, householdCount: 2 });
    expect(d2.utilisation).toBeCloseTo(0.4, 12);
    expect(auditAssignment(threeByTwo, result).overloadedDigesterIds).toEqual([]);
  });

  it("when the LP text of the hand-solved instance is solved by HiGHS, then the MIP optimum is 10 000 dm and the relaxation no more", () => {
    const { model } = prepareAssignmentModel(threeByTwo);
    const mipText = buildAssignmentLp(model, true);
    expect(mipText).toMatch(/^Binary$/m);
    expect(buildAssignmentLp(model, false)).not.toMatch(/^Binary$/m);
    const mip = solver(mipText, { output_flag: false });
    expect(mip.Status).toBe("Optimal");
    expect(mip.ObjectiveValue).toBeCloseTo(10_000, 6);
    const lp = solver(buildAssignmentLp(model, false), { output_flag: false });
    expect(lp.ObjectiveValue).toBeLessThanOrEqual(10_000 + 1e-6);
    // The Lagrangian bound with the LP's capacity duals equals the LP bound (LP duality).
    const read = readAssignmentSolution(model, lp);
    expect(lagrangianBound(model, read.capacityMultipliers).boundDm).toBeCloseTo(lp.ObjectiveValue, 4);
  });

  it("when H1 is pinned to D1, then the pin is kept and the rest is optimised around it (1600 m)", () => {
    const input: AssignmentInput = {
      ...threeByTwo,
      households: [household("H1", 300, 2, "D1"), ...threeByTwo.households.slice(1)],
    };
    const result = solveAssignment(input, solver);
    expect(result.assignments.find((a) => a.householdId === "H1")).toMatchObject({ digesterId: "D1", pinned: true });
    expect(digesterOf(result, "H2")).toBe("D2");
    expect(result.totalDistanceM).toBeCloseTo(1600, 2);
    expect(result.contradictions).toEqual([]);
  });

  it("when a household is pinned to an offline digester, then the contradiction is reported and the household placed elsewhere", () => {
    const input: AssignmentInput = {
      households: [household("H1", 300, 2, "D1"), household("H3", 900, 2)],
      digesters: [digester("D1", 0, 10, false), digester("D2", 1000, 10)],
    };
    const result = solveAssignment(input, solver);
    expect(result.contradictions).toHaveLength(1);
    expect(result.contradictions[0]).toMatchObject({
      householdId: "H1",
      digesterId: "D1",
      kind: "digesterUnavailable",
    });
    // The words ("H1 … D1") are made from these parameters in shared/words (tested there).
    expect(result.contradictions[0]).toMatchObject({ code: "pinContradiction", weeklyKg: 2 });
    expect(result.messages).toContain(result.contradictions[0]);
    expect(digesterOf(result, "H1")).toBe("D2");
  });

  it("when pins to one digester exceed its room, then the first pins are kept and the overflowing one is reported", () => {
    const input: AssignmentInput = {
      households: [household("A", 100, 2, "D1"), household("B", 150, 2, "D1"), household("C", 200, 1)],
      digesters: [digester("D1", 0, 3), digester("D2", 1000, 10)],
    };
    const result = solveAssignment(input, solver);
    expect(result.assignments.find((a) => a.householdId === "A")).toMatchObject({ digesterId: "D1", pinned: true });
    expect(result.contradictions.map((c) => [c.householdId, c.kind])).toEqual([["B", "pinsOverloadDigester"]]);
    // B goes to D2 (D1 keeps 1 kg for C, the cheaper use of it: B would save 700 m, C saves 600 m, but B does not fit).
    expect(digesterOf(result, "B")).toBe("D2");
    expect(digesterOf(result, "C")).toBe("D1");
    expect(auditAssignment(input, result).overloadedDigesterIds).toEqual([]);
  });

  it("when a pin names a digester that does not exist, then it is reported, not a crash", () => {
    const input: AssignmentInput = { households: [household("A", 100, 2, "nope")], digesters: [digester("D1", 0, 3)] };
    const result = solveAssignment(input, solver);
    expect(result.contradictions[0]).toMatchObject({ kind: "unknownDigester", digesterId: "nope" });
    expect(digesterOf(result, "A")).toBe("D1");
  });

  it("when the walking limit is shorter than every walk, then households are reported with 'compost at home'", () => {
    const result = solveAssignment({ ...threeByTwo, maxWalkingDistanceM: 150 }, solver);
    // Within 150 m only H3 (100 m to D2) has a digester.
    expect(digesterOf(result, "H3")).toBe("D2");
    const unplaced = Object.fromEntries(result.unplaced.map((u) => [u.householdId, u]));
    expect(unplaced.H1).toMatchObject({ reason: "noDigesterWithinReach", suggestion: { kind: "compostAtHome" } });
    expect(unplaced.H2).toMatchObject({ reason: "noDigesterWithinReach" });
    expect(unplaced.H1!.walkingLimitM).toBe(150);
  });

  it("when a household has no location, then it is reported 'no location' and the rest is solved", () => {
    const input: AssignmentInput = {
      ...threeByTwo,
      households: [...threeByTwo.households, { id: "H4", lat: null, lng: null, weeklyKg: 3 }],
    };
    const result = solveAssignment(input, solver);
    expect(result.unplaced).toHaveLength(1);
    expect(result.unplaced[0]).toMatchObject({
      householdId: "H4",
      reason: "noLocation",
      suggestion: { kind: "compostAtHome" },
    });
    expect(result.totalDistanceM).toBeCloseTo(1000, 2);
  });

  it("when there is not room for everyone, then the heavier household is placed and the other told to come another day", () => {
    // One digester with 3 kg room cannot take both (1 + 2.5 kg). Penalties (unplacedPenaltyM, Dmax 400 m): light 401, heavy 1002.5;
    // placing heavy costs 400 + 401 = 801 < placing light 50 + 1002.5 [derived].
    const input: AssignmentInput = {
      households: [household("light", 50, 1), household("heavy", 400, 2.5)],
      digesters: [digester("D1", 0, 3)],
    };
    const result = solveAssignment(input, solver);
    expect(digesterOf(result, "heavy")).toBe("D1");
    expect(result.unplaced).toHaveLength(1);
    expect(result.unplaced[0]).toMatchObject({
      householdId: "light",
      reason: "noRoom",
      suggestion: { kind: "anotherDay", digesterId: "D1" },
    });
    expect(result.unplacedKg).toBe(1);
  });

  it("when every digester rests, then everyone is reported and a message says no digester takes scraps", () => {
    const input: AssignmentInput = {
      ...threeByTwo,
      digesters: threeByTwo.digesters.map((d) => ({ ...d, available: false })),
    };
    const result = solveAssignment(input, solver);
    expect(result.assignments).toEqual([]);
    expect(result.unplaced.map((u) => u.reason)).toEqual([
      "noDigesterWithinReach",
      "noDigesterWithinReach",
      "noDigesterWithinReach",
    ]);
    expect(result.messages).toContainEqual({ code: "noDigesterTakingScraps" });
  });

  it("when a digester has zero room, then a message says so and nobody is sent there", () => {
    const input: AssignmentInput = { ...threeByTwo, digesters: [digester("D1", 0, 0), digester("D2", 1000, 10)] };
    const result = solveAssignment(input, solver);
    expect(result.messages).toContainEqual({ code: "digesterWithoutRoom", digesterId: "D1" });
    expect(result.assignments.every((a) => a.digesterId === "D2")).toBe(true);
  });

  it("when the solver throws, then the plan falls back to local search and says so", () => {
    const broken: LpSolver = () => {
      throw new Error("wasm trap");
    };
    const result = solveAssignment(threeByTwo, broken);
    expect(result.method).toBe("localSearchFallback");
    expect(result.provenOptimal).toBe(false);
    expect(result.messages).toContainEqual({
      code: "solverGaveNoPlan",
      solverStatus: "Solver error: wasm trap",
      gapBounded: false,
    });
    expect(auditAssignment(threeByTwo, result).overloadedDigesterIds).toEqual([]);
  });

  it("when forced to relax and round with one candidate per household, then pricing still reaches the optimum", () => {
    const result = solveAssignment(threeByTwo, solver, { mode: "relaxAndRound", candidatesPerHousehold: 1 });
    expect(result.method).toBe("lpRoundRepair");
    expect(result.pruning?.candidatesPerHousehold).toBe(1);
    expect(result.totalDistanceM).toBeCloseTo(1000, 2);
    expect(result.lpBoundM).not.toBeNull();
    expect(result.lpBoundM!).toBeLessThanOrEqual(result.objectiveM + 1e-6);
  });
});

describe("unplaced penalty", () => {
  it("is above the longest walk and grows with kg", () => {
    expect(unplacedPenaltyM(1, 1, 2000)).toBe(2001);
    expect(unplacedPenaltyM(3, 1, 2000)).toBe(6003);
    expect(unplacedPenaltyM(0, 0, 500)).toBe(501);
  });
});

/* ------------------------------------------------------------------ */
/* Properties over random small instances                              */
/* ------------------------------------------------------------------ */

const smallInstance = fc
  .record({
    households: fc.array(
      fc.record({
        northM: fc.integer({ min: -1500, max: 1500 }),
        eastM: fc.integer({ min: -1500, max: 1500 }),
        weeklyKg: fc.integer({ min: 1, max: 60 }).map((x) => x / 10),
        located: fc.integer({ min: 0, max: 9 }).map((x) => x > 0),
        pin: fc.option(fc.integer({ min: 0, max: 3 }), { freq: 4 }),
      }),
      { minLength: 1, maxLength: 7 },
    ),
    digesters: fc.array(
      fc.record({
        northM: fc.integer({ min: -1500, max: 1500 }),
        eastM: fc.integer({ min: -1500, max: 1500 }),
        weeklyRoomKg: fc.integer({ min: 0, max: 120 }).map((x) => x / 10),
        available: fc.integer({ min: 0, max: 5 }).map((x) => x > 0),
      }),
      { minLength: 1, maxLength: 3 },
    ),
    maxWalkingDistanceM: fc.option(fc.integer({ min: 300, max: 4000 }), { freq: 3 }),
    withPins: fc.boolean(),
  })
  .map(({ households, digesters, maxWalkingDistanceM, withPins }): AssignmentInput => {
    const at = (n: number, e: number) => destinationPoint(destinationPoint(origin, 0, n), 90, e);
    return {
      digesters: digesters.map((d, j) => ({
        id: `d${j}`,
        ...at(d.northM, d.eastM),
        weeklyRoomKg: d.weeklyRoomKg,
        available: d.available,
      })),
      households: households.map((h, i) => ({
        id: `h${i}`,
        ...(h.located ? at(h.northM, h.eastM) : { lat: null, lng: null }),
        weeklyKg: h.weeklyKg,
        pinnedDigesterId: withPins && h.pin !== null ? `d${h.pin}` : null,
      })),
      maxWalkingDistanceM,
    };
  });

/** Exhaustive optimum of the core model: every item to one of its options or unplaced. */
function bruteForceDm(model: AssignmentModel): number {
  const n = model.items.length;
  const load = model.roomKg.map(() => 0);
  let best = Infinity;
  const walk = (i: number, cost: number) => {
    if (cost >= best) return;
    if (i === n) {
      best = cost;
      return;
    }
    const item = model.items[i]!;
    walk(i + 1, cost + item.penaltyDm);
    item.digesters.forEach((d, p) => {
      if (load[d]! + item.kg > model.roomKg[d]! + 1e-7) return;
      load[d]! += item.kg;
      walk(i + 1, cost + item.costsDm[p]!);
      load[d]! -= item.kg;
    });
  };
  walk(0, 0);
  return best;
}

describe("assignment: properties on random instances", () => {
  it("never overloads a digester, places or reports every household, and keeps every pin it does not report", () => {
    fc.assert(
      fc.property(smallInstance, (input) => {
        const result = solveAssignment(input, solver);
        const audit = auditAssignment(input, result);
        expect(audit.overloadedDigesterIds).toEqual([]);
        expect(audit.missingHouseholdIds).toEqual([]);
        expect(audit.duplicateHouseholdIds).toEqual([]);
        const contradicted = new Set(result.contradictions.map((c) => c.householdId));
        for (const h of input.households) {
          if (!h.pinnedDigesterId || contradicted.has(h.id) || h.lat === null) continue;
          expect(result.assignments.find((a) => a.householdId === h.id)).toMatchObject({
            digesterId: h.pinnedDigesterId,
            pinned: true,
          });
        }
        for (const a of result.assignments) {
          if (a.pinned || input.maxWalkingDistanceM == null) continue;
          expect(a.distanceM).toBeLessThanOrEqual(input.maxWalkingDistanceM + 1e-6);
        }
      }),
      { numRuns: 60 },
    );
  }, 60_000);

  it("reaches the exhaustive optimum of the model and is proven optimal", () => {
    fc.assert(
      fc.property(smallInstance, (input) => {
        const noPins = { ...input, households: input.households.map((h) => ({ ...h, pinnedDigesterId: null })) };
        const { model } = prepareAssignmentModel(noPins);
        const result = solveAssignment(noPins, solver);
        expect(result.provenOptimal).toBe(true);
        expect(result.objectiveM * 10).toBeCloseTo(bruteForceDm(model), 6);
      }),
      { numRuns: 60 },
    );
  }, 60_000);

  it("is never worse than the nearest-with-room baseline, and when both place everything walks no further", () => {
    fc.assert(
      fc.property(
        smallInstance,
        fc.constantFrom<"exact" | "relaxAndRound">("exact", "relaxAndRound"),
        (input, mode) => {
          const result = solveAssignment(input, solver, { mode, candidatesPerHousehold: 1 });
          const baseline = nearestWithRoomBaseline(input);
          expect(result.objectiveM).toBeLessThanOrEqual(baseline.objectiveM + 1e-9);
          if (result.unplaced.length === 0 && baseline.unplaced.length === 0) {
            // Model costs are whole decimetres: allow 0.05 m of rounding per household.
            expect(result.totalDistanceM).toBeLessThanOrEqual(baseline.totalDistanceM + 0.05 * input.households.length);
          }
          expect(result.lpBoundM ?? -Infinity).toBeLessThanOrEqual(result.objectiveM + 1e-6);
        },
      ),
      { numRuns: 60 },
    );
  }, 60_000);

  it("gives a Lagrangian bound no higher than the optimum for any multipliers", () => {
    fc.assert(
      fc.property(
        smallInstance,
        fc.array(fc.double({ min: 0, max: 5000, noNaN: true }), { minLength: 3, maxLength: 3 }),
        (input, v) => {
          const noPins = { ...input, households: input.households.map((h) => ({ ...h, pinnedDigesterId: null })) };
          const { model } = prepareAssignmentModel(noPins);
          const bound = lagrangianBound(model, Float64Array.from(model.roomKg.map((_, d) => v[d] ?? 0))).boundDm;
          expect(bound).toBeLessThanOrEqual(bruteForceDm(model) + 1e-6);
        },
      ),
      { numRuns: 100 },
    );
  }, 60_000);
});
