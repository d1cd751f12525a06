import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  type CollectionPlan,
  type CollectionRoundsInput,
  DEFAULT_MAX_END_LEG_M,
  DEFAULT_EXACT_MAX_STOPS,
  DEFAULT_MAX_LEG_M,
  EXACT_ROUNDS_MAX_STOPS,
  collectionRoundsLowerBoundM,
  exactCollectionRounds,
  planCollectionRounds,
} from "../../shared/domain/rounds";
import { destinationPoint, haversineM } from "../../shared/domain/geo";
import { seededRandom } from "../../shared/random";

// Points on one meridian: distances along it are exactly the metres given.
const origin = { lat: 52.09, lng: 5.12 };
const onLine = (m: number) => destinationPoint(origin, m >= 0 ? 0 : 180, Math.abs(m));
const at = (northM: number, eastM: number) => destinationPoint(destinationPoint(origin, 0, northM), 90, eastM);

const lineStops = (loadKg: number) =>
  [100, 200, 300].map((m, i) => ({ householdId: `s${i + 1}`, ...onLine(m), loadKg }));

/** Invariants every plan must satisfy, recomputed from the input. */
function checkPlan(
  input: CollectionRoundsInput,
  plan: CollectionPlan,
  maxEndLegM = DEFAULT_MAX_END_LEG_M,
  maxLegM = DEFAULT_MAX_LEG_M,
) {
  const bike = new Map(input.volunteers.map((v) => [v.id, v.bikeLoadKg]));
  const room = new Map(input.digesters.map((d) => [d.id, d.roomKg]));
  const delivered = new Map<string, number>();
  const seen = new Map<string, number>();
  for (const r of plan.rounds) {
    expect(r.stops.length).toBeGreaterThan(0);
    const load = r.stops.reduce((s, x) => s + x.loadKg, 0);
    expect(r.loadKg).toBeCloseTo(load, 9);
    expect(load).toBeLessThanOrEqual(bike.get(r.volunteerId)! + 1e-9);
    delivered.set(r.endDigesterId, (delivered.get(r.endDigesterId) ?? 0) + load);
    expect(r.lengthM).toBeCloseTo(r.stops.reduce((s, x) => s + x.legM, 0) + r.endLegM, 6);
    expect(r.endLegM).toBeLessThanOrEqual(maxEndLegM + 1e-6);
    const end = input.digesters.find((d) => d.id === r.endDigesterId)!;
    expect(r.endLegM).toBeCloseTo(haversineM(r.stops.at(-1)!, end), 6);
    const v = input.volunteers.find((x) => x.id === r.volunteerId)!;
    expect(r.stops[0]!.legM).toBeCloseTo(haversineM(v, r.stops[0]!), 6);
    for (const s of r.stops) expect(s.legM).toBeLessThanOrEqual(maxLegM + 1e-6);
    for (const s of r.stops) seen.set(s.householdId, (seen.get(s.householdId) ?? 0) + 1);
  }
  for (const [d, kg] of delivered) expect(kg).toBeLessThanOrEqual(room.get(d)! + 1e-9);
  for (const u of plan.unplacedStops) seen.set(u.householdId, (seen.get(u.householdId) ?? 0) + 1);
  for (const s of input.stops) expect(seen.get(s.householdId)).toBe(1);
  expect(plan.totalLengthM).toBeCloseTo(
    plan.rounds.reduce((s, r) => s + r.lengthM, 0),
    6,
  );
}

/** The plan by the default method (the exact solver for these few stops) and by the heuristic alone. */
const bothMethods = (input: CollectionRoundsInput) => [
  planCollectionRounds(input),
  planCollectionRounds(input, { exactMaxStops: 0 }),
];

