/**
 * What the planner returns: rounds in riding order, the stops it could not
 * plan with the reason, and the load delivered to each digester.
 */
import type { Kg, Metres } from "../../units";

/** One stop of a round, in riding order. */
export interface RoundStop {
  readonly householdId: string;
  readonly loadKg: Kg;
  readonly lat: number;
  readonly lng: number;
  /** Distance from the previous point (start or stop), metres. */
  readonly legM: Metres;
}

/** One round: a volunteer, stops in order, the digester it ends at; lengths in haversine metres. */
export interface CollectionRound {
  readonly volunteerId: string;
  readonly stops: readonly RoundStop[];
  readonly endDigesterId: string;
  readonly loadKg: Kg;
  /** Start → stops → digester, metres. */
  readonly lengthM: Metres;
  readonly endLegM: Metres;
}

/** Why a stop could not be planned: a code; the words are made where they are shown. */
export type UnplacedStopReason =
  "noLocation" | "invalidLoad" | "heavierThanAnyBike" | "noDigesterWithRoom" | "noDigesterWithinReach" | "noVolunteer";

/**
 * A stop left out of every round: its reason code and the figures that
 * reason refers to (rule: results carry codes and parameters, not prose).
 */
export type UnplacedStop = {
  readonly householdId: string;
  /** Its load, kg (0 when the load given was not a number). */
  readonly loadKg: Kg;
} & (
  | { readonly reason: "noLocation" }
  | { readonly reason: "invalidLoad" }
  | {
      readonly reason: "heavierThanAnyBike";
      /** The largest cargo-bike load of the volunteers available, kg. */
      readonly largestBikeKg: Kg;
    }
  | {
      readonly reason: "noDigesterWithRoom";
      /**
       * False: no digester has room for this load on the date at all.
       * True: digesters within reach had room for it alone, but the date's
       * other rounds use that room.
       */
      readonly takenByOtherRounds: boolean;
      /** The most room any digester has on the date, kg. */
      readonly largestRoomKg: Kg;
      /** The cap on the last leg in force, metres. */
      readonly maxEndLegM: Metres;
    }
  | {
      readonly reason: "noDigesterWithinReach";
      /** The caps in force: start and stop-to-stop legs, last leg, metres. */
      readonly maxLegM: Metres;
      readonly maxEndLegM: Metres;
    }
  | {
      readonly reason: "noVolunteer";
      /** Volunteers with a valid start point and bike load on the date (0: nobody at all). */
      readonly volunteersAvailable: number;
      /** The cap on the start and stop-to-stop legs in force, metres. */
      readonly maxLegM: Metres;
    }
);

/** Something the coordinator should know about a plan's input: a code and its parameters. */
export type CollectionPlanMessage =
  /** A volunteer without a valid start point or a positive bike load was left out. */
  | { readonly code: "volunteerLeftOut"; readonly volunteerId: string }
  /** A digester without a valid location was left out; no round ends there. */
  | { readonly code: "digesterLeftOut"; readonly digesterId: string }
  /** There are stops but no volunteer who can ride. */
  | { readonly code: "noVolunteers" }
  /** Some stops could not be planned; each is in {@link CollectionPlan.unplacedStops} with its reason. */
  | { readonly code: "stopsUnplaced"; readonly count: number };

/** The rounds for one date, what could not be planned, and the load delivered to each digester. */
export interface CollectionPlan {
  /** "exact": the best plan (fewest stops left out, then shortest); "heuristic": a good one, see index.ts. */
  readonly method: "exact" | "heuristic";
  readonly rounds: readonly CollectionRound[];
  readonly unplacedStops: readonly UnplacedStop[];
  readonly totalLengthM: Metres;
  /** Load delivered to each digester across rounds, against its room. */
  readonly digesterLoads: readonly { readonly digesterId: string; readonly loadKg: Kg; readonly roomKg: Kg }[];
  readonly messages: readonly CollectionPlanMessage[];
}
