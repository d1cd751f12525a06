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

/** Why a stop could not be planned. */
export type UnplacedStopReason =
  "noLocation" | "invalidLoad" | "heavierThanAnyBike" | "noDigesterWithRoom" | "noDigesterWithinReach" | "noVolunteer";

/** A stop left out of every round, with the reason and a sentence for the coordinator. */
export interface UnplacedStop {
  readonly householdId: string;
  readonly loadKg: Kg;
  readonly reason: UnplacedStopReason;
  readonly message: string;
}

/** The rounds for one date, what could not be planned, and the load delivered to each digester. */
export interface CollectionPlan {
  readonly rounds: readonly CollectionRound[];
  readonly unplacedStops: readonly UnplacedStop[];
  readonly totalLengthM: Metres;
  /** Load delivered to each digester across rounds, against its room. */
  readonly digesterLoads: readonly { readonly digesterId: string; readonly loadKg: Kg; readonly roomKg: Kg }[];
  readonly messages: readonly string[];
}
