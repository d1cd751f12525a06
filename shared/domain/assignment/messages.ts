/**
 * What the assignment solver has to say about a plan, as codes with parameters (HOUSE.md rule
 * 8c): no sentences here. Each audience makes its own words from these — the coordinator's
 * board and the server's API strings from `shared/words/assignment-board.ts`. Ids are the
 * input's ids; distances metres, amounts kg fresh scraps a week.
 */
import type { Fraction, Kg, Metres } from "../../units";

/** Why a household could not be placed: no map location, no valid kg, no available digester within the walking limit, or every reachable digester full. */
export type UnplacedReason = "noLocation" | "invalidAmount" | "noDigesterWithinReach" | "noRoom";

/** What the household can do instead: bring it to the nearest digester another day (haversine metres), or compost at home. */
export type UnplacedSuggestion =
  | { readonly kind: "anotherDay"; readonly digesterId: string; readonly distanceM: Metres }
  | { readonly kind: "compostAtHome" };

/**
 * A household the plan could not place: `reason` is its code, with the parameters its words
 * need and a suggestion (kg fresh scraps a week, 0 when the given amount is not valid).
 */
export interface UnplacedHousehold {
  readonly householdId: string;
  readonly weeklyKg: Kg;
  readonly reason: UnplacedReason;
  readonly suggestion: UnplacedSuggestion;
  /**
   * `noDigesterWithinReach` only: the walking limit, metres, when it is what left every
   * digester taking scraps out of reach; null when no digester takes scraps at all (and for
   * the other reasons).
   */
  readonly walkingLimitM: number | null;
}

/** Why a pin cannot be kept: the digester does not exist, is not available, or earlier pins already fill its room. */
export type PinContradictionKind = "unknownDigester" | "digesterUnavailable" | "pinsOverloadDigester";

/**
 * A pin that cannot be kept; the household is then placed by the solver like any other. Also
 * listed, as the same object, in `AssignmentResult.messages`.
 */
export interface PinContradiction {
  readonly code: "pinContradiction";
  readonly householdId: string;
  readonly digesterId: string;
  readonly kind: PinContradictionKind;
  /** The household's weekly scraps, kg (as given). */
  readonly weeklyKg: number;
  /** The pinned digester's whole weekly room, kg; null when the digester does not exist. */
  readonly weeklyRoomKg: number | null;
}

/**
 * One message of an assignment result: a `code` and the parameters its words need.
 * - `walkingLimitInvalid`: the walking limit is not a distance in metres; no limit was applied.
 * - `duplicateDigester` / `duplicateHousehold`: an id appears twice; only its first entry is used.
 * - `digesterWithoutLocation`: an available digester has no valid location; it receives nobody.
 * - `digesterRoomInvalid`: an available digester's weekly room is not a number ≥ 0; treated as 0 kg.
 * - `digesterWithoutRoom`: a usable digester has 0 kg of room this week; it receives no new scraps.
 * - `noDigesterTakingScraps`: every digester is resting, offline, excluded or without location.
 * - `pinContradiction`: see {@link PinContradiction}.
 * - `pinBeyondWalkingLimit`: a kept pin is farther than the walking limit (haversine metres).
 * - `solverGaveNoPlan`: HiGHS gave no LP point (`solverStatus`), so the plan is the baseline
 *   improved by local search; `gapBounded` tells whether the reported gap still bounds it.
 * - `solverFailedOnPart`: HiGHS threw on part of the network (`error`, its own text); that part
 *   keeps the plan found before and is not proven the best.
 * - `timeLimitBeforeProof`: the time limit stopped HiGHS before a proof; `solverStatuses` are
 *   the statuses other than "Optimal" (empty when no better plan was found).
 * - `householdsUnplaced`: how many households (and kg a week) the plan could not place.
 * - `approximatePlan`: a large network solved by relax-and-round, not proven the best, with
 *   its gap to the bound (null without one) and how candidates were pruned and priced back.
 */
export type AssignmentMessage =
  | { readonly code: "walkingLimitInvalid"; readonly walkingLimitM: number }
  | { readonly code: "duplicateDigester"; readonly digesterId: string }
  | { readonly code: "digesterWithoutLocation"; readonly digesterId: string }
  | { readonly code: "digesterRoomInvalid"; readonly digesterId: string; readonly weeklyRoomKg: number }
  | { readonly code: "digesterWithoutRoom"; readonly digesterId: string }
  | { readonly code: "noDigesterTakingScraps" }
  | { readonly code: "duplicateHousehold"; readonly householdId: string }
  | PinContradiction
  | {
      readonly code: "pinBeyondWalkingLimit";
      readonly householdId: string;
      readonly digesterId: string;
      readonly distanceM: Metres;
      readonly walkingLimitM: number;
    }
  | { readonly code: "solverGaveNoPlan"; readonly solverStatus: string; readonly gapBounded: boolean }
  | { readonly code: "solverFailedOnPart"; readonly error: string }
  | { readonly code: "timeLimitBeforeProof"; readonly solverStatuses: readonly string[] }
  | { readonly code: "householdsUnplaced"; readonly count: number; readonly weeklyKg: Kg }
  | {
      readonly code: "approximatePlan";
      readonly householdsToPlace: number;
      readonly gapToLpBound: Fraction | null;
      readonly candidatesPerHousehold: number;
      readonly pairsAddedByPricing: number;
    };

/** The codes of {@link AssignmentMessage}. */
export type AssignmentMessageCode = AssignmentMessage["code"];
