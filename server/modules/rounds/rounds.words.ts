/**
 * The coordinator's words for what the rounds planner reports (shared/domain/rounds/ returns codes
 * and figures): why a request was left out of the rounds, and notes about the plan's input. The plan
 * answer (`POST /api/collection-rounds/plan`) carries these sentences; nothing parses them back.
 */
import type { CollectionPlanMessage, UnplacedStop } from "../../../shared/domain/rounds";

const km = (m: number) => `${Math.round(m / 100) / 10} km`;
const kgText = (x: number) => `${Math.round(x * 10) / 10} kg`;

/** Why a request was left out, for the coordinator: starts with the household's name. */
export function unplacedStopWords(stop: UnplacedStop, householdName: string | undefined): string {
  return `${householdName || "A request"}: ${unplacedReasonWords(stop)}`;
}

function unplacedReasonWords(stop: UnplacedStop): string {
  switch (stop.reason) {
    case "noLocation":
      return "the household has no location on the map; add one, or ask them to bring the buckets.";
    case "invalidLoad":
      return "the request has no valid number of buckets.";
    case "heavierThanAnyBike":
      return `more buckets (${kgText(stop.loadKg)}) than any volunteer's cargo bike can carry (at most ${kgText(stop.largestBikeKg)}); split it over two days.`;
    case "noDigesterWithRoom":
      return stop.takenByOtherRounds
        ? `the other rounds of this date use the room left at the digesters within ${km(stop.maxEndLegM)}, or the stops it would be reached through; plan it another day.`
        : `no digester has room for ${kgText(stop.loadKg)} on this date (at most ${kgText(stop.largestRoomKg)}); plan it another day.`;
    case "noDigesterWithinReach":
      return `no digester with room can be reached from it, riding at most ${km(stop.maxLegM)} between stops and ${km(stop.maxEndLegM)} to the digester; plan it another day or ask the household to bring the buckets.`;
    case "noVolunteer":
      return stop.volunteersAvailable === 0
        ? "no volunteer with a cargo bike is available; mark someone as a volunteer on the people page."
        : `no volunteer with a big enough cargo bike can reach it, riding at most ${km(stop.maxLegM)} from their start or between stops; plan it another day or find a volunteer nearby.`;
  }
}

/** Names the planner's notes use; the ids are the ones the service gave the planner. */
export interface PlanNames {
  volunteer(id: string): string | undefined;
  digester(id: string): string | undefined;
}

/** A note about the plan's input, for the coordinator. */
export function planMessageWords(message: CollectionPlanMessage, names: PlanNames): string {
  switch (message.code) {
    case "volunteerLeftOut":
      return `${names.volunteer(message.volunteerId) ?? "A volunteer"} has no valid start point or bike load; left out of the rounds.`;
    case "digesterLeftOut":
      return `${names.digester(message.digesterId) ?? "A digester"} has no valid location on the map; no round ends there.`;
    case "noVolunteers":
      return "No volunteer with a cargo bike is available for these collections.";
    case "stopsUnplaced":
      return message.count === 1
        ? "1 collection could not be planned; see the list for the reason."
        : `${message.count} collections could not be planned; see the list for the reasons.`;
  }
}
