import { beforeAll, describe, expect, it } from "vitest";
import {
  type AssignmentDigester,
  type AssignmentHousehold,
  type AssignmentInput,
  type LpSolver,
  solveAssignment,
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

describe("assignment: messages are codes with parameters, never sentences", () => {
  it("when ids repeat, a digester has no location or room and the limit is not metres, then each is its own code", () => {
    const input: AssignmentInput = {
      households: [household("H1", 100, 2), household("H1", 200, 3), household("H2", 300, 1)],
      digesters: [
        digester("D1", 0, 10),
        digester("D1", 50, 10),
        { id: "D2", lat: Number.NaN, lng: Number.NaN, weeklyRoomKg: 10, available: true },
        digester("D3", 400, Number.NaN),
      ],
      maxWalkingDistanceM: -5,
    };
    const result = solveAssignment(input, solver);
    expect(result.messages).toContainEqual({ code: "walkingLimitInvalid", walkingLimitM: -5 });
    expect(result.messages).toContainEqual({ code: "duplicateDigester", digesterId: "D1" });
    expect(result.messages).toContainEqual({ code: "duplicateHousehold", householdId: "H1" });
    expect(result.messages).toContainEqual({ code: "digesterWithoutLocation", digesterId: "D2" });
    expect(result.messages).toContainEqual({ code: "digesterRoomInvalid", digesterId: "D3", weeklyRoomKg: Number.NaN });
    expect(result.messages.every((m) => typeof m === "object" && typeof m.code === "string")).toBe(true);
  });

  it("when pins to one digester exceed its room, then the contradiction carries the household's kg and the room", () => {
    const input: AssignmentInput = {
      households: [household("A", 100, 2, "D1"), household("B", 150, 2, "D1"), household("C", 200, 1)],
      digesters: [digester("D1", 0, 3), digester("D2", 1000, 10)],
    };
    const result = solveAssignment(input, solver);
    expect(result.contradictions).toEqual([
      {
        code: "pinContradiction",
        householdId: "B",
        digesterId: "D1",
        kind: "pinsOverloadDigester",
        weeklyKg: 2,
        weeklyRoomKg: 3,
      },
    ]);
    expect(result.messages).toContain(result.contradictions[0]);
  });

  it("when a pin names a digester that does not exist, then the contradiction has no room", () => {
    const input: AssignmentInput = { households: [household("A", 100, 2, "nope")], digesters: [digester("D1", 0, 3)] };
    expect(solveAssignment(input, solver).contradictions[0]).toMatchObject({
      kind: "unknownDigester",
      weeklyRoomKg: null,
    });
  });

  it("when a kept pin is beyond the walking limit, then the message carries the walk and the limit in metres", () => {
    const input: AssignmentInput = {
      households: [household("H1", 300, 2, "D2"), household("H2", 100, 1)],
      digesters: [digester("D1", 0, 10), digester("D2", 1000, 10)],
      maxWalkingDistanceM: 500,
    };
    const result = solveAssignment(input, solver);
    const beyond = result.messages.find((m) => m.code === "pinBeyondWalkingLimit");
    expect(beyond).toMatchObject({ householdId: "H1", digesterId: "D2", walkingLimitM: 500 });
    // H1 at 300 m, D2 at 1000 m on the meridian: 700 m apart [derived].
    expect(beyond && "distanceM" in beyond ? beyond.distanceM : null).toBeCloseTo(700, 3);
  });

  it("when a household cannot be placed, then householdsUnplaced counts it with its kg", () => {
    const input: AssignmentInput = {
      households: [household("light", 50, 1), household("heavy", 400, 2.5)],
      digesters: [digester("D1", 0, 3)],
    };
    expect(solveAssignment(input, solver).messages).toContainEqual({
      code: "householdsUnplaced",
      count: 1,
      weeklyKg: 1,
    });
  });

  it("when the network is relaxed and rounded, then approximatePlan says how candidates were chosen", () => {
    const input: AssignmentInput = {
      households: [household("H1", 300, 2), household("H2", -200, 2), household("H3", 900, 2)],
      digesters: [digester("D1", 0, 2), digester("D2", 1000, 10)],
    };
    const result = solveAssignment(input, solver, { mode: "relaxAndRound", candidatesPerHousehold: 1 });
    expect(result.messages).toContainEqual({
      code: "approximatePlan",
      householdsToPlace: 3,
      gapToLpBound: result.gapToLpBound,
      candidatesPerHousehold: 1,
      pairsAddedByPricing: result.pruning!.pairsAddedByPricing,
    });
  });

  it("when HiGHS fails on the MIP only, then solverFailedOnPart carries its own error and the plan is not proven", () => {
    // The LP relaxation solves; every MIP (the text with a Binary section) throws.
    const noMip: LpSolver = (lp, options) => {
      if (/^Binary$/m.test(lp)) throw new Error("no MIP today");
      return solver(lp, options);
    };
    const input: AssignmentInput = {
      households: [household("light", 50, 1), household("heavy", 400, 2.5)],
      digesters: [digester("D1", 0, 3)],
    };
    const result = solveAssignment(input, noMip);
    expect(result.provenOptimal).toBe(false);
    expect(result.messages).toContainEqual({ code: "solverFailedOnPart", error: "no MIP today" });
    expect(result.messages).toContainEqual({ code: "timeLimitBeforeProof", solverStatuses: [] });
  });
});