describe("collection rounds: hand-solved instances", () => {
  it("when three stops lie on the way to the digester and fit one bike, then one round visits them in order (400 m)", () => {
    // Volunteer at 0 m, stops at 100/200/300 m, digester at 400 m: the straight run is 400 m [derived].
    const input: CollectionRoundsInput = {
      stops: lineStops(2),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds).toHaveLength(1);
      expect(plan.rounds[0]!.stops.map((s) => s.householdId)).toEqual(["s1", "s2", "s3"]);
      expect(plan.totalLengthM).toBeCloseTo(400, 3);
      expect(exactCollectionRounds(input)!.totalLengthM).toBeCloseTo(400, 3);
      checkPlan(input, plan);
    }
  });

  it("when the load is more than one bike, then two rounds of 400 m each are needed (800 m)", () => {
    // 3 × 2 kg on a 4 kg bike: two rounds; every round along the line from 0 to 400 m is 400 m long [derived].
    const input: CollectionRoundsInput = {
      stops: lineStops(2),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 4 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds).toHaveLength(2);
      expect(plan.totalLengthM).toBeCloseTo(800, 3);
      checkPlan(input, plan);
    }
  });

  it("when the near digester has room for only part of the load, then the rest ends at the far one", () => {
    // Volunteer at 0; stops at 100/200/300 m, 2 kg each; bike 10 kg. "near" at 400 m takes 4 kg, "far" at 1400 m 100 kg.
    // The 6 kg cannot all end at near, so some round ends at far and costs ≥ 1400 m; one round 0→…→300→far is
    // exactly 1400 m, so it is optimal; any split adds a second round of ≥ 400 m [derived].
    const input: CollectionRoundsInput = {
      stops: lineStops(2),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [
        { id: "near", ...onLine(400), roomKg: 4 },
        { id: "far", ...onLine(1400), roomKg: 100 },
      ],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.totalLengthM).toBeCloseTo(1400, 3);
      expect(plan.rounds.map((r) => r.endDigesterId)).toEqual(["far"]);
      checkPlan(input, plan);
    }
  });

  it("when stops cannot be collected, then each is reported with its reason", () => {
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "ok", ...onLine(100), loadKg: 3 },
        { householdId: "heavy", ...onLine(150), loadKg: 30 },
        { householdId: "nowhere", lat: null, lng: null, loadKg: 2 },
        { householdId: "broken", ...onLine(120), loadKg: Number.NaN },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 20 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      const reasons = Object.fromEntries(plan.unplacedStops.map((u) => [u.householdId, u.reason]));
      expect(reasons).toEqual({ heavy: "heavierThanAnyBike", nowhere: "noLocation", broken: "invalidLoad" });
      // The reason names the largest bike (20 kg), for the words the coordinator reads.
      expect(plan.unplacedStops.find((u) => u.householdId === "heavy")).toMatchObject({
        largestBikeKg: 20,
        loadKg: 30,
      });
      expect(plan.rounds.flatMap((r) => r.stops.map((s) => s.householdId))).toEqual(["ok"]);
      checkPlan(input, plan);
    }
  });

  it("when the digesters' room runs out across rounds, then the rest is reported 'no digester with room' and rooms hold", () => {
    // One 4 kg bike, four 4 kg stops, one digester with 8 kg room: two one-stop rounds fit, two stops do not.
    const input: CollectionRoundsInput = {
      stops: [100, 200, 300, 350].map((m, i) => ({ householdId: `s${i}`, ...onLine(m), loadKg: 4 })),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 4 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 8 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds).toHaveLength(2);
      expect(plan.unplacedStops.map((u) => u.reason)).toEqual(["noDigesterWithRoom", "noDigesterWithRoom"]);
      expect(plan.digesterLoads).toEqual([{ digesterId: "D", loadKg: 8, roomKg: 8 }]);
      checkPlan(input, plan);
    }
  });

  it("when the only digester with room is beyond the last-leg cap, then the stop is reported, and a wider cap plans it", () => {
    // Stop at 100 m, digester at 6,100 m: the last leg is 6,000 m, over the 5,000 m default [derived].
    const input: CollectionRoundsInput = {
      stops: [{ householdId: "s", ...onLine(100), loadKg: 2 }],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [{ id: "far", ...onLine(6100), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds).toEqual([]);
      expect(plan.unplacedStops.map((u) => u.reason)).toEqual(["noDigesterWithinReach"]);
      expect(plan.unplacedStops[0]).toMatchObject({ maxEndLegM: 5000, maxLegM: 5000 });
      checkPlan(input, plan);
      const wider = planCollectionRounds(input, { maxEndLegM: 7000 });
      expect(wider.rounds.map((r) => r.endDigesterId)).toEqual(["far"]);
      expect(wider.totalLengthM).toBeCloseTo(6100, 3);
      checkPlan(input, wider, 7000);
      expect(exactCollectionRounds(input, { maxEndLegM: 7000 })!.totalLengthM).toBeCloseTo(6100, 3);
      expect(collectionRoundsLowerBoundM(input, { maxEndLegM: 7000 })).toBeLessThanOrEqual(6100 + 1e-6);
    }
  });

  it("when the near digester fills and the one with room is beyond the cap, then the rest waits instead of riding across town", () => {
    // Three 2 kg stops at 100–300 m; "near" (400 m) takes 4 kg, "far" (8 km) has room but is beyond 5 km.
    const input: CollectionRoundsInput = {
      stops: lineStops(2),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [
        { id: "near", ...onLine(400), roomKg: 4 },
        { id: "far", ...onLine(8000), roomKg: 100 },
      ],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds.every((r) => r.endDigesterId === "near")).toBe(true);
      expect(plan.digesterLoads.find((d) => d.digesterId === "near")!.loadKg).toBe(4);
      expect(plan.unplacedStops).toHaveLength(1);
      expect(plan.unplacedStops[0]!.reason).toBe("noDigesterWithRoom");
      expect(plan.unplacedStops[0]).toMatchObject({ takenByOtherRounds: true, maxEndLegM: 5000 });
      checkPlan(input, plan);
    }
  });

  it("when two stops are 20 km apart, then no round rides between them, and a stop with no volunteer within 5 km waits", () => {
    // Two neighbourhoods 20 km apart on one meridian, each with a volunteer and a digester; a third stop 40 km out has neither.
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "a", ...onLine(100), loadKg: 2 },
        { householdId: "b", ...onLine(20_100), loadKg: 2 },
        { householdId: "far", ...onLine(40_000), loadKg: 2 },
      ],
      volunteers: [
        { id: "va", ...onLine(0), bikeLoadKg: 40 },
        { id: "vb", ...onLine(20_000), bikeLoadKg: 40 },
      ],
      digesters: [
        { id: "Da", ...onLine(400), roomKg: 100 },
        { id: "Db", ...onLine(20_400), roomKg: 100 },
        { id: "Dfar", ...onLine(40_300), roomKg: 100 },
      ],
    };
    for (const plan of bothMethods(input)) {
      const byStop = Object.fromEntries(plan.rounds.flatMap((r) => r.stops.map((s) => [s.householdId, r])));
      expect(byStop.a!.volunteerId).toBe("va");
      expect(byStop.b!.volunteerId).toBe("vb");
      expect(byStop.a).not.toBe(byStop.b);
      // Each round: 100 m out, 300 m to its digester [derived].
      expect(plan.totalLengthM).toBeCloseTo(800, 3);
      expect(plan.unplacedStops.map((u) => [u.householdId, u.reason])).toEqual([["far", "noVolunteer"]]);
      expect(plan.unplacedStops[0]).toMatchObject({ maxLegM: 5000, volunteersAvailable: 2 });
      for (const r of plan.rounds) for (const s of r.stops) expect(s.legM).toBeLessThanOrEqual(5000);
      checkPlan(input, plan);
    }
  });

  it("when nobody has a bike, then every stop is reported and a message says so", () => {
    const input: CollectionRoundsInput = {
      stops: lineStops(2),
      volunteers: [],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds).toEqual([]);
      expect(plan.unplacedStops.every((u) => u.reason === "noVolunteer")).toBe(true);
      expect(plan.messages).toContainEqual({ code: "noVolunteers" });
      expect(plan.unplacedStops[0]).toMatchObject({ volunteersAvailable: 0 });
    }
  });

  it("when a round is too heavy for one volunteer's bike, then it goes to a volunteer whose bike carries it", () => {
    const input: CollectionRoundsInput = {
      stops: [{ householdId: "s", ...onLine(100), loadKg: 15 }],
      volunteers: [
        { id: "small", ...onLine(90), bikeLoadKg: 10 },
        { id: "big", ...onLine(-500), bikeLoadKg: 20 },
      ],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.rounds[0]!.volunteerId).toBe("big");
      // −500 → 100 → 400 m = 900 m [derived]
      expect(plan.totalLengthM).toBeCloseTo(900, 3);
    }
  });
});

