/**
 * The result of an assignment: what the solver returns, and its assembly from a prepared input
 * and a solution path's plan.
 */
import { type Fraction, type Kg, type Metres, fraction, kg, metres } from "../../units";
import { haversineM } from "../geo";
import type {
  AssignmentMessage,
  PinContradiction,
  UnplacedHousehold,
  UnplacedReason,
  UnplacedSuggestion,
} from "./messages";
import { costOf } from "./model";
import { type Prepared, roundDm } from "./prepare";

/** One household placed at one digester; distance is haversine metres (see geo.ts). */
export interface HouseholdAssignment {
  readonly householdId: string;
  readonly digesterId: string;
  readonly distanceM: Metres;
  readonly weeklyKg: Kg;
  readonly pinned: boolean;
}

/** Weekly kg assigned to a digester against its weekly room (0 for a digester that takes nobody). */
export interface DigesterLoad {
  readonly digesterId: string;
  readonly available: boolean;
  readonly loadKg: Kg;
  readonly roomKg: Kg;
  /** load / room; null when the room is 0. */
  readonly utilisation: Fraction | null;
  readonly householdCount: number;
}

/**
 * How the plan was found: exact MIP path, LP-round-repair path, the baseline
 * rule, local search from the baseline when HiGHS gave no point, or nothing
 * to optimise.
 */
export type AssignmentMethod =
  "exactMip" | "lpRoundRepair" | "nearestWithRoom" | "localSearchFallback" | "nothingToSolve";

/** A proposed plan with its figures; `objectiveM`, `lpBoundM` and `gapToLpBound` are in metres of the model objective (see index.ts). */
export interface AssignmentResult {
  readonly assignments: readonly HouseholdAssignment[];
  readonly digesterLoads: readonly DigesterLoad[];
  readonly unplaced: readonly UnplacedHousehold[];
  readonly contradictions: readonly PinContradiction[];
  /** What the solver has to say about this plan, as codes with parameters (see messages.ts), in the order found. */
  readonly messages: readonly AssignmentMessage[];
  /** Σ haversine distance of all assignments (pins included), metres. */
  readonly totalDistanceM: Metres;
  readonly placedKg: Kg;
  readonly unplacedKg: Kg;
  /** Model objective: distances (decimetre-rounded) + penalties of households the model could not place, metres. */
  readonly objectiveM: number;
  /** Valid lower bound on `objectiveM` over every feasible plan (LP/Lagrangian, §2 of index.ts); null when not computed. */
  readonly lpBoundM: number | null;
  /** (objective − bound) / bound; 0 when both are 0; null without a bound. */
  readonly gapToLpBound: Fraction | null;
  /** True only when HiGHS (or the bound) proved that no plan has a smaller objective. */
  readonly provenOptimal: boolean;
  readonly method: AssignmentMethod;
  /** Status of the last HiGHS solve ("Optimal", "Time limit reached", …) or why none ran. */
  readonly solverStatus: string;
  /** Relax-and-round only: how candidate pairs were pruned and how many pricing added back. */
  readonly pruning: { readonly candidatesPerHousehold: number; readonly pairsAddedByPricing: number } | null;
  /** Binary variables in the largest model sent to HiGHS. */
  readonly modelVariables: number;
}

/** What a solution path hands to {@link assemble}: the plan over the model's items, how it was found, and its messages. */
export interface SolveOutcome {
  assign: Int32Array;
  method: AssignmentMethod;
  status: string;
  boundDm: number | null;
  proven: boolean;
  pruning: AssignmentResult["pruning"];
  modelVariables: number;
  notes: AssignmentMessage[];
}

/**
 * The result of a solve: pins and the plan as assignments with haversine metres (not the
 * model's decimetres), loads against rooms, unplaced households with reason and suggestion,
 * the objective and bound in metres (pins' rounded walks added to both, the bound capped at
 * the plan's own cost), gap = (objective − bound) / bound, and the messages: preparation's,
 * contradictions, the path's notes, then `householdsUnplaced` and `approximatePlan`.
 */
