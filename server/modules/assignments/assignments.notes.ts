/**
 * The solver's codes as a proposal's notes: domain ids (strings) become the API's numbers and
 * names are resolved, so the words (shared/words/assignment-board.ts) need no look-ups. No
 * sentences here, and nothing is read back from text: each code is mapped by its name.
 */
import type { AssignmentMessage, AssignmentResult } from "../../../shared/domain/assignment";
import type { ProposalNote } from "../../../shared/schemas/assignments";

/** Names of the households and digesters a proposal speaks of, by id. */
export interface ProposalNames {
  household(id: number): string;
  /** The digester's name, or null when no such digester exists. */
  digester(id: number): string | null;
}

const digesterOf = (names: ProposalNames, id: string) => ({
  id: Number(id),
  name: names.digester(Number(id)) ?? `digester ${id}`,
});
const householdOf = (names: ProposalNames, id: string) => ({ id: Number(id), name: names.household(Number(id)) });

/**
 * One solver message as a note, or null for those the proposal says in its own notes (pins are
 * listed from `contradictions`; unplaced households, digesters without room and "no digester
 * takes scraps" have their own summaries).
 */
function noteOf(m: AssignmentMessage, names: ProposalNames): ProposalNote | null {
  switch (m.code) {
    case "pinContradiction":
    case "householdsUnplaced":
    case "digesterWithoutRoom":
    case "noDigesterTakingScraps":
      return null;
    case "walkingLimitInvalid":
      return { code: m.code, walkingLimitM: Number.isFinite(m.walkingLimitM) ? m.walkingLimitM : null };
    case "duplicateDigester":
    case "digesterWithoutLocation":
      return { code: m.code, digester: digesterOf(names, m.digesterId) };
    case "digesterRoomInvalid":
      return {
        code: m.code,
        digester: digesterOf(names, m.digesterId),
        weeklyRoomKg: Number.isFinite(m.weeklyRoomKg) ? m.weeklyRoomKg : null,
      };
    case "duplicateHousehold":
      return { code: m.code, household: householdOf(names, m.householdId) };
    case "pinBeyondWalkingLimit":
      return {
        code: m.code,
        household: householdOf(names, m.householdId),
        digester: digesterOf(names, m.digesterId),
        distanceM: m.distanceM,
        walkingLimitM: m.walkingLimitM,
      };
    case "solverGaveNoPlan":
      return { code: m.code, solverStatus: m.solverStatus, gapBounded: m.gapBounded };
    case "solverFailedOnPart":
      return { code: m.code, error: m.error };
    case "timeLimitBeforeProof":
      return { code: m.code, solverStatuses: [...m.solverStatuses] };
    case "approximatePlan":
      return {
        code: m.code,
        householdsToPlace: m.householdsToPlace,
        gapToLpBound: m.gapToLpBound,
        candidatesPerHousehold: m.candidatesPerHousehold,
        pairsAddedByPricing: m.pairsAddedByPricing,
      };
  }
  return m satisfies never;
}

/** The solver's contradictions, then its other messages, as notes in the order it gave them. */
export function solverNotes(result: AssignmentResult, names: ProposalNames): ProposalNote[] {
  const notes: ProposalNote[] = result.contradictions.map((c) => ({
    code: "pinContradiction",
    kind: c.kind,
    household: householdOf(names, c.householdId),
    digester: {
      id: Number(c.digesterId),
      name: c.kind === "unknownDigester" ? null : (names.digester(Number(c.digesterId)) ?? `digester ${c.digesterId}`),
    },
  }));
  for (const m of result.messages) {
    const note = noteOf(m, names);
    if (note) notes.push(note);
  }
  return notes;
}