describe("collection rounds: chains of legs within the cap", () => {
  // Every leg of these rounds is at most 5 km, although a stop's straight line to the volunteer or to the
  // digester is longer: the stop can be served through its neighbour, so it must not be reported.
  const ids = (plan: CollectionPlan) => plan.rounds.map((r) => r.stops.map((s) => s.householdId));

  it("when a stop reaches the digester only through the next stop, then both are collected in one round (7.8 km)", () => {
    // Volunteer at 0, A at 1.9 km, B 3 km past A, digester 2.9 km past B: A → digester is 5.9 km, but every
    // leg of 0 → A → B → digester is ≤ 3 km; the round is 7.8 km [derived].
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "A", ...onLine(1900), loadKg: 5 },
        { householdId: "B", ...onLine(4900), loadKg: 5 },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 40 }],
      digesters: [{ id: "D", ...onLine(7800), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.unplacedStops).toEqual([]);
      expect(ids(plan)).toEqual([["A", "B"]]);
      expect(plan.totalLengthM).toBeCloseTo(7800, 3);
      checkPlan(input, plan);
    }
    expect(exactCollectionRounds(input)!.totalLengthM).toBeCloseTo(7800, 3);
  });

  it("when a stop is reached from the volunteer only through an earlier stop, then both are collected (7.8 km)", () => {
    // Volunteer at 0, A at 2.9 km, B at 5.9 km (5.9 km from the volunteer), digester at 7.8 km [derived].
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "B", ...onLine(5900), loadKg: 5 },
        { householdId: "A", ...onLine(2900), loadKg: 5 },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 40 }],
      digesters: [{ id: "D", ...onLine(7800), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.unplacedStops).toEqual([]);
      expect(ids(plan)).toEqual([["A", "B"]]);
      expect(plan.totalLengthM).toBeCloseTo(7800, 3);
      checkPlan(input, plan);
    }
  });

  it("when the middle stop of a chain has neither a volunteer nor a digester within 5 km, then the chain of 4 km legs is ridden (16 km)", () => {
    // Volunteer at 0, stops at 4, 8 and 12 km, digester at 16 km: B is 8 km from both ends, A 12 km from the
    // digester, C 12 km from the volunteer; the only round is 0 → A → B → C → 16 km [derived].
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "C", ...onLine(12_000), loadKg: 3 },
        { householdId: "A", ...onLine(4000), loadKg: 3 },
        { householdId: "B", ...onLine(8000), loadKg: 3 },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 40 }],
      digesters: [{ id: "D", ...onLine(16_000), roomKg: 100 }],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.unplacedStops).toEqual([]);
      expect(ids(plan)).toEqual([["A", "B", "C"]]);
      expect(plan.totalLengthM).toBeCloseTo(16_000, 3);
      checkPlan(input, plan);
    }
  });

  it("when a stop's only chain would overload the bike or the digester, then that stop is reported and the other collected", () => {
    // As the first case with 6 kg at each stop: A needs B on its round (12 kg). A 10 kg bike, or a digester with
    // room for 6 kg, serves only B (0 → 4.9 → 7.8 km); a 12 kg bike and 12 kg of room serve both [derived].
    const stops = [
      { householdId: "A", ...onLine(1900), loadKg: 6 },
      { householdId: "B", ...onLine(4900), loadKg: 6 },
    ];
    const cases = [
      { bikeLoadKg: 10, roomKg: 100 },
      { bikeLoadKg: 40, roomKg: 6 },
    ];
    for (const { bikeLoadKg, roomKg } of cases) {
      const input: CollectionRoundsInput = {
        stops,
        volunteers: [{ id: "v", ...onLine(0), bikeLoadKg }],
        digesters: [{ id: "D", ...onLine(7800), roomKg }],
      };
      for (const plan of bothMethods(input)) {
        expect(ids(plan)).toEqual([["B"]]);
        expect(plan.unplacedStops.map((u) => [u.householdId, u.reason])).toEqual([["A", "noDigesterWithinReach"]]);
        expect(plan.totalLengthM).toBeCloseTo(7800, 3);
        checkPlan(input, plan);
      }
    }
    const roomy: CollectionRoundsInput = {
      stops,
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 12 }],
      digesters: [{ id: "D", ...onLine(7800), roomKg: 12 }],
    };
    for (const plan of bothMethods(roomy)) expect(ids(plan)).toEqual([["A", "B"]]);
  });

  it("when a stop's only neighbour would be both the way in and the way out, then only that stop is reported", () => {
    // Volunteer at 0, N at 300 m, A at 4 km, B at 8 km; "near" digester at −700 m, "far" at 16 km. B's only leg
    // within 5 km is to A (N is 7.7 km, both digesters and the volunteer 8 km or more), so a round would have to
    // pass A twice: B is out of reach. N and A share one round 0 → N → A → near = 0.3 + 3.7 + 4.7 km = 8.7 km,
    // as short as 0 → A → N → near [derived].
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "B", ...onLine(8000), loadKg: 2 },
        { householdId: "N", ...onLine(300), loadKg: 2 },
        { householdId: "A", ...onLine(4000), loadKg: 2 },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 40 }],
      digesters: [
        { id: "near", ...onLine(-700), roomKg: 100 },
        { id: "far", ...onLine(16_000), roomKg: 100 },
      ],
    };
    for (const plan of bothMethods(input)) {
      expect(plan.unplacedStops.map((u) => [u.householdId, u.reason])).toEqual([["B", "noDigesterWithinReach"]]);
      expect(plan.totalLengthM).toBeCloseTo(8700, 3);
      checkPlan(input, plan);
    }
  });
});

