import { describe, expect, it } from "vitest";
import { type ProposalNote, ProposalNoteSchema, type ProposalUnplaced } from "../../../shared/schemas/assignments";
import { methodWords, proposalNoteWords, suggestionWords, unplacedWords } from "../../../shared/words/assignment-board";

const oak = { id: 7, name: "Oak Yard" };
const elm = { id: 9, name: "Elm Corner" };
const maple = { id: 12, name: "Maple House" };
const named = (n: number, prefix: string) =>
  Array.from({ length: n }, (_, i) => ({ id: i + 1, name: `${prefix} ${i + 1}` }));

/** One note of every code, with invented names. */
const everyNote: ProposalNote[] = [
  { code: "excludedDigesterUnknown", digesterId: 404 },
  { code: "pinHouseholdUnknown", householdId: 405 },
  { code: "pinsContradictory", household: maple, keptDigester: oak, droppedDigester: elm },
  { code: "pinContradiction", kind: "unknownDigester", household: maple, digester: { id: 406, name: null } },
  { code: "pinContradiction", kind: "digesterUnavailable", household: maple, digester: oak },
  { code: "pinContradiction", kind: "pinsOverloadDigester", household: maple, digester: oak },
  { code: "walkingLimitInvalid", walkingLimitM: -5 },
  { code: "walkingLimitInvalid", walkingLimitM: null },
  { code: "duplicateDigester", digester: oak },
  { code: "duplicateHousehold", household: maple },
  { code: "digesterWithoutLocation", digester: oak },
  { code: "digesterRoomInvalid", digester: oak, weeklyRoomKg: null },
  { code: "pinBeyondWalkingLimit", household: maple, digester: oak, distanceM: 812.4, walkingLimitM: 500 },
  { code: "solverGaveNoPlan", solverStatus: "Solver error: wasm trap", gapBounded: false },
  { code: "solverGaveNoPlan", solverStatus: "Infeasible", gapBounded: true },
  { code: "solverFailedOnPart", error: "out of memory" },
  { code: "timeLimitBeforeProof", solverStatuses: ["Time limit reached"] },
  { code: "timeLimitBeforeProof", solverStatuses: [] },
  {
    code: "approximatePlan",
    householdsToPlace: 10_000,
    gapToLpBound: 0.0029,
    candidatesPerHousehold: 5,
    pairsAddedByPricing: 12,
  },
  {
    code: "approximatePlan",
    householdsToPlace: 10_000,
    gapToLpBound: null,
    candidatesPerHousehold: 5,
    pairsAddedByPricing: 0,
  },
  { code: "householdsWithoutLocation", households: [maple] },
  { code: "walkingLimitUnreachable", walkingLimitM: 5, householdCount: 3, neededM: 1107.2 },
  { code: "noDigesterTakingScraps" },
  { code: "digestersWithoutRoom", digesters: [oak] },
];

