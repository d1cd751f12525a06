/**
 * Solve: the entry points of the assignment solver — the optimised plan and the baseline rule
 * it is compared with — and the solution paths between preparation and result.
 */
import {
  CANDIDATE_SUBGRADIENT_STEPS,
  type ReducedCosts,
  candidatesByReducedCost,
  improveMultipliers,
  lagrangianBound,
} from "./bounds";
import { greedyNearestWithRoom, heuristicPlan } from "./heuristics";
import type { AssignmentInput, AssignmentOptions } from "./input";
import type { AssignmentMessage } from "./messages";
import { planObjectiveDm } from "./model";
import { prepare, type Prepared } from "./prepare";
import { relax } from "./relaxation";
import {
  POLISH_EXTRA_COLUMNS,
  POLISH_TIME_LIMIT_S,
  optionsWithin,
  polishThreshold,
  solveRestricted,
} from "./restricted-mip";
import { type AssignmentResult, type SolveOutcome, assemble } from "./result";
import { roundPoint } from "./solution-reader";
import type { HighsOptionsLike, LpSolver } from "./solver-seam";

/**
 * The two solution paths (index.ts §1–4): LP relaxation (pruned and priced on large networks),
 * round-repair-improve, the Lagrangian bound; then, unless the plan already closes the bound,
 * the polish MIP and — exact path only — reduced-cost fixing and the restricted MIP to a zero
 * gap. Without an LP point, the baseline improved by local search (`localSearchFallback`).
 */
function solveCore(prep: Prepared, solver: LpSolver, options: AssignmentOptions): SolveOutcome {
  const model = prep.model;
  const n = model.items.length;
  const notes: AssignmentMessage[] = [];
  const timeLimit = options.timeLimitS ?? 10;
  const variables = prep.pairCount + n;
  const wantExact =
    options.mode === "exact" ||
    (options.mode !== "relaxAndRound" &&
      n <= (options.exactMaxHouseholds ?? 2000) &&
      variables <= (options.exactMaxVariables ?? 100_000));
  const lpOptions: HighsOptionsLike = {
    output_flag: false,
    time_limit: timeLimit,
    solver: options.lpAlgorithm ?? "choose",
  };

  let subset: number[][] | undefined;
  const k = Math.max(1, Math.floor(options.candidatesPerHousehold ?? 5));
  let preBound: { multipliers: Float64Array; boundDm: number } | null = null;
  if (!wantExact) {
    // Large networks: multipliers from subgradient steps over all pairs (cheap, in JS) choose each household's
    // candidates by reduced cost, where the LP optimum lives, instead of by distance alone.
    const greedyUb = planObjectiveDm(model, greedyNearestWithRoom(model).assign);
    preBound = improveMultipliers(model, new Float64Array(model.roomKg.length), greedyUb, CANDIDATE_SUBGRADIENT_STEPS);
    subset = candidatesByReducedCost(model, preBound.multipliers, k);
  }
  const relaxed = relax(model, solver, subset, wantExact ? 0 : (options.pricingRounds ?? 1), lpOptions);
  const read = relaxed.read;
  const plan = heuristicPlan(model, read?.hasPoint ? roundPoint(model, read, relaxed.subset) : null);
  const heuristicUb = planObjectiveDm(model, plan.assign);
  let boundDm: number | null = null;
  let itemMin: Float64Array | null = null;
  let v: Float64Array = new Float64Array(model.roomKg.length);
  if (read?.hasPoint) {
    v = read.capacityMultipliers;
    if (relaxed.subset && !relaxed.complete) {
      // Over pruned pairs the LP duals may under-price the rest; keep the best valid multipliers found.
      // (When pricing found nothing, the duals are optimal for all pairs and the bound is the LP bound.)
      const polished = improveMultipliers(model, v, heuristicUb, 40);
      if (polished.boundDm > lagrangianBound(model, v).boundDm) v = polished.multipliers;
      if (preBound && preBound.boundDm > lagrangianBound(model, v).boundDm) v = preBound.multipliers;
    }
    const lb = lagrangianBound(model, v);
    boundDm = lb.boundDm;
    itemMin = lb.itemMinDm;
  } else {
    if (preBound) boundDm = preBound.boundDm;
    notes.push({ code: "solverGaveNoPlan", solverStatus: relaxed.status, gapBounded: preBound !== null });
  }
  const pruning = wantExact ? null : { candidatesPerHousehold: k, pairsAddedByPricing: relaxed.added };
  const lpVariables = relaxed.variables;
  if (boundDm === null || itemMin === null) {
    return {
      assign: plan.assign,
      method: "localSearchFallback",
      status: relaxed.status,
      boundDm,
      proven: false,
      pruning,
      modelVariables: lpVariables,
      notes,
    };
  }
  const bound = boundDm;
  const mins = itemMin;
  const rc: ReducedCosts = {
    option: (i, p) => {
      const item = model.items[i]!;
      return item.costsDm[p]! + item.kg * v[item.digesters[p]!]! - mins[i]!;
    },
    unplaced: (i) => model.items[i]!.penaltyDm - mins[i]!,
    itemMin: mins,
  };
  const tolOf = (x: number) => 1e-6 * Math.max(1, Math.abs(x));
  // Costs are whole decimetres, so a plan is optimal once it is below the next whole decimetre above the bound.
  const closes = (x: number) => x <= Math.ceil(bound - 1e-9 * Math.max(1, Math.abs(bound))) + 1e-9;
  let assign = plan.assign;
  let ub = planObjectiveDm(model, assign);
  let status = relaxed.status;
  let modelVariables = lpVariables;
  if (closes(ub)) {
    return {
      assign,
      method: wantExact ? "exactMip" : "lpRoundRepair",
      status,
      boundDm: bound,
      proven: true,
      pruning,
      modelVariables,
      notes,
    };
  }

  if (!wantExact && !(options.polish ?? false)) {
    return {
      assign,
      method: "lpRoundRepair",
      status,
      boundDm: bound,
      proven: closes(ub),
      pruning,
      modelVariables,
      notes,
    };
  }
  // Polish: a small MIP over the options of smallest reduced cost (plus the incumbent's), under a thousand
  // columns, split into independent parts. A heuristic: it only improves the incumbent.
  const polishKeep = optionsWithin(model, assign, rc, polishThreshold(model, rc, ub - bound, POLISH_EXTRA_COLUMNS));
  const polished = solveRestricted(model, assign, polishKeep, solver, Math.min(timeLimit, POLISH_TIME_LIMIT_S));
  modelVariables = Math.max(modelVariables, polished.variables);
  if (polished.objectiveDm < ub - 1e-9) {
    assign = polished.assign;
    ub = polished.objectiveDm;
    status = polished.statuses.at(-1) ?? status;
  }
  if (!wantExact) {
    return {
      assign,
      method: "lpRoundRepair",
      status,
      boundDm: bound,
      proven: closes(ub),
      pruning,
      modelVariables,
      notes,
    };
  }
  if (closes(ub)) {
    return { assign, method: "exactMip", status, boundDm: bound, proven: true, pruning, modelVariables, notes };
  }

  // Exact: reduced-cost fixing. A pair whose reduced cost exceeds UB − LB cannot be in any plan better than
  // the incumbent (c·x ≥ LB + Σ reduced costs of the pairs used), so only the rest is searched, exactly.
  const coreKeep = optionsWithin(model, assign, rc, ub - bound + tolOf(ub));
  const core = solveRestricted(model, assign, coreKeep, solver, timeLimit);
  modelVariables = Math.max(modelVariables, core.variables);
  if (core.error) notes.push({ code: "solverFailedOnPart", error: core.error });
  const proven = core.allOptimal && !core.error;
  if (!proven) {
    notes.push({ code: "timeLimitBeforeProof", solverStatuses: core.statuses.filter((x) => x !== "Optimal") });
  }
  return {
    assign: core.objectiveDm <= ub + 1e-9 ? core.assign : assign,
    method: "exactMip",
    status: core.statuses.find((x) => x !== "Optimal") ?? "Optimal",
    boundDm: bound,
    proven,
    pruning,
    modelVariables,
    notes,
  };
}