/* ------------------------------------------------------------------ */
/* Random instances                                                    */
/* ------------------------------------------------------------------ */

const instance = (maxStops: number) =>
  fc
    .record({
      sideM: fc.integer({ min: 500, max: 4000 }),
      stops: fc.array(
        fc.record({
          n: fc.double({ min: 0, max: 1, noNaN: true }),
          e: fc.double({ min: 0, max: 1, noNaN: true }),
          kg: fc.integer({ min: 1, max: 10 }),
        }),
        {
          minLength: 1,
          maxLength: maxStops,
        },
      ),
      volunteers: fc.array(
        fc.record({
          n: fc.double({ min: 0, max: 1, noNaN: true }),
          e: fc.double({ min: 0, max: 1, noNaN: true }),
          bike: fc.integer({ min: 8, max: 30 }),
        }),
        {
          minLength: 1,
          maxLength: 3,
        },
      ),
      digesters: fc.array(
        fc.record({
          n: fc.double({ min: 0, max: 1, noNaN: true }),
          e: fc.double({ min: 0, max: 1, noNaN: true }),
          share: fc.double({ min: 0.2, max: 1.5, noNaN: true }),
        }),
        {
          minLength: 1,
          maxLength: 3,
        },
      ),
    })
    .map(({ sideM, stops, volunteers, digesters }): CollectionRoundsInput => {
      const total = stops.reduce((s, x) => s + x.kg, 0);
      return {
        stops: stops.map((s, i) => ({ householdId: `s${i}`, ...at(s.n * sideM, s.e * sideM), loadKg: s.kg })),
        volunteers: volunteers.map((v, k) => ({ id: `v${k}`, ...at(v.n * sideM, v.e * sideM), bikeLoadKg: v.bike })),
        digesters: digesters.map((d, k) => ({
          id: `d${k}`,
          ...at(d.n * sideM, d.e * sideM),
          roomKg: Math.round(total * d.share),
        })),
      };
    });