describe("the coordinator's words for a proposal's notes", () => {
  it("when any note is worded, then it is a sentence with no unfilled parameter", () => {
    for (const note of everyNote) {
      expect(ProposalNoteSchema.parse(note)).toEqual(note);
      const words = proposalNoteWords(note);
      expect(words).toMatch(/^\S.*[.)]$/);
      expect(words).not.toMatch(/undefined|NaN|\[object/);
    }
  });

  it("when a pin names a resting digester, then the sentence names the household and the digester", () => {
    const words = proposalNoteWords({
      code: "pinContradiction",
      kind: "digesterUnavailable",
      household: { id: 1, name: "H1" },
      digester: { id: 2, name: "D1" },
    });
    expect(words).toMatch(/H1.*D1/);
    expect(words).toMatch(/Contradictory pin: .* pinned to .* resting, offline or excluded/);
  });

  it("when a pin names a digester that does not exist, then the sentence gives its id", () => {
    expect(everyNote.map(proposalNoteWords)[3]).toBe(
      "Contradictory pin: Maple House is pinned to a digester that does not exist (406); it is placed like any other household.",
    );
  });

  it("when two request pins contradict, then the sentence says which one is kept", () => {
    expect(proposalNoteWords(everyNote[2]!)).toBe(
      "Contradictory pins: Maple House is pinned to both Oak Yard and Elm Corner; the first pin is kept.",
    );
  });

  it("when no digester takes scraps, then the sentence says so", () => {
    expect(proposalNoteWords({ code: "noDigesterTakingScraps" })).toMatch(/No digester is taking scraps/);
  });

  it("when digesters have no room, then the first five are named and the rest counted", () => {
    expect(proposalNoteWords({ code: "digestersWithoutRoom", digesters: [{ id: 1, name: "D1" }] })).toMatch(
      /^D1 has no room this week .* so it takes no households\.$/,
    );
    expect(proposalNoteWords({ code: "digestersWithoutRoom", digesters: named(7, "Digester") })).toMatch(
      /^Digester 1, Digester 2, Digester 3, Digester 4, Digester 5 and 2 more have no room .* they take no households\.$/,
    );
  });

  it("when households have no location, then one 'has' and several 'have', with at most five names", () => {
    expect(proposalNoteWords({ code: "householdsWithoutLocation", households: [maple] })).toBe(
      "1 household has no location on the map (Maple House); add one so they can be assigned.",
    );
    const seven = proposalNoteWords({ code: "householdsWithoutLocation", households: named(7, "Home") });
    expect(seven).toMatch(/^7 households have no location on the map \(Home 1, .*Home 5, …\)/);
    expect(seven).not.toMatch(/Home 6/);
  });

  it("when the walking limit cannot be met, then the limit that would reach everyone is rounded up", () => {
    expect(proposalNoteWords(everyNote[21]!)).toBe(
      "The maximum walk of 5 m cannot be met: 3 households have no open digester that close. A limit of 1108 m would reach them all.",
    );
  });

  it("when the solver gave no plan or stopped early, then the sentence says what is and is not known", () => {
    expect(proposalNoteWords(everyNote[13]!)).toMatch(
      /did not solve this network \(Solver error: wasm trap\).*unknown/,
    );
    expect(proposalNoteWords(everyNote[14]!)).toMatch(/the gap shown bounds/);
    expect(proposalNoteWords(everyNote[17]!)).toMatch(/\(no better plan\)/);
  });

  it("when the plan is approximate, then the gap is given in per cent with two decimals", () => {
    expect(proposalNoteWords(everyNote[18]!)).toMatch(
      /10000 households to place.*at most 0\.29 % longer.*5 most promising/,
    );
    expect(proposalNoteWords(everyNote[19]!)).not.toMatch(/at most/);
  });

  it("when a kept pin is beyond the limit, then the walk is in whole metres", () => {
    expect(proposalNoteWords(everyNote[12]!)).toBe(
      "Maple House is pinned to Oak Yard at 812 m, beyond the 500 m walking limit; the pin is kept.",
    );
  });
});

describe("the coordinator's words for households not placed", () => {
  const base: Omit<ProposalUnplaced, "message" | "suggestion"> = {
    householdId: 12,
    householdName: "Maple House",
    weeklyKg: 2.34,
    reason: "noRoom",
    walkingLimitM: null,
    suggestedAction: { code: "compostAtHome" },
  };

  it("when the walking limit left it out, then the limit is named in metres", () => {
    expect(unplacedWords({ ...base, reason: "noDigesterWithinReach", walkingLimitM: 150 })).toMatch(/150 m/);
    expect(unplacedWords({ ...base, reason: "noDigesterWithinReach" })).toBe("No digester is open for Maple House.");
  });

  it("when every digester is full, then the kg to place are rounded to 0.1 kg", () => {
    expect(unplacedWords(base)).toBe("Every digester within reach of Maple House is full this week (2.3 kg to place).");
  });

  it("when it has no location or amount, then the sentence says which", () => {
    expect(unplacedWords({ ...base, reason: "noLocation" })).toBe("Maple House has no location on the map.");
    expect(unplacedWords({ ...base, reason: "invalidAmount" })).toBe("Maple House has no valid weekly amount.");
  });

  it("when another day is suggested, then the digester and the walk in whole metres are named", () => {
    expect(
      suggestionWords({
        suggestedAction: { code: "anotherDay", digesterId: 7, digesterName: "Oak Yard", distanceM: 240.6 },
      }),
    ).toBe("Bring the scraps to Oak Yard (241 m) on another day, or compost at home.");
    expect(suggestionWords(base)).toBe("Compost at home until there is room.");
  });
});

describe("the coordinator's words for how a plan was found", () => {
  it("when the method is known, then it has words, and an unknown one shows as itself", () => {
    expect(methodWords("exactMip")).toBe("Exact solver (HiGHS)");
    expect(methodWords("somethingNew")).toBe("somethingNew");
  });
});