export function assemble(prep: Prepared, outcome: SolveOutcome): AssignmentResult {
  const { input, model } = prep;
  const { households, digesters } = input;
  const assignments: HouseholdAssignment[] = [];
  const load = new Float64Array(digesters.length);
  const count = new Int32Array(digesters.length);
  let totalM = 0;
  let placedKg = 0;
  const add = (hi: number, d: number, pinned: boolean) => {
    const h = households[hi]!;
    const distanceM = haversineM({ lat: h.lat!, lng: h.lng! }, digesters[d]!);
    totalM += distanceM;
    placedKg += h.weeklyKg;
    load[d] = load[d]! + h.weeklyKg;
    count[d] = count[d]! + 1;
    assignments.push({
      householdId: h.id,
      digesterId: digesters[d]!.id,
      distanceM: metres(distanceM),
      weeklyKg: kg(h.weeklyKg),
      pinned,
    });
  };
  let pinnedCostDm = 0;
  for (const [hi, d] of prep.pinned) {
    add(hi, d, true);
    const h = households[hi]!;
    pinnedCostDm += roundDm(haversineM({ lat: h.lat!, lng: h.lng! }, digesters[d]!));
  }
  const unplaced: UnplacedHousehold[] = [];
  const unplace = (hi: number, reason: UnplacedReason, nearest: { d: number; m: number } | null) => {
    const h = households[hi]!;
    const w = Number.isFinite(h.weeklyKg) && h.weeklyKg > 0 ? h.weeklyKg : 0;
    const suggestion: UnplacedSuggestion =
      reason === "noRoom" && nearest
        ? { kind: "anotherDay", digesterId: digesters[nearest.d]!.id, distanceM: metres(nearest.m) }
        : { kind: "compostAtHome" };
    const limit = input.maxWalkingDistanceM;
    const walkingLimitM =
      reason === "noDigesterWithinReach" &&
      typeof limit === "number" &&
      Number.isFinite(limit) &&
      prep.usable.some(Boolean)
        ? limit
        : null;
    unplaced.push({ householdId: h.id, weeklyKg: kg(w), reason, suggestion, walkingLimitM });
  };
  for (const u of prep.preUnplaced) unplace(u.household, u.reason, null);
  let freeCostDm = 0;
  model.items.forEach((item, i) => {
    const hi = prep.itemHousehold[i]!;
    const d = outcome.assign[i]!;
    freeCostDm += costOf(item, d);
    if (d >= 0) add(hi, d, false);
    else unplace(hi, "noRoom", { d: item.digesters[0]!, m: item.costsDm[0]! / 10 });
  });
  const digesterLoads: DigesterLoad[] = digesters.map((d, j) => {
    const room = prep.fullRoomKg[j]!;
    return {
      digesterId: d.id,
      available: prep.usable[j]!,
      loadKg: kg(load[j]!),
      roomKg: kg(room),
      utilisation: room > 0 ? fraction(load[j]! / room) : null,
      householdCount: count[j]!,
    };
  });
  const objectiveDm = pinnedCostDm + freeCostDm;
  const boundDm = outcome.boundDm === null ? null : pinnedCostDm + Math.min(outcome.boundDm, freeCostDm);
  const gap =
    boundDm === null
      ? null
      : boundDm > 0
        ? fraction(Math.max(0, (objectiveDm - boundDm) / boundDm))
        : objectiveDm <= 1e-9
          ? fraction(0)
          : null;
  const messages: AssignmentMessage[] = [...prep.messages, ...prep.contradictions, ...outcome.notes];
  const unplacedKg = unplaced.reduce((s, u) => s + u.weeklyKg, 0);
  if (unplaced.length > 0)
    messages.push({ code: "householdsUnplaced", count: unplaced.length, weeklyKg: kg(unplacedKg) });
  if (outcome.pruning) {
    messages.push({
      code: "approximatePlan",
      householdsToPlace: model.items.length,
      gapToLpBound: gap,
      candidatesPerHousehold: outcome.pruning.candidatesPerHousehold,
      pairsAddedByPricing: outcome.pruning.pairsAddedByPricing,
    });
  }
  return {
    assignments,
    digesterLoads,
    unplaced,
    contradictions: prep.contradictions,
    messages,
    totalDistanceM: metres(totalM),
    placedKg: kg(placedKg),
    unplacedKg: kg(unplacedKg),
    objectiveM: objectiveDm / 10,
    lpBoundM: boundDm === null ? null : boundDm / 10,
    gapToLpBound: gap,
    provenOptimal: outcome.proven,
    method: outcome.method,
    solverStatus: outcome.status,
    pruning: outcome.pruning,
    modelVariables: outcome.modelVariables,
  };
}
