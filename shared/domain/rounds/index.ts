/**
 * Collection rounds for volunteers with cargo bikes (PRODUCT.md §6).
 *
 * Model. Stops (households that asked for a collection) each carry a load
 * in kg. A round starts at a volunteer's start point, visits some stops and
 * ends at a digester, which must have room for the round's load; rooms are
 * shared by all rounds ending there. A round's load must fit the bike of the
 * volunteer who rides it. A volunteer may ride several rounds, each from
 * their start point (they go home in between; the way home is not counted).
 * Length = start → first stop → … → last stop → digester, straight-line
 * haversine metres (streets add a detour the model does not know). Every
 * leg is capped (default 5 km): a stop far from every volunteer or digester
 * may still be served through its neighbours, and only a stop that no
 * chain of legs within the caps serves is reported out of reach
 * (reachability.ts).
 *
 * Method. A date with at most DEFAULT_EXACT_MAX_STOPS plannable stops gets
 * the exact optimum (exact.ts: fewest stops left out, then shortest). A
 * larger one gets a heuristic, checked against the exact solver in the
 * tests:
 * 1. Savings construction with capacity [Clarke & Wright 1964, "Scheduling
 *    of vehicles from a central depot to a number of delivery points",
 *    Operations Research 12(4):568–581, memory], generalised to open routes
 *    with many origins and ends: joining a route ending at i to one starting
 *    at j saves end(i) + start(j) − λ·d(i, j), where start/end are the
 *    nearest volunteer start / digester (a large penalty when none is
 *    within the cap, so stops reached only through a neighbour are joined
 *    to it first); λ is the shape parameter of the parametric savings
 *    [Yellow 1970, Oper. Res. Q. 21:281, memory]. A join is made only if
 *    the true cost falls and the load fits some bike. Each round is then
 *    ordered by 2-opt [Croes 1958, "A method for solving traveling-salesman
 *    problems", Operations Research 6(6):791–812, memory].
 * 2. Ends: rounds are given digesters by regret [Martello & Toth 1981,
 *    memory] so that no digester receives more than its room; stops no
 *    digester can take are re-inserted where room is left, or reported.
 * 3. Local search across rounds with shared rooms (relocate, swap, or-opt,
 *    2-opt*, split; 2-opt inside rounds) and ruin-and-recreate iterations,
 *    seeded so the plan is reproducible.
 * 4. Each round gets the nearest volunteer whose bike fits.
 * Several λ are tried and the shortest plan kept. Measured against the
 * exact optimum on random 1–9-stop cases: see tests/shared/rounds.test.ts.
 *
 * Files: model.ts (input, options, caps), network.ts (legs and shared
 * costs), reachability.ts (which stops any round can serve), construction.ts
 * and improvement.ts (the heuristic), exact.ts (small dates), lower-bound.ts
 * (how far a plan may be from the optimum), assemble.ts and result.ts (the
 * plan returned: rounds, and codes with figures for what was left out).
 */
export {
  type CollectionDigester,
  type CollectionRoundsInput,
  type CollectionRoundsOptions,
  type CollectionStop,
  type CollectionVolunteer,
  DEFAULT_MAX_END_LEG_M,
  DEFAULT_MAX_LEG_M,
} from "./model";
export type {
  CollectionPlan,
  CollectionPlanMessage,
  CollectionRound,
  RoundStop,
  UnplacedStop,
  UnplacedStopReason,
} from "./result";
export { DEFAULT_EXACT_MAX_STOPS, planCollectionRounds } from "./plan";
export { defaultImprovementIterations } from "./improvement";
export { EXACT_ROUNDS_MAX_STEPS, EXACT_ROUNDS_MAX_STOPS, exactCollectionRounds } from "./exact";
export { collectionRoundsLowerBoundM } from "./lower-bound";