describe("collection rounds: properties", () => {
  it("every round fits its bike, no digester gets more than its room, every stop is planned once or reported", () => {
    fc.assert(
      fc.property(instance(25), (input) => {
        checkPlan(input, planCollectionRounds(input, { improvementIterations: 20 }));
      }),
      { numRuns: 40 },
    );
  }, 60_000);

  // Quality is a statistical claim, so these comparisons use a fixed seed (reproducible runs).
  // Measured on 40 random cases per size with 1–9 stops (see the report): equal to the optimum for ≤ 5 stops,
  // worst 2.7 % above it for 6–9 stops. The contract tested here is looser: ≤ 10 %, and equal up to 4 stops.
  it("is within 10 % of the exact optimum up to 9 stops, never better than it, and never above it in its lower bound", () => {
    fc.assert(
      fc.property(instance(EXACT_ROUNDS_MAX_STOPS), (input) => {
        const exact = exactCollectionRounds(input);
        fc.pre(exact !== null && exact.unplacedStops.length === 0);
        const plan = planCollectionRounds(input, { exactMaxStops: 0 });
        checkPlan(input, exact!);
        expect(plan.unplacedStops).toEqual([]);
        expect(plan.totalLengthM).toBeGreaterThanOrEqual(exact!.totalLengthM - 1e-6);
        expect(plan.totalLengthM).toBeLessThanOrEqual(exact!.totalLengthM * 1.1);
        expect(collectionRoundsLowerBoundM(input)).toBeLessThanOrEqual(exact!.totalLengthM + 1e-6);
      }),
      { numRuns: 60, seed: 20240601 },
    );
  }, 180_000);

  it("equals the exact optimum on tiny cases (up to 4 stops)", () => {
    fc.assert(
      fc.property(instance(4), (input) => {
        const exact = exactCollectionRounds(input);
        fc.pre(exact !== null && exact.unplacedStops.length === 0);
        expect(planCollectionRounds(input, { exactMaxStops: 0 }).totalLengthM).toBeCloseTo(exact!.totalLengthM, 6);
      }),
      { numRuns: 80, seed: 20240602 },
    );
  }, 60_000);

  it("when there are more than 9 stops, then the exact solver declines instead of running for ever", () => {
    const input: CollectionRoundsInput = {
      stops: Array.from({ length: 10 }, (_, i) => ({ householdId: `s${i}`, ...onLine(100 * i), loadKg: 1 })),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 20 }],
      digesters: [{ id: "D", ...onLine(1200), roomKg: 100 }],
    };
    expect(exactCollectionRounds(input)).toBeNull();
  });
});

