/** What the assignment solver is given: households, digesters, the walking limit, and tuning. */

/** A household to place. `lat`/`lng` null or invalid = no location on the map. */
export interface AssignmentHousehold {
  readonly id: string;
  readonly lat: number | null;
  readonly lng: number | null;
  /** Expected scraps per week, kg fresh (from its last 8 weeks, or declared when new). */
  readonly weeklyKg: number;
  /** A coordinator's pin: this household must go to this digester. */
  readonly pinnedDigesterId?: string | null;
}

/** A digester that may receive households. */
export interface AssignmentDigester {
  readonly id: string;
  readonly lat: number;
  readonly lng: number;
  /** Sum of the next 7 days' feed budgets, kg fresh scraps (caller computes it from the feed budget). */
  readonly weeklyRoomKg: number;
  /** False when resting, offline or excluded by the coordinator: receives nobody. */
  readonly available: boolean;
}

/** Input of `solveAssignment` and `nearestWithRoomBaseline`. */
export interface AssignmentInput {
  readonly households: readonly AssignmentHousehold[];
  readonly digesters: readonly AssignmentDigester[];
  /** Optional walking limit, metres: pairs farther apart are not allowed (pins excepted, with a message). */
  readonly maxWalkingDistanceM?: number | null;
}

/** Tuning of `solveAssignment`; the defaults suit the product. */
export interface AssignmentOptions {
  /** "auto" (default): exact up to the limits below, relax-and-round above them. */
  readonly mode?: "auto" | "exact" | "relaxAndRound";
  /** Above this many households to optimise, "auto" relaxes and rounds. Default 2000. */
  readonly exactMaxHouseholds?: number;
  /** Above this many model variables, "auto" relaxes and rounds. Default 100 000. */
  readonly exactMaxVariables?: number;
  /** Relax-and-round: candidate digesters kept per household (smallest Lagrangian reduced cost) before pricing. Default 5. */
  readonly candidatesPerHousehold?: number;
  /** Relax-and-round: LP re-solves allowed to add priced-out pairs. Default 1. */
  readonly pricingRounds?: number;
  /** HiGHS time limit per solve, seconds. Default 10; a MIP stopped by it returns the best plan found, not proven. */
  readonly timeLimitS?: number;
  /** Relax-and-round: also run the polish MIP (always run on the exact path). Default false: on large networks it rarely finds better within its time. */
  readonly polish?: boolean;
  /** LP algorithm passed to HiGHS for the relaxation. Default "choose". */
  readonly lpAlgorithm?: "choose" | "simplex" | "ipm";
}
