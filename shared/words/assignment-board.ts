/**
 * The coordinator's words for the assignment board: the one place where a proposal's codes
 * (shared/schemas/assignments.ts) become sentences for a coordinator (HOUSE.md rule 8c). The
 * board (src/features/coordinator) shows them from the codes, and the server fills the API's
 * `messages`, `unplaced[].message` and `unplaced[].suggestion` with the same words, so an API
 * reader sees what the board shows. Plain functions of their parameters: no lookups, no clock.
 * The residents' e-mails have their own words (server/modules/assignments/assignments.emails.ts).
 */
import type { ProposalNote, ProposalUnplaced } from "../schemas/assignments";

const round1 = (x: number) => Math.round(x * 10) / 10;
const digesterLabel = (d: { id: number; name: string | null }) => d.name ?? `digester ${d.id}`;
/** "1 household has" / "3 households have". */
const householdsHave = (n: number) => `${n} household${n === 1 ? " has" : "s have"}`;

/** A note about a proposal in the coordinator's words (one sentence or two). */
export function proposalNoteWords(note: ProposalNote): string {
  switch (note.code) {
    case "excludedDigesterUnknown":
      return `Digester ${note.digesterId} to exclude does not exist; ignored.`;
    case "pinHouseholdUnknown":
      return `Pin ignored: household ${note.householdId} does not exist.`;
    case "pinsContradictory":
      return `Contradictory pins: ${note.household.name} is pinned to both ${note.keptDigester.name} and ${note.droppedDigester.name}; the first pin is kept.`;
    case "pinContradiction": {
      const who = note.household.name;
      switch (note.kind) {
        case "unknownDigester":
          return `Contradictory pin: ${who} is pinned to a digester that does not exist (${note.digester.id}); it is placed like any other household.`;
        case "digesterUnavailable":
          return `Contradictory pin: ${who} is pinned to ${digesterLabel(note.digester)}, which is resting, offline or excluded; it is placed like any other household.`;
        case "pinsOverloadDigester":
          return `Contradictory pin: the households pinned to ${digesterLabel(note.digester)} bring more than its weekly room; ${who} is placed like any other household.`;
      }
      return note.kind satisfies never;
    }
    case "walkingLimitInvalid":
      return `The walking limit${note.walkingLimitM === null ? "" : ` (${note.walkingLimitM})`} is not a distance in metres; no limit was applied.`;
    case "duplicateDigester":
      return `${note.digester.name} appears twice; only its first entry is used.`;
    case "duplicateHousehold":
      return `${note.household.name} appears twice; only its first entry is used.`;
    case "digesterWithoutLocation":
      return `${note.digester.name} has no valid location; it receives nobody.`;
    case "digesterRoomInvalid":
      return `${note.digester.name} has no valid weekly room (${note.weeklyRoomKg}); treated as 0 kg.`;
    case "pinBeyondWalkingLimit":
      return `${note.household.name} is pinned to ${note.digester.name} at ${Math.round(note.distanceM)} m, beyond the ${note.walkingLimitM} m walking limit; the pin is kept.`;
    case "solverGaveNoPlan":
      return `The solver did not solve this network (${note.solverStatus}), so this plan comes from the nearest digester with room, improved by moving households one at a time; ${note.gapBounded ? "the gap shown bounds how far it is from the best possible" : "how far it is from the best possible is unknown"}.`;
    case "solverFailedOnPart":
      return `The solver failed on part of the network (${note.error}); that part keeps the plan found before and is not proven the best.`;
    case "timeLimitBeforeProof":
      return `The solver reached its time limit before proving this plan the best (${note.solverStatuses.join(", ") || "no better plan"}); it is within the gap shown of the best possible.`;
    case "approximatePlan":
      return `This network is large (${note.householdsToPlace} households to place), so the plan was found approximately${note.gapToLpBound === null ? "" : `: it is at most ${(note.gapToLpBound * 100).toFixed(2)} % longer in walking than the best possible`}; it is not proven the best. (Method: LP relaxation over each household's ${note.candidatesPerHousehold} most promising digesters, ${note.pairsAddedByPricing} more priced back in, rounded, repaired and improved.)`;
    case "householdsWithoutLocation": {
      const n = note.households.length;
      const names = note.households
        .slice(0, 5)
        .map((h) => h.name)
        .join(", ");
      return `${householdsHave(n)} no location on the map (${names}${n > 5 ? ", …" : ""}); add one so they can be assigned.`;
    }
    case "walkingLimitUnreachable":
      return `The maximum walk of ${Math.round(note.walkingLimitM)} m cannot be met: ${householdsHave(note.householdCount)} no open digester that close. A limit of ${Math.ceil(note.neededM)} m would reach them all.`;
    case "noDigesterTakingScraps":
      return "No digester is taking scraps this week (all resting, offline or excluded).";
    case "digestersWithoutRoom": {
      const n = note.digesters.length;
      const names = note.digesters
        .slice(0, 5)
        .map((d) => d.name)
        .join(", ");
      return `${names}${n > 5 ? ` and ${n - 5} more` : ""} ${n === 1 ? "has" : "have"} no room this week (no temperature reading in 3 days, an acid warning, or a week already full), so ${n === 1 ? "it takes" : "they take"} no households.`;
    }
  }
  return note satisfies never;
}

/** Why a household was not placed, in the coordinator's words. */
export function unplacedWords(
  u: Pick<ProposalUnplaced, "reason" | "householdName" | "weeklyKg" | "walkingLimitM">,
): string {
  const name = u.householdName;
  switch (u.reason) {
    case "noLocation":
      return `${name} has no location on the map.`;
    case "invalidAmount":
      return `${name} has no valid weekly amount.`;
    case "noDigesterWithinReach":
      return u.walkingLimitM !== null
        ? `No open digester within ${Math.round(u.walkingLimitM)} m of ${name}.`
        : `No digester is open for ${name}.`;
    case "noRoom":
      return `Every digester within reach of ${name} is full this week (${round1(u.weeklyKg)} kg to place).`;
  }
  return u.reason satisfies never;
}

/** What a household not placed could do instead, in the coordinator's words. */
export function suggestionWords(u: Pick<ProposalUnplaced, "suggestedAction">): string {
  const action = u.suggestedAction;
  switch (action.code) {
    case "anotherDay":
      return `Bring the scraps to ${action.digesterName} (${Math.round(action.distanceM)} m) on another day, or compost at home.`;
    case "compostAtHome":
      return "Compost at home until there is room.";
  }
  return action satisfies never;
}

const METHOD_WORDS: Readonly<Record<string, string>> = {
  exactMip: "Exact solver (HiGHS)",
  lpRoundRepair: "Large network: solved approximately, with a bound on how far off it can be",
  localSearchFallback: "The solver could not finish; nearest digester with room, improved",
  nearestWithRoom: "Nearest digester with room",
  nothingToSolve: "Nothing to place",
};

/** How the plan was found (`Proposal.method`), in the coordinator's words; an unknown method shows as itself. */
export function methodWords(method: string): string {
  return METHOD_WORDS[method] ?? method;
}