describe("collection rounds: the exact solver for small dates", () => {
  it("when a date has at most DEFAULT_EXACT_MAX_STOPS stops, then the exact solver plans it; with one more, the heuristic", () => {
    const line = (count: number): CollectionRoundsInput => ({
      stops: Array.from({ length: count }, (_, i) => ({ householdId: `s${i}`, ...onLine(100 + 50 * i), loadKg: 1 })),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 40 }],
      digesters: [{ id: "D", ...onLine(1000), roomKg: 100 }],
    });
    expect(planCollectionRounds(line(DEFAULT_EXACT_MAX_STOPS)).method).toBe("exact");
    expect(planCollectionRounds(line(DEFAULT_EXACT_MAX_STOPS + 1)).method).toBe("heuristic");
    expect(planCollectionRounds(line(3), { exactMaxStops: 0 }).method).toBe("heuristic");
    // Stops that cannot be planned do not count: 12 requests of which 4 have no location are 8 to plan.
    const withUnmapped: CollectionRoundsInput = {
      ...line(8),
      stops: [
        ...line(8).stops,
        ...Array.from({ length: 4 }, (_, i) => ({ householdId: `x${i}`, lat: null, lng: null, loadKg: 1 })),
      ],
    };
    expect(planCollectionRounds(withUnmapped).method).toBe("exact");
  });

  it("when the room cannot take every stop, then the exact plan leaves out as few as it can, then rides the least", () => {
    // Volunteer at 0; B (5 kg) at 200 m and C (3 kg) at 300 m on the line to the digester at 400 m (room 8 kg);
    // A (4 kg) 500 m off the line. A + B = 9 kg does not fit; A + C (7 kg) and B + C (8 kg) both leave one out, and
    // B + C rides 400 m against about 1.15 km for A + C [derived]: A waits.
    const input: CollectionRoundsInput = {
      stops: [
        { householdId: "A", ...at(100, 500), loadKg: 4 },
        { householdId: "B", ...onLine(200), loadKg: 5 },
        { householdId: "C", ...onLine(300), loadKg: 3 },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 8 }],
    };
    const plan = planCollectionRounds(input);
    expect(plan.method).toBe("exact");
    expect(plan.unplacedStops.map((u) => [u.householdId, u.reason])).toEqual([["A", "noDigesterWithRoom"]]);
    expect(plan.unplacedStops[0]).toMatchObject({ takenByOtherRounds: true });
    expect(plan.totalLengthM).toBeCloseTo(400, 3);
    checkPlan(input, plan);
  });

  it("never leaves out more stops than the heuristic, nor rides further when it leaves out as many", () => {
    fc.assert(
      fc.property(fc.oneof(instance(DEFAULT_EXACT_MAX_STOPS), sparseInstance(DEFAULT_EXACT_MAX_STOPS)), (drawn) => {
        const { input, caps } = "input" in drawn ? drawn : { input: drawn, caps: {} };
        const plan = planCollectionRounds(input, caps);
        const heuristic = planCollectionRounds(input, { ...caps, exactMaxStops: 0, improvementIterations: 30 });
        expect(plan.method).toBe("exact");
        checkPlan(input, plan, caps.maxEndLegM, caps.maxLegM);
        expect(plan.unplacedStops.length).toBeLessThanOrEqual(heuristic.unplacedStops.length);
        if (plan.unplacedStops.length === heuristic.unplacedStops.length)
          expect(plan.totalLengthM).toBeLessThanOrEqual(heuristic.totalLengthM + 1e-6);
      }),
      { numRuns: 60, seed: 20240604 },
    );
  }, 120_000);
});