/**
 * Assigns households to digesters minimising total walking distance
 * (haversine metres) without exceeding any digester's weekly room, keeping
 * pins, honouring the walking limit, and reporting every household it cannot
 * place with the reason and a suggestion. See index.ts for the
 * model (GAP), the bound and the two solution paths; `solver` is HiGHS
 * injected by the caller. Never throws on bad data: problems become
 * `messages`, `contradictions` and `unplaced` entries.
 */
export function solveAssignment(
  input: AssignmentInput,
  solver: LpSolver,
  options: AssignmentOptions = {},
): AssignmentResult {
  const prep = prepare(input);
  if (prep.model.items.length === 0) {
    return assemble(prep, {
      assign: new Int32Array(0),
      method: "nothingToSolve",
      status: "Not needed",
      boundDm: 0,
      proven: true,
      pruning: null,
      modelVariables: 0,
      notes: [],
    });
  }
  return assemble(prep, solveCore(prep, solver, options));
}

/**
 * The obvious plan, for comparison only: pins as in {@link solveAssignment},
 * then households in input order, each to its nearest allowed digester that
 * still has room for its weekly kg; unplaced otherwise. No solver, no bound.
 */
export function nearestWithRoomBaseline(input: AssignmentInput): AssignmentResult {
  const prep = prepare(input);
  const plan = greedyNearestWithRoom(prep.model);
  return assemble(prep, {
    assign: plan.assign,
    method: "nearestWithRoom",
    status: "Not used",
    boundDm: null,
    proven: false,
    pruning: null,
    modelVariables: 0,
    notes: [],
  });
}
