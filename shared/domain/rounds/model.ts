/**
 * The collection-rounds model: what the planner is given (stops, volunteers,
 * digesters), its tuning, and the default caps on a leg.
 */

/** A household that asked for a collection on the date planned. */
export interface CollectionStop {
  readonly householdId: string;
  readonly lat: number | null;
  readonly lng: number | null;
  /** Load to collect, kg (buckets × kg per bucket, computed by the caller). */
  readonly loadKg: number;
}

/** A volunteer with a cargo bike. */
export interface CollectionVolunteer {
  readonly id: string;
  /** Where the volunteer's rounds start. */
  readonly lat: number;
  readonly lng: number;
  /** Most the cargo bike may carry, kg. */
  readonly bikeLoadKg: number;
}

/** A digester a round may end at. */
export interface CollectionDigester {
  readonly id: string;
  readonly lat: number;
  readonly lng: number;
  /** Scraps it may still take on the collection date, kg (from its feed budget). */
  readonly roomKg: number;
}

/** Input of {@link planCollectionRounds}, {@link exactCollectionRounds} and {@link collectionRoundsLowerBoundM}. */
export interface CollectionRoundsInput {
  readonly stops: readonly CollectionStop[];
  readonly volunteers: readonly CollectionVolunteer[];
  readonly digesters: readonly CollectionDigester[];
}

/** Tuning of {@link planCollectionRounds}; the defaults suit the product. */
export interface CollectionRoundsOptions {
  /** Savings shape parameters λ to try; default [1, 0.6, 1.4]. */
  readonly savingsShapes?: readonly number[];
  /**
   * Randomised restarts for benchmarking: multiplies each saving by
   * (1 + noise·(u − 0.5)), u from a seeded generator. Default none.
   */
  readonly perturbation?: { readonly seed: number; readonly noise: number };
  /**
   * Up to how many plannable stops the exact solver plans the date instead
   * of the heuristic; 0 always uses the heuristic. Default
   * DEFAULT_EXACT_MAX_STOPS (plan.ts).
   */
  readonly exactMaxStops?: number;
  /** Ruin-and-recreate iterations after construction; default {@link defaultImprovementIterations}. */
  readonly improvementIterations?: number;
  /**
   * Longest ride from a round's last stop to the digester it ends at,
   * metres; a digester further away is not used. Default
   * {@link DEFAULT_MAX_END_LEG_M}.
   */
  readonly maxEndLegM?: number;
  /**
   * Longest ride from a volunteer's start to a first stop, or between two
   * stops, metres; longer legs are never ridden. Default
   * {@link DEFAULT_MAX_LEG_M}.
   */
  readonly maxLegM?: number;
}

/**
 * Default cap on the other legs of a round, metres [judgement: the same
 * neighbourhood scale as {@link DEFAULT_MAX_END_LEG_M}; stops further apart
 * belong to different rounds, or to another day].
 */
export const DEFAULT_MAX_LEG_M = 5000;

/**
 * Default cap on the ride from the last stop to the digester, metres
 * [judgement: with a loaded cargo bike, more than about 5 km after the last
 * stop is longer than a whole neighbourhood round; such a collection is
 * better moved to another day than ridden across town].
 */
export const DEFAULT_MAX_END_LEG_M = 5000;

/** Slack on kg comparisons, so that rounding never refuses a load that fits exactly. */
export const KG_EPS = 1e-9;