/* ------------------------------------------------------------------ */
/* Reachability over the leg graph, checked by brute force             */
/* ------------------------------------------------------------------ */

/**
 * The stops some single round can serve, by trying every order of stops from every volunteer: each leg within
 * its cap, the load within the bike and the end digester's room. Only for a handful of stops.
 */
function servableByBruteForce(input: CollectionRoundsInput, maxLegM: number, maxEndLegM: number): Set<string> {
  const stops = input.stops.filter((s) => s.lat !== null && s.lng !== null) as {
    householdId: string;
    lat: number;
    lng: number;
    loadKg: number;
  }[];
  const served = new Set<string>();
  const path: number[] = [];
  const walk = (from: { lat: number; lng: number }, loadKg: number, bikeKg: number) => {
    const last = stops[path.at(-1)!]!;
    if (input.digesters.some((d) => d.roomKg >= loadKg && haversineM(last, d) <= maxEndLegM))
      for (const i of path) served.add(stops[i]!.householdId);
    stops.forEach((s, i) => {
      if (path.includes(i) || loadKg + s.loadKg > bikeKg || haversineM(from, s) > maxLegM) return;
      path.push(i);
      walk(s, loadKg + s.loadKg, bikeKg);
      path.pop();
    });
  };
  for (const v of input.volunteers)
    stops.forEach((s, i) => {
      if (s.loadKg > v.bikeLoadKg || haversineM(v, s) > maxLegM) return;
      path.push(i);
      walk(s, s.loadKg, v.bikeLoadKg);
      path.pop();
    });
  return served;
}

/**
 * Instances spread evenly over 6 km × 6 km with caps of 1–3 km, so that many stops are reached only through
 * others and some by no chain at all. Points come from a seeded uniform stream (fast-check's doubles favour the
 * ends of their range, which would pile the points into the corners).
 */
const sparseInstance = (maxStops: number) =>
  fc.integer({ min: 1, max: 2 ** 31 - 1 }).map((seed) => {
    const r = seededRandom(seed, "sparse rounds");
    const side = 6000;
    const point = () => at(r.range(0, side), r.range(0, side));
    const stops = Array.from({ length: r.int(1, maxStops) }, (_, i) => ({
      householdId: `s${i}`,
      ...point(),
      loadKg: r.int(1, 10),
    }));
    const total = stops.reduce((s, x) => s + x.loadKg, 0);
    const input: CollectionRoundsInput = {
      stops,
      volunteers: Array.from({ length: r.int(1, 2) }, (_, k) => ({
        id: `v${k}`,
        ...point(),
        bikeLoadKg: r.int(8, 30),
      })),
      digesters: Array.from({ length: r.int(1, 2) }, (_, k) => ({
        id: `d${k}`,
        ...point(),
        roomKg: Math.round(total * r.range(0.2, 1.5)),
      })),
    };
    const capM = r.int(1000, 3000);
    return { input, caps: { maxLegM: capM, maxEndLegM: capM } };
  });

describe("collection rounds: reachability over the leg graph (properties)", () => {
  it("when a stop is reported out of reach, then brute force finds no single round of legs within the caps that serves it", () => {
    let outOfReach = 0;
    let throughOthers = 0;
    fc.assert(
      fc.property(sparseInstance(8), ({ input, caps }) => {
        const plan = planCollectionRounds(input, { ...caps, improvementIterations: 10 });
        checkPlan(input, plan, caps.maxEndLegM, caps.maxLegM);
        const served = servableByBruteForce(input, caps.maxLegM, caps.maxEndLegM);
        for (const u of plan.unplacedStops) {
          const reported = u.reason === "noVolunteer" || u.reason === "noDigesterWithinReach";
          expect(reported && served.has(u.householdId), `${u.householdId} reported ${u.reason}`).toBe(false);
          if (reported) outOfReach++;
        }
        for (const r of plan.rounds)
          for (const s of r.stops) {
            const v = input.volunteers.find((x) => x.id === r.volunteerId)!;
            const end = input.digesters.find((d) => d.id === r.endDigesterId)!;
            if (haversineM(v, s) > caps.maxLegM || haversineM(s, end) > caps.maxEndLegM) throughOthers++;
          }
      }),
      { numRuns: 200, seed: 20240603 },
    );
    // The instances exercise both sides: stops truly out of reach, and stops served only through others.
    expect(outOfReach).toBeGreaterThan(20);
    expect(throughOthers).toBeGreaterThan(20);
  }, 120_000);
});
