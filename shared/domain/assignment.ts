/**
 * Households → digesters: the scheduler's assignment (PRODUCT.md §5).
 *
 * The problem is a generalised assignment problem (GAP): each household h
 * brings w_h kg a week and goes to one digester d whose weekly room R_d
 * (the sum of its next 7 days' feed budgets, computed by the caller) must
 * not be exceeded; minimise total walking distance Σ c_hd x_hd. An
 * "unplaced" variable u_h with a penalty P_h larger than any distance makes
 * the model always feasible and places as many kilograms as possible:
 *
 *   min  Σ_hd c_hd x_hd + Σ_h P_h u_h
 *   s.t. Σ_d x_hd + u_h = 1          for every household h      (a_h)
 *        Σ_h w_h x_hd ≤ R_d          for every digester d       (c_d)
 *        x_hd, u_h ∈ {0, 1}; x_hd exists only for allowed pairs
 *        (digester available, within the optional walking limit).
 *
 * Sources: GAP and its Lagrangian bound — Ross & Soland 1975, "A branch
 * and bound algorithm for the generalized assignment problem", Math.
 * Programming 8:91 [memory]; regret-based construction — Martello & Toth
 * 1981, "An algorithm for the generalized assignment problem", Operational
 * Research '81, pp. 589–603 [memory]; reduced-cost fixing — standard LP
 * duality, e.g. Nemhauser & Wolsey 1988, *Integer and Combinatorial
 * Optimization*, §II.4 [memory]. The MIP and LP are solved by HiGHS
 * (Huangfu & Hall 2018, Math. Prog. Comp. 10:119 [memory]), which the
 * caller injects so that `shared/` stays free of the wasm package.
 *
 * How it is solved (both paths end with an answer that is feasible by
 * construction and checked in code):
 * 1. LP relaxation with HiGHS → fractional x and capacity duals y_d ≤ 0.
 *    Large networks first run subgradient steps on the Lagrangian bound
 *    over all pairs (cheap, in JS) and keep, per household, the k options
 *    of smallest reduced cost (default 5) plus any priced back in by the
 *    LP duals — the LP optimum lives on small reduced costs, which k
 *    nearest digesters alone miss when nearby digesters are full.
 * 2. Lagrangian bound with v_d = max(0, −y_d): for ANY v ≥ 0,
 *      LB(v) = Σ_h min(P_h, min_d (c_hd + w_h v_d)) − Σ_d v_d R_d
 *    is a valid lower bound on every feasible plan (relax the capacity
 *    rows), so the reported bound never depends on the LP being exact or on
 *    the candidate pruning. With optimal LP duals it equals the LP bound.
 * 3. Round each household to its largest x, repair overloads by regret,
 *    improve by relocate and swap moves, and keep the better of this and
 *    the nearest-with-room baseline (so the answer is never worse than it);
 *    then "polish": HiGHS solves a small MIP over the options of smallest
 *    reduced cost (a heuristic, a few seconds at most).
 * 4. Exact path only: reduced-cost fixing — a pair whose reduced cost
 *    c_hd + w_h v_d − L_h exceeds UB − LB cannot appear in any plan better
 *    than the incumbent (c·x ≥ LB + Σ reduced costs of the pairs used), so
 *    it is removed; households left with one option are fixed; the rest
 *    splits into independent parts (households linked by shared digesters)
 *    and HiGHS solves each part's MIP to a zero gap, with the incumbent as
 *    cutoff (costs are whole decimetres, so an absolute gap below 0.1 m is
 *    proof). If a time limit stops it, the best plan is returned with its
 *    gap to the bound and `provenOptimal: false`.
 * Distances are rounded to whole decimetres inside the model; reported
 * distances are the unrounded haversine metres.
 */
import { type Fraction, type Kg, type Metres, fraction, kg, metres } from "../units";
import { haversineM, isValidLatLng } from "./geo";

/* ------------------------------------------------------------------ */
/* Solver seam: the structural part of highs-js the model needs.       */
/* ------------------------------------------------------------------ */

/** One column of a HiGHS solution; `Primal` is missing when the solve produced no point. */
export interface HighsColumnLike {
  readonly Primal?: number;
  readonly Index?: number;
}

/** One row of a HiGHS solution (model order); `Dual` is present for LP solves. */
export interface HighsRowLike {
  readonly Dual?: number;
  readonly Name?: string;
  readonly Primal?: number;
  readonly Index?: number;
}

/**
 * The part of highs-js's `HighsSolution` (`highs.solve(lpText, options)`)
 * read here: status text, objective, columns by name, rows in model order.
 */
export interface HighsSolutionLike {
  readonly Status: string;
  readonly ObjectiveValue: number;
  readonly Columns: Readonly<Record<string, HighsColumnLike>>;
  readonly Rows?: readonly HighsRowLike[];
}

/** HiGHS options this module sets (names as in HiGHS; see highs-js `types.d.ts`). */
export interface HighsOptionsLike {
  readonly output_flag?: boolean;
  readonly time_limit?: number;
  readonly mip_rel_gap?: number;
  readonly mip_abs_gap?: number;
  readonly presolve?: "off" | "choose" | "on";
  readonly solver?: "choose" | "simplex" | "ipm";
  /** For a MIP, HiGHS's upper limit on the objective: only better plans are searched for. */
  readonly objective_bound?: number;
}

/**
 * Solves CPLEX-LP text. The caller builds it from highs-js, e.g.
 * `const highs = await (await import("highs")).default();
 *  const solver: LpSolver = (lp, o) => highs.solve(lp, o);`
 * It may throw; {@link solveAssignment} then falls back and says so.
 */
export type LpSolver = (lpText: string, options?: HighsOptionsLike) => HighsSolutionLike;

/* ------------------------------------------------------------------ */
/* Input and output                                                    */
/* ------------------------------------------------------------------ */

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

/** Input of {@link solveAssignment} and {@link nearestWithRoomBaseline}. */
export interface AssignmentInput {
  readonly households: readonly AssignmentHousehold[];
  readonly digesters: readonly AssignmentDigester[];
  /** Optional walking limit, metres: pairs farther apart are not allowed (pins excepted, with a message). */
  readonly maxWalkingDistanceM?: number | null;
}

/** Tuning of {@link solveAssignment}; the defaults suit the product. */
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

/** Why a household could not be placed: no map location, no valid kg, no available digester within the walking limit, or every reachable digester full. */
export type UnplacedReason = "noLocation" | "invalidAmount" | "noDigesterWithinReach" | "noRoom";

/** What the household can do instead: bring it to the nearest digester another day, or compost at home. */
export type UnplacedSuggestion =
  | { readonly kind: "anotherDay"; readonly digesterId: string; readonly distanceM: Metres }
  | { readonly kind: "compostAtHome" };

/** A household the plan could not place, with the reason, a suggestion and a sentence for the coordinator. */
export interface UnplacedHousehold {
  readonly householdId: string;
  readonly weeklyKg: Kg;
  readonly reason: UnplacedReason;
  readonly suggestion: UnplacedSuggestion;
  readonly message: string;
}

/** Why a pin cannot be kept: the digester does not exist, is not available, or earlier pins already fill its room. */
export type PinContradictionKind = "unknownDigester" | "digesterUnavailable" | "pinsOverloadDigester";

/** A pin that cannot be kept; the household is then placed by the solver like any other. */
export interface PinContradiction {
  readonly householdId: string;
  readonly digesterId: string;
  readonly kind: PinContradictionKind;
  readonly message: string;
}

/**
 * How the plan was found: exact MIP path, LP-round-repair path, the baseline
 * rule, local search from the baseline when HiGHS gave no point, or nothing
 * to optimise.
 */
export type AssignmentMethod =
  "exactMip" | "lpRoundRepair" | "nearestWithRoom" | "localSearchFallback" | "nothingToSolve";

/** A proposed plan with its figures; `objectiveM`, `lpBoundM` and `gapToLpBound` are in metres of the model objective (see the module comment). */
export interface AssignmentResult {
  readonly assignments: readonly HouseholdAssignment[];
  readonly digesterLoads: readonly DigesterLoad[];
  readonly unplaced: readonly UnplacedHousehold[];
  readonly contradictions: readonly PinContradiction[];
  readonly messages: readonly string[];
  /** Σ haversine distance of all assignments (pins included), metres. */
  readonly totalDistanceM: Metres;
  readonly placedKg: Kg;
  readonly unplacedKg: Kg;
  /** Model objective: distances (decimetre-rounded) + penalties of households the model could not place, metres. */
  readonly objectiveM: number;
  /** Valid lower bound on `objectiveM` over every feasible plan (LP/Lagrangian, §2 above); null when not computed. */
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

/* ------------------------------------------------------------------ */
/* The optimisation core (exported for tests and the benchmark)        */
/* ------------------------------------------------------------------ */

/** One household in the optimisation core: options sorted by cost, ascending. */
export interface ModelItem {
  readonly kg: number;
  /** Cost of staying unplaced, decimetres. */
  readonly penaltyDm: number;
  /** Allowed digester indices, nearest first. */
  readonly digesters: Int32Array;
  /** Walking distance to each, whole decimetres. */
  readonly costsDm: Float64Array;
}

/** The core GAP: items (free households) and residual room per digester index. */
export interface AssignmentModel {
  readonly items: readonly ModelItem[];
  /** Room left per digester after kept pins, kg; 0 for digesters that take nobody. */
  readonly roomKg: readonly number[];
}

/** Options of one item chosen for an LP, as positions into `ModelItem.digesters`. */
export type OptionSubset = readonly (readonly number[])[];

const fmt = (n: number): string => {
  if (!Number.isFinite(n)) throw new Error(`non-finite coefficient ${n}`);
  if (Math.abs(n) < 1e-9) return "0";
  // toString can give "1e-7"; the LP reader accepts that, but fixed notation is easier to read.
  return Math.abs(n) < 1e-4 ? n.toFixed(12) : String(n);
};

const xName = (item: number, digester: number) => `x${item}_${digester}`;
const uName = (item: number) => `u${item}`;

/**
 * The model above as CPLEX LP text for HiGHS. `integer` adds the Binary
 * section (MIP); without it the text is the LP relaxation (x ≤ 1 is implied
 * by the assignment rows). `subset` restricts each item to some of its
 * options (positions into `items[i].digesters`); default all.
 * `withUnplaced[i] === false` drops item i's u column (only safe when the
 * remaining options are known to admit a feasible plan).
 * Names: x{item}_{digester}, u{item}; rows a{item}, c{digester}.
 */
export function buildAssignmentLp(
  model: AssignmentModel,
  integer: boolean,
  subset?: OptionSubset,
  withUnplaced?: readonly boolean[],
): string {
  const obj: string[] = [];
  const rows: string[] = [];
  const capTerms = new Map<number, string[]>();
  const binaries: string[] = [];
  model.items.forEach((item, i) => {
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    const names: string[] = [];
    for (const p of positions) {
      const d = item.digesters[p]!;
      const name = xName(i, d);
      obj.push(`${fmt(item.costsDm[p]!)} ${name}`);
      names.push(name);
      if (item.kg > 0) {
        let t = capTerms.get(d);
        if (!t) capTerms.set(d, (t = []));
        t.push(`${fmt(item.kg)} ${name}`);
      }
      if (integer) binaries.push(name);
    }
    if (withUnplaced?.[i] ?? true) {
      obj.push(`${fmt(item.penaltyDm)} ${uName(i)}`);
      names.push(uName(i));
      if (integer) binaries.push(uName(i));
    }
    rows.push(` a${i}: ${names.join(" + ")} = 1`);
  });
  const chunk = (terms: string[]) => {
    const lines: string[] = [];
    for (let k = 0; k < terms.length; k += 50) lines.push(terms.slice(k, k + 50).join(" + "));
    return lines.join("\n   + ");
  };
  const caps = [...capTerms.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([d, terms]) => ` c${d}: ${chunk(terms)} <= ${fmt(Math.max(0, model.roomKg[d] ?? 0))}`);
  const parts = ["Minimize", ` obj: ${chunk(obj)}`, "Subject To", ...rows, ...caps];
  if (integer && binaries.length > 0) {
    parts.push("Binary");
    for (let k = 0; k < binaries.length; k += 50) parts.push(` ${binaries.slice(k, k + 50).join(" ")}`);
  }
  parts.push("End", "");
  return parts.join("\n");
}

/** What {@link readAssignmentSolution} extracts from a HiGHS answer. */
export interface ReadSolution {
  /** Whether the status says a usable primal point exists. */
  readonly hasPoint: boolean;
  /** Per item: value of each option in the subset order; last entry is u (unplaced). */
  readonly values: readonly Float64Array[];
  /** Capacity multipliers v_d = max(0, −dual of c_d) ≥ 0 by digester index; 0 where unknown. */
  readonly capacityMultipliers: Float64Array;
  readonly status: string;
}

const STATUSES_WITH_POINT = new Set([
  "Optimal",
  "Time limit reached",
  "Iteration limit reached",
  "Bound on objective reached",
  "Target for objective reached",
]);

/**
 * Reads primal values (by column name; a column without `Primal` counts as
 * 0) and capacity-row duals (by row name, falling back to model order) from
 * a HiGHS solution of {@link buildAssignmentLp}'s text. HiGHS reports a
 * ≤ row's dual as ≤ 0 when minimising (the objective falls as room grows),
 * so the Lagrange multiplier is its negation, clipped at 0 to stay valid.
 */
export function readAssignmentSolution(
  model: AssignmentModel,
  solution: HighsSolutionLike,
  subset?: OptionSubset,
): ReadSolution {
  const hasPoint =
    STATUSES_WITH_POINT.has(solution.Status) &&
    Object.values(solution.Columns).some((c) => typeof c.Primal === "number");
  const values = model.items.map((item, i) => {
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    const out = new Float64Array(positions.length + 1);
    positions.forEach((p, k) => {
      const v = solution.Columns[xName(i, item.digesters[p]!)]?.Primal;
      out[k] = typeof v === "number" && Number.isFinite(v) ? v : 0;
    });
    const u = solution.Columns[uName(i)]?.Primal;
    out[positions.length] = typeof u === "number" && Number.isFinite(u) ? u : 0;
    return out;
  });
  const multipliers = new Float64Array(model.roomKg.length);
  const rows = solution.Rows ?? [];
  const capacityDigesters = new Set<number>();
  model.items.forEach((item, i) => {
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    if (item.kg > 0) for (const p of positions) capacityDigesters.add(item.digesters[p]!);
  });
  const ordered = [...capacityDigesters].sort((a, b) => a - b);
  rows.forEach((row, r) => {
    let d: number | undefined;
    if (row.Name && /^c\d+$/.test(row.Name)) d = Number(row.Name.slice(1));
    else if (!row.Name && r >= model.items.length) d = ordered[r - model.items.length];
    if (d !== undefined && typeof row.Dual === "number" && Number.isFinite(row.Dual))
      multipliers[d] = Math.max(0, -row.Dual);
  });
  return { hasPoint, values, capacityMultipliers: multipliers, status: solution.Status };
}

/**
 * Lagrangian lower bound (capacity rows relaxed with multipliers v ≥ 0):
 *   LB(v) = Σ_i min(P_i, min_d (c_id + w_i v_d)) − Σ_d v_d R_d.
 * Valid for every v ≥ 0 [Ross & Soland 1975, memory]. Also returns each
 * item's inner minimum L_i, used for reduced costs c_id + w_i v_d − L_i ≥ 0.
 */
export function lagrangianBound(model: AssignmentModel, v: Float64Array): { boundDm: number; itemMinDm: Float64Array } {
  const itemMin = new Float64Array(model.items.length);
  let sum = 0;
  model.items.forEach((item, i) => {
    let best = item.penaltyDm;
    const { digesters, costsDm, kg: w } = item;
    // Options are sorted by cost and w·v ≥ 0, so nothing beyond the first cost ≥ best can win.
    for (let p = 0; p < digesters.length && costsDm[p]! < best; p++) {
      const c = costsDm[p]! + w * (v[digesters[p]!] ?? 0);
      if (c < best) best = c;
    }
    itemMin[i] = best;
    sum += best;
  });
  model.roomKg.forEach((r, d) => {
    sum -= (v[d] ?? 0) * Math.max(0, r);
  });
  return { boundDm: sum, itemMinDm: itemMin };
}

/* ------------------------------------------------------------------ */
/* Preparation: validation, pins, candidate pairs                      */
/* ------------------------------------------------------------------ */

const KG_EPS = 1e-7;
/** Weights below this count as this much when scaling penalties, so a 0 kg household still costs more than any walk. */
export const PENALTY_FLOOR_KG = 0.1;

/**
 * Cost of leaving a household unplaced, metres-equivalent:
 *   P = (Dmax + 1 m) · max(w, 0.1 kg) / max(w_min, 0.1 kg)
 * with Dmax the longest allowed walk in the model and w_min the lightest
 * household's kg [judgement, after the brief: above any single walk, and
 * proportional to kg so heavier households are placed first]. It is a
 * penalty, not a lexicographic priority: in a very tight network the plan
 * may leave one light household out when that shortens several others'
 * walks by more than P in total; the unplaced list then says so.
 */
export function unplacedPenaltyM(weeklyKg: number, lightestKg: number, longestWalkM: number): number {
  const w = Math.max(weeklyKg, PENALTY_FLOOR_KG);
  const wMin = Math.max(Number.isFinite(lightestKg) ? lightestKg : w, PENALTY_FLOOR_KG);
  return (Math.max(0, longestWalkM) + 1) * (w / wMin);
}

interface Prepared {
  readonly input: AssignmentInput;
  readonly model: AssignmentModel;
  /** Input index of each model item. */
  readonly itemHousehold: readonly number[];
  /** Input index → digester index of kept pins. */
  readonly pinned: ReadonlyMap<number, number>;
  readonly preUnplaced: readonly { household: number; reason: UnplacedReason }[];
  readonly contradictions: PinContradiction[];
  readonly messages: string[];
  /** Full room per digester index (0 when unusable). */
  readonly fullRoomKg: readonly number[];
  readonly usable: readonly boolean[];
  readonly pairCount: number;
}

const roundDm = (m: number) => Math.round(m * 10);

function prepare(input: AssignmentInput): Prepared {
  const messages: string[] = [];
  const contradictions: PinContradiction[] = [];
  const { households, digesters } = input;
  const maxM = input.maxWalkingDistanceM;
  const hasLimit = typeof maxM === "number" && Number.isFinite(maxM) && maxM >= 0;
  if (maxM !== undefined && maxM !== null && !hasLimit)
    messages.push(`The walking limit (${maxM}) is not a distance in metres; no limit was applied.`);

  const digIndex = new Map<string, number>();
  const usable: boolean[] = [];
  const fullRoom: number[] = [];
  digesters.forEach((d, j) => {
    if (digIndex.has(d.id)) messages.push(`Digester ${d.id} appears twice; only its first entry is used.`);
    else digIndex.set(d.id, j);
    const located = isValidLatLng(d.lat, d.lng);
    const roomOk = Number.isFinite(d.weeklyRoomKg) && d.weeklyRoomKg >= 0;
    const first = digIndex.get(d.id) === j;
    const ok = first && d.available && located;
    if (d.available && !located) messages.push(`Digester ${d.id} has no valid location; it receives nobody.`);
    if (d.available && !roomOk)
      messages.push(`Digester ${d.id} has no valid weekly room (${d.weeklyRoomKg}); treated as 0 kg.`);
    usable.push(ok);
    const room = ok && roomOk ? d.weeklyRoomKg : 0;
    fullRoom.push(room);
    if (ok && room <= KG_EPS)
      messages.push(`Digester ${d.id} has no room this week (0 kg); it receives no new scraps.`);
  });
  if (!usable.some(Boolean) && households.length > 0)
    messages.push("No digester is taking scraps this week (all resting, offline or excluded).");

  const roomLeft = [...fullRoom];
  const pinned = new Map<number, number>();
  const preUnplaced: { household: number; reason: UnplacedReason }[] = [];
  const free: number[] = [];
  const seen = new Set<string>();
  households.forEach((h, i) => {
    if (seen.has(h.id)) {
      messages.push(`Household ${h.id} appears twice; only its first entry is used.`);
      return;
    }
    seen.add(h.id);
    if (!isValidLatLng(h.lat, h.lng)) {
      preUnplaced.push({ household: i, reason: "noLocation" });
      return;
    }
    if (!Number.isFinite(h.weeklyKg) || h.weeklyKg < 0) {
      preUnplaced.push({ household: i, reason: "invalidAmount" });
      return;
    }
    const pin = h.pinnedDigesterId;
    if (pin === undefined || pin === null || pin === "") {
      free.push(i);
      return;
    }
    const j = digIndex.get(pin);
    const contradiction = (kind: PinContradictionKind, message: string) => {
      contradictions.push({ householdId: h.id, digesterId: pin, kind, message });
      free.push(i);
    };
    if (j === undefined) {
      contradiction(
        "unknownDigester",
        `Household ${h.id} is pinned to digester ${pin}, which does not exist; the pin was ignored and the household placed like any other.`,
      );
      return;
    }
    const dig = digesters[j]!;
    if (!usable[j]) {
      contradiction(
        "digesterUnavailable",
        `Household ${h.id} is pinned to digester ${pin}, which is resting, offline, excluded or has no location; the pin cannot be kept, so the household was placed elsewhere.`,
      );
      return;
    }
    if (h.weeklyKg > roomLeft[j]! + KG_EPS) {
      contradiction(
        "pinsOverloadDigester",
        `Household ${h.id} is pinned to digester ${pin}, but ${pin}'s weekly room (${round1(fullRoom[j]!)} kg) cannot also take its ${round1(h.weeklyKg)} kg after the pins listed before it; this pin cannot be kept, so the household was placed elsewhere.`,
      );
      return;
    }
    roomLeft[j] = roomLeft[j]! - h.weeklyKg;
    pinned.set(i, j);
    if (hasLimit) {
      const dist = haversineM({ lat: h.lat!, lng: h.lng! }, dig);
      if (dist > maxM!)
        messages.push(
          `Household ${h.id} is pinned to ${pin} at ${Math.round(dist)} m, beyond the ${maxM} m walking limit; the pin is kept.`,
        );
    }
  });

  // Candidate pairs: every usable digester within the limit, nearest first.
  const usableIdx: number[] = [];
  usable.forEach((u, j) => u && usableIdx.push(j));
  const items: { kg: number; digesters: Int32Array; costsDm: Float64Array }[] = [];
  const itemHousehold: number[] = [];
  let maxCostDm = 0;
  let pairCount = 0;
  // Sort keys pack (cost in dm) · 2^20 + position, so a plain numeric typed-array sort orders by cost, then index.
  const KEY = 1 << 20;
  const keys = new Float64Array(usableIdx.length);
  for (const i of free) {
    const h = households[i]!;
    const p = { lat: h.lat!, lng: h.lng! };
    let count = 0;
    for (let k = 0; k < usableIdx.length; k++) {
      const m = haversineM(p, digesters[usableIdx[k]!]!);
      if (!hasLimit || m <= maxM!) keys[count++] = roundDm(m) * KEY + k;
    }
    if (count === 0) {
      preUnplaced.push({ household: i, reason: "noDigesterWithinReach" });
      continue;
    }
    const sorted = keys.subarray(0, count).sort();
    const ds = new Int32Array(count);
    const cs = new Float64Array(count);
    for (let n = 0; n < count; n++) {
      const key = sorted[n]!;
      const k = key % KEY;
      ds[n] = usableIdx[k]!;
      cs[n] = (key - k) / KEY;
    }
    maxCostDm = Math.max(maxCostDm, cs[count - 1]!);
    pairCount += count;
    items.push({ kg: h.weeklyKg, digesters: ds, costsDm: cs });
    itemHousehold.push(i);
  }
  const lightestKg = items.reduce((m, it) => Math.min(m, it.kg), Infinity);
  const modelItems: ModelItem[] = items.map((it) => ({
    ...it,
    penaltyDm: Math.round(unplacedPenaltyM(it.kg, lightestKg, maxCostDm / 10) * 10),
  }));
  return {
    input,
    model: { items: modelItems, roomKg: roomLeft },
    itemHousehold,
    pinned,
    preUnplaced,
    contradictions,
    messages,
    fullRoomKg: fullRoom,
    usable,
    pairCount,
  };
}

const round1 = (n: number) => Math.round(n * 10) / 10;

/* ------------------------------------------------------------------ */
/* Heuristics on a plan: assign[i] = digester index or −1 (unplaced)   */
/* ------------------------------------------------------------------ */

interface Plan {
  readonly assign: Int32Array;
  readonly load: Float64Array;
}

/**
 * Cost lookups for local search, which asks "what would item i cost at d?"
 * millions of times: a flat position table when it fits in memory
 * (≤ 20 M cells ≈ 80 MB), else a scan of the item's options.
 */
class CostTable {
  private readonly pos: Int32Array | null;
  private readonly width: number;
  constructor(readonly model: AssignmentModel) {
    this.width = model.roomKg.length;
    const cells = model.items.length * this.width;
    this.pos = cells <= 20_000_000 ? new Int32Array(cells).fill(-1) : null;
    if (this.pos) {
      const pos = this.pos;
      model.items.forEach((item, i) => {
        const base = i * this.width;
        item.digesters.forEach((d, p) => {
          pos[base + d] = p;
        });
      });
    }
  }
  /** Cost of item i at digester d (−1 = unplaced), decimetres; Infinity when the pair is not allowed. */
  cost(i: number, d: number): number {
    const item = this.model.items[i]!;
    if (d < 0) return item.penaltyDm;
    if (this.pos) {
      const p = this.pos[i * this.width + d]!;
      return p < 0 ? Infinity : item.costsDm[p]!;
    }
    for (let p = 0; p < item.digesters.length; p++) if (item.digesters[p] === d) return item.costsDm[p]!;
    return Infinity;
  }
}

function costOf(item: ModelItem, d: number): number {
  if (d < 0) return item.penaltyDm;
  for (let p = 0; p < item.digesters.length; p++) if (item.digesters[p] === d) return item.costsDm[p]!;
  return Infinity;
}

function planObjectiveDm(model: AssignmentModel, assign: Int32Array): number {
  let s = 0;
  model.items.forEach((item, i) => {
    s += costOf(item, assign[i]!);
  });
  return s;
}

function makePlan(model: AssignmentModel, assign: Int32Array): Plan {
  const load = new Float64Array(model.roomKg.length);
  model.items.forEach((item, i) => {
    const d = assign[i]!;
    if (d >= 0) load[d] = load[d]! + item.kg;
  });
  return { assign, load };
}

const fits = (model: AssignmentModel, plan: Plan, d: number, kgAdd: number) =>
  plan.load[d]! + kgAdd <= model.roomKg[d]! + KG_EPS;

/** Greedy in item order: nearest option with room, else unplaced (the "obvious" plan). */
function greedyNearestWithRoom(model: AssignmentModel): Plan {
  const plan = makePlan(model, new Int32Array(model.items.length).fill(-1));
  model.items.forEach((item, i) => {
    for (let p = 0; p < item.digesters.length; p++) {
      const d = item.digesters[p]!;
      if (fits(model, plan, d, item.kg)) {
        plan.assign[i] = d;
        plan.load[d] = plan.load[d]! + item.kg;
        return;
      }
    }
  });
  return plan;
}

function move(model: AssignmentModel, plan: Plan, i: number, to: number) {
  const item = model.items[i]!;
  const from = plan.assign[i]!;
  if (from >= 0) plan.load[from] = plan.load[from]! - item.kg;
  if (to >= 0) plan.load[to] = plan.load[to]! + item.kg;
  plan.assign[i] = to;
}

/**
 * Repair by regret: while a digester is over its room, move out the
 * household whose cheapest feasible alternative costs least extra per kg
 * freed (its regret); when none can move, leave unplaced the household
 * whose penalty per kg is smallest.
 */
function repairOverloads(model: AssignmentModel, plan: Plan): void {
  const onDigester = new Map<number, number[]>();
  plan.assign.forEach((d, i) => {
    if (d < 0) return;
    let l = onDigester.get(d);
    if (!l) onDigester.set(d, (l = []));
    l.push(i);
  });
  for (const [d, members] of onDigester) {
    let guard = members.length + 1;
    while (plan.load[d]! > model.roomKg[d]! + KG_EPS && guard-- > 0) {
      let best = -1;
      let bestTo = -1;
      let bestScore = Infinity;
      for (const i of members) {
        if (plan.assign[i] !== d) continue;
        const item = model.items[i]!;
        if (item.kg <= 0) continue;
        const here = costOf(item, d);
        let to = -1;
        let extra = item.penaltyDm - here;
        for (let p = 0; p < item.digesters.length; p++) {
          const e = item.digesters[p]!;
          if (e === d || !fits(model, plan, e, item.kg)) continue;
          const x = item.costsDm[p]! - here;
          if (x < extra) {
            extra = x;
            to = e;
          }
          break; // options are sorted: the first that fits is the cheapest
        }
        const score = extra / item.kg;
        if (score < bestScore) {
          bestScore = score;
          best = i;
          bestTo = to;
        }
      }
      if (best < 0) break;
      move(model, plan, best, bestTo);
    }
  }
}

/** Swap partners are looked for only among an item's this many cheaper options (nearest first). */
const SWAP_OPTIONS = 10;

/**
 * Local search: relocate (move a household to a cheaper digester with
 * room, or place an unplaced one) and swap (exchange two households between
 * their digesters when both fit and the sum falls), until no move improves
 * or `maxPasses` is reached. Every move keeps the plan feasible.
 */
function improve(table: CostTable, plan: Plan, maxPasses = 5): void {
  const model = table.model;
  const n = model.items.length;
  const members: number[][] = model.roomKg.map(() => []);
  const rebuild = () => {
    for (const m of members) m.length = 0;
    plan.assign.forEach((d, i) => d >= 0 && members[d]!.push(i));
  };
  for (let pass = 0; pass < maxPasses; pass++) {
    let improved = false;
    for (let i = 0; i < n; i++) {
      const item = model.items[i]!;
      const curCost = table.cost(i, plan.assign[i]!);
      for (let p = 0; p < item.digesters.length; p++) {
        if (item.costsDm[p]! >= curCost) break;
        const d = item.digesters[p]!;
        if (fits(model, plan, d, item.kg)) {
          move(model, plan, i, d);
          improved = true;
          break;
        }
      }
    }
    rebuild();
    for (let i = 0; i < n; i++) {
      const item = model.items[i]!;
      const cur = plan.assign[i]!;
      if (cur < 0) continue; // an unplaced item swapping in would push another out: relocate covers placing it
      const curCost = table.cost(i, cur);
      let done = false;
      for (let p = 0; p < item.digesters.length && p < SWAP_OPTIONS && !done; p++) {
        if (item.costsDm[p]! >= curCost) break;
        const e = item.digesters[p]!;
        const gain0 = curCost - item.costsDm[p]!;
        const loadE = plan.load[e]! + item.kg;
        const loadCur = plan.load[cur]! - item.kg;
        for (const g of members[e]!) {
          if (plan.assign[g] !== e) continue;
          const other = model.items[g]!;
          const gain = gain0 + table.cost(g, e) - table.cost(g, cur);
          if (!(gain > 1e-9)) continue;
          if (loadE - other.kg > model.roomKg[e]! + KG_EPS || loadCur + other.kg > model.roomKg[cur]! + KG_EPS)
            continue;
          move(model, plan, g, cur);
          move(model, plan, i, e);
          members[cur]!.push(g);
          members[e]!.push(i);
          improved = true;
          done = true;
          break;
        }
      }
    }
    rebuild();
    if (!improved) break;
  }
}

function overloadedCount(model: AssignmentModel, plan: Plan): number {
  let c = 0;
  plan.load.forEach((l, d) => {
    if (l > model.roomKg[d]! + KG_EPS) c++;
  });
  return c;
}

/** Rounds an LP point: each item to its option with the largest value (ties to the cheaper). */
function roundPoint(model: AssignmentModel, read: ReadSolution, subset?: OptionSubset): Int32Array {
  const assign = new Int32Array(model.items.length).fill(-1);
  model.items.forEach((item, i) => {
    const vals = read.values[i]!;
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    let best = vals[positions.length]! + 1e-9; // u wins only when clearly largest
    let bestD = -1;
    positions.forEach((p, k) => {
      if (vals[k]! > best + 1e-9) {
        best = vals[k]!;
        bestD = item.digesters[p]!;
      }
    });
    assign[i] = bestD;
  });
  return assign;
}

/* ------------------------------------------------------------------ */
/* Solve                                                               */
/* ------------------------------------------------------------------ */

interface SolveOutcome {
  assign: Int32Array;
  method: AssignmentMethod;
  status: string;
  boundDm: number | null;
  proven: boolean;
  pruning: AssignmentResult["pruning"];
  modelVariables: number;
  notes: string[];
}

function callSolver(solver: LpSolver, lp: string, options: HighsOptionsLike): HighsSolutionLike | { error: string } {
  try {
    return solver(lp, options);
  } catch (e) {
    return { error: e instanceof Error ? e.message : String(e) };
  }
}

/** LP relaxation over a subset, with optional pricing rounds that add pairs of negative reduced cost. */
function relax(
  model: AssignmentModel,
  solver: LpSolver,
  subset: number[][] | undefined,
  pricingRounds: number,
  options: HighsOptionsLike,
): {
  read: ReadSolution | null;
  status: string;
  added: number;
  complete: boolean;
  variables: number;
  subset: number[][] | undefined;
} {
  let added = 0;
  let read: ReadSolution | null = null;
  let status = "Not run";
  let variables = 0;
  let complete = subset === undefined;
  for (let round = 0; ; round++) {
    const lp = buildAssignmentLp(model, false, subset);
    variables = Math.max(
      variables,
      model.items.reduce((s, it, i) => s + (subset?.[i]?.length ?? it.digesters.length) + 1, 0),
    );
    const sol = callSolver(solver, lp, options);
    if ("error" in sol)
      return { read, status: `Solver error: ${sol.error}`, added, complete: false, variables, subset };
    status = sol.Status;
    read = readAssignmentSolution(model, sol, subset);
    if (!read.hasPoint || !subset) break;
    // Price every pruned pair: reduced cost c + w·v − L_i(subset) < 0 means the LP over all pairs is better.
    // After the last allowed solve the pairs are only counted (the subset must keep matching the LP point).
    const v = read.capacityMultipliers;
    const grow = round < pricingRounds;
    let addedNow = 0;
    model.items.forEach((item, i) => {
      const pos = subset[i]!;
      let li = item.penaltyDm;
      for (const p of pos) li = Math.min(li, item.costsDm[p]! + item.kg * v[item.digesters[p]!]!);
      const inSet = new Set(pos);
      const extra: number[] = [];
      for (let p = 0; p < item.digesters.length && item.costsDm[p]! < li - 1e-6; p++) {
        if (!inSet.has(p) && item.costsDm[p]! + item.kg * v[item.digesters[p]!]! < li - 1e-6) extra.push(p);
      }
      addedNow += extra.length;
      if (grow && extra.length > 0) {
        pos.push(...extra);
        pos.sort((a, b) => a - b);
      }
    });
    complete = addedNow === 0;
    if (!grow || complete) break;
    added += addedNow;
  }
  return { read, status, added, complete, variables, subset };
}

/**
 * Round-repair-improve from an LP point, checked against the baseline
 * (nearest with room, input order): when the baseline is cheaper, the
 * baseline improved by local search is used instead, so the answer is
 * never worse than the baseline.
 */
function heuristicPlan(model: AssignmentModel, start: Int32Array | null): Plan {
  const table = new CostTable(model);
  const greedy = greedyNearestWithRoom(model);
  const greedyCost = planObjectiveDm(model, greedy.assign);
  if (start) {
    const p = makePlan(model, start);
    repairOverloads(model, p);
    improve(table, p);
    if (overloadedCount(model, p) === 0 && planObjectiveDm(model, p.assign) <= greedyCost + 1e-9) return p;
  }
  improve(table, greedy);
  return greedy;
}

/** Subgradient steps on the Lagrangian bound (a fixed count, so results are reproducible). */
const SUBGRADIENT_STEPS = 120;
/** Subgradient steps that choose the large-network candidates [judgement: 60 left enough negative reduced costs to force a second LP solve on the benchmark; 120 did not]. */
const CANDIDATE_SUBGRADIENT_STEPS = 120;

/**
 * Improves capacity multipliers v by projected subgradient ascent on
 * LB(v) (see {@link lagrangianBound}): g_d = R_d − Σ_{i choosing d} w_i,
 * v ← max(0, v − t·g) with Polyak's step t = λ (UB − LB)/‖g‖², λ from 2,
 * halved after 8 steps without a better bound [Held, Wolfe & Crowder 1974,
 * Math. Programming 6:62, memory]. Returns the best v seen and its bound;
 * the bound is valid whatever v is, so this only ever tightens it.
 */
export function improveMultipliers(
  model: AssignmentModel,
  start: Float64Array,
  upperBoundDm: number,
  steps = SUBGRADIENT_STEPS,
): { multipliers: Float64Array; boundDm: number } {
  let v = Float64Array.from(start);
  let best = Float64Array.from(v);
  let bestLb = -Infinity;
  let lambda = 2;
  let stall = 0;
  const g = new Float64Array(v.length);
  for (let it = 0; it <= steps; it++) {
    g.fill(0);
    model.roomKg.forEach((r, d) => {
      g[d] = Math.max(0, r);
    });
    let lb = 0;
    for (const item of model.items) {
      let bestCost = item.penaltyDm;
      let bestD = -1;
      const { digesters, costsDm, kg: w } = item;
      for (let p = 0; p < digesters.length && costsDm[p]! < bestCost; p++) {
        const d = digesters[p]!;
        const c = costsDm[p]! + w * v[d]!;
        if (c < bestCost) {
          bestCost = c;
          bestD = d;
        }
      }
      lb += bestCost;
      if (bestD >= 0) g[bestD] = g[bestD]! - item.kg;
    }
    model.roomKg.forEach((r, d) => {
      lb -= v[d]! * Math.max(0, r);
    });
    if (lb > bestLb + 1e-9) {
      bestLb = lb;
      best = Float64Array.from(v);
      stall = 0;
    } else if (++stall >= 8) {
      lambda /= 2;
      stall = 0;
    }
    if (it === steps) break;
    let norm = 0;
    g.forEach((x, d) => {
      // Projection: a multiplier at 0 with spare room cannot go lower.
      if (!(v[d]! <= 0 && x > 0)) norm += x * x;
    });
    if (norm <= 1e-12 || upperBoundDm - lb <= 1e-9 || lambda < 1e-4) break;
    const t = (lambda * (upperBoundDm - lb)) / norm;
    v = v.map((x, d) => Math.max(0, x - t * g[d]!));
  }
  return { multipliers: best, boundDm: bestLb };
}

/** Per item, the positions of its `k` options with the smallest reduced cost c + w·v (ties to the nearer). */
function candidatesByReducedCost(model: AssignmentModel, v: Float64Array, k: number): number[][] {
  return model.items.map((item) => {
    const m = item.digesters.length;
    if (m <= k) return [...Array(m).keys()];
    // Keep the k best seen; options are sorted by cost and w·v ≥ 0, so scanning stops once a cost alone exceeds the k-th best.
    const best: { p: number; rc: number }[] = [];
    for (let p = 0; p < m; p++) {
      const c = item.costsDm[p]!;
      if (best.length === k && c >= best[k - 1]!.rc) break;
      const rc = c + item.kg * v[item.digesters[p]!]!;
      if (best.length < k || rc < best[k - 1]!.rc) {
        best.push({ p, rc });
        best.sort((a, b) => a.rc - b.rc || a.p - b.p);
        if (best.length > k) best.pop();
      }
    }
    return best.map((b) => b.p).sort((a, b) => a - b);
  });
}

function solveCore(prep: Prepared, solver: LpSolver, options: AssignmentOptions): SolveOutcome {
  const model = prep.model;
  const n = model.items.length;
  const notes: string[] = [];
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
    notes.push(
      `The solver did not solve this network (${relaxed.status}), so this plan comes from the nearest digester with room, improved by moving households one at a time; ${preBound ? "the gap shown bounds how far it is from the best possible" : "how far it is from the best possible is unknown"}.`,
    );
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
  if (core.error)
    notes.push(
      `The solver failed on part of the network (${core.error}); that part keeps the plan found before and is not proven the best.`,
    );
  const proven = core.allOptimal && !core.error;
  if (!proven) {
    notes.push(
      `The solver reached its time limit before proving this plan the best (${core.statuses.filter((x) => x !== "Optimal").join(", ") || "no better plan"}); it is within the gap shown of the best possible.`,
    );
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

/** Extra columns (beyond each household's best option) a polish MIP may hold. */
const POLISH_EXTRA_COLUMNS = 800;
/** Time limit of each polish MIP, seconds. */
const POLISH_TIME_LIMIT_S = 3;

/** Reduced costs under multipliers v (see {@link lagrangianBound}): option p of item i, and "unplaced". */
interface ReducedCosts {
  option(i: number, p: number): number;
  unplaced(i: number): number;
  /** L_i, item i's smallest c + w·v (or P). A lower bound on the reduced cost of option p is c_p − L_i. */
  readonly itemMin: Float64Array;
}

/** Largest reduced cost t ≤ slack such that about `extra` options with 0 < rc ≤ t exist. */
function polishThreshold(model: AssignmentModel, rc: ReducedCosts, slack: number, extra: number): number {
  const values: number[] = [];
  model.items.forEach((item, i) => {
    for (let p = 0; p < item.digesters.length && item.costsDm[p]! - rc.itemMin[i]! <= slack; p++) {
      const x = rc.option(i, p);
      if (x > 1e-9 && x <= slack) values.push(x);
    }
  });
  if (values.length <= extra) return slack;
  return Float64Array.from(values).sort()[extra - 1]!;
}

/**
 * Per item, the option positions with reduced cost ≤ `limit`, always
 * including the incumbent's option; `u[i]` tells whether "unplaced" stays
 * (its reduced cost ≤ limit, or the incumbent leaves the item unplaced).
 */
function optionsWithin(
  model: AssignmentModel,
  assign: Int32Array,
  rc: ReducedCosts,
  limit: number,
): { pos: number[][]; u: boolean[] } {
  const pos: number[][] = [];
  const u: boolean[] = [];
  model.items.forEach((item, i) => {
    const keep: number[] = [];
    let hasIncumbent = assign[i] === -1;
    // Options are sorted by cost and rc(p) ≥ c_p − L_i, so the scan stops once that alone exceeds the limit.
    for (let p = 0; p < item.digesters.length && item.costsDm[p]! - rc.itemMin[i]! <= limit; p++) {
      if (rc.option(i, p) <= limit) {
        keep.push(p);
        if (item.digesters[p] === assign[i]) hasIncumbent = true;
      }
    }
    if (!hasIncumbent) {
      const p = item.digesters.indexOf(assign[i]!);
      if (p >= 0) keep.push(p);
      keep.sort((a, b) => a - b);
    }
    pos.push(keep);
    u.push(assign[i] === -1 || rc.unplaced(i) <= limit);
  });
  return { pos, u };
}

interface RestrictedResult {
  assign: Int32Array;
  objectiveDm: number;
  allOptimal: boolean;
  statuses: string[];
  variables: number;
  error?: string;
}

/**
 * Minimises the model over the kept options only, starting from a feasible
 * incumbent whose options are all kept: items left with one option are
 * fixed; the rest splits into independent parts (items linked through
 * shared digesters, found by union–find); a part with one item takes its
 * cheapest option with room; every other part is a HiGHS MIP with the
 * incumbent's cost as cutoff (zero gap: costs are whole decimetres). A part
 * keeps the incumbent unless HiGHS returns a feasible plan at least as good.
 */
function solveRestricted(
  model: AssignmentModel,
  incumbent: Int32Array,
  keep: { pos: number[][]; u: boolean[] },
  solver: LpSolver,
  timeLimitS: number,
): RestrictedResult {
  const D = model.roomKg.length;
  const assign = Int32Array.from(incumbent);
  const room = [...model.roomKg];
  const free: number[] = [];
  model.items.forEach((item, i) => {
    const options = keep.pos[i]!.length + (keep.u[i] ? 1 : 0);
    if (options <= 1) {
      if (assign[i]! >= 0) room[assign[i]!] = room[assign[i]!]! - item.kg;
    } else free.push(i);
  });
  // Union–find over digesters: items sharing a digester belong to one part.
  const parent = Int32Array.from({ length: D }, (_, d) => d);
  const find = (d: number): number => {
    while (parent[d] !== d) {
      parent[d] = parent[parent[d]!]!;
      d = parent[d]!;
    }
    return d;
  };
  for (const i of free) {
    const item = model.items[i]!;
    const ds = keep.pos[i]!.map((p) => item.digesters[p]!);
    for (let k = 1; k < ds.length; k++) parent[find(ds[k]!)] = find(ds[0]!);
  }
  const parts = new Map<number, number[]>();
  for (const i of free) {
    const item = model.items[i]!;
    const first = keep.pos[i]![0];
    const key = first === undefined ? -1 - i : find(item.digesters[first]!);
    let list = parts.get(key);
    if (!list) parts.set(key, (list = []));
    list.push(i);
  }
  const statuses: string[] = [];
  let allOptimal = true;
  let variables = 0;
  let error: string | undefined;
  for (const items of parts.values()) {
    if (items.length === 1) {
      const i = items[0]!;
      const item = model.items[i]!;
      let best = keep.u[i] ? -1 : assign[i]!;
      let bestCost = costOf(item, best);
      for (const p of keep.pos[i]!) {
        const d = item.digesters[p]!;
        if (room[d]! + KG_EPS >= item.kg && item.costsDm[p]! < bestCost) {
          best = d;
          bestCost = item.costsDm[p]!;
        }
      }
      assign[i] = best;
      continue;
    }
    const sub: AssignmentModel = {
      items: items.map((i) => {
        const item = model.items[i]!;
        const pos = keep.pos[i]!;
        return {
          kg: item.kg,
          penaltyDm: item.penaltyDm,
          digesters: Int32Array.from(pos, (p) => item.digesters[p]!),
          costsDm: Float64Array.from(pos, (p) => item.costsDm[p]!),
        };
      }),
      roomKg: room.map((r) => Math.max(0, r)),
    };
    variables += sub.items.reduce((sum, it) => sum + it.digesters.length, 0) + items.filter((i) => keep.u[i]).length;
    const incumbentDm = items.reduce((sum, i) => sum + costOf(model.items[i]!, assign[i]!), 0);
    const sol = callSolver(
      solver,
      buildAssignmentLp(
        sub,
        true,
        undefined,
        items.map((i) => keep.u[i]!),
      ),
      {
        output_flag: false,
        time_limit: timeLimitS,
        mip_rel_gap: 0,
        mip_abs_gap: 0.05,
        objective_bound: incumbentDm + 0.5,
      },
    );
    if ("error" in sol) {
      error = sol.error;
      allOptimal = false;
      continue;
    }
    statuses.push(sol.Status);
    if (sol.Status !== "Optimal") allOptimal = false;
    const read = readAssignmentSolution(sub, sol);
    if (!read.hasPoint) continue;
    const subAssign = roundPoint(sub, read);
    const load = new Float64Array(D);
    let cost = 0;
    let ok = true;
    items.forEach((i, s) => {
      const d = subAssign[s]!;
      cost += costOf(model.items[i]!, d);
      if (d >= 0) load[d] = load[d]! + model.items[i]!.kg;
    });
    load.forEach((l, d) => {
      if (l > sub.roomKg[d]! + KG_EPS) ok = false;
    });
    if (ok && cost <= incumbentDm + 1e-9) items.forEach((i, s) => (assign[i] = subAssign[s]!));
  }
  return { assign, objectiveDm: planObjectiveDm(model, assign), allOptimal, statuses, variables, error };
}

/* ------------------------------------------------------------------ */
/* Result assembly                                                     */
/* ------------------------------------------------------------------ */

function assemble(prep: Prepared, outcome: SolveOutcome): AssignmentResult {
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
    const message =
      reason === "noLocation"
        ? `Household ${h.id} has no location on the map; add one so it can be assigned. Until then it can compost at home.`
        : reason === "invalidAmount"
          ? `Household ${h.id} has no valid weekly amount (${h.weeklyKg}); correct it so it can be assigned.`
          : reason === "noDigesterWithinReach"
            ? typeof limit === "number" && Number.isFinite(limit) && prep.usable.some(Boolean)
              ? `No digester taking scraps is within ${limit} m of household ${h.id}; it can compost at home, or the walking limit can be raised.`
              : `No digester is taking scraps for household ${h.id} this week; it can compost at home.`
            : `Every digester within reach of household ${h.id} is full this week (${round1(w)} kg to place); it can bring its scraps to ${suggestion.kind === "anotherDay" ? suggestion.digesterId : "a digester"} another day, or compost at home.`;
    unplaced.push({ householdId: h.id, weeklyKg: kg(w), reason, suggestion, message });
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
  const messages = [...prep.messages, ...prep.contradictions.map((c) => c.message), ...outcome.notes];
  const unplacedKg = unplaced.reduce((s, u) => s + u.weeklyKg, 0);
  if (unplaced.length > 0)
    messages.push(
      `${unplaced.length} household(s) (${round1(unplacedKg)} kg a week) could not be placed; see the list for reasons and suggestions.`,
    );
  if (outcome.pruning) {
    messages.push(
      `This network is large (${model.items.length} households to place), so the plan was found approximately${gap === null ? "" : `: it is at most ${(gap * 100).toFixed(2)} % longer in walking than the best possible`}; it is not proven the best. (Method: LP relaxation over each household's ${outcome.pruning.candidatesPerHousehold} most promising digesters, ${outcome.pruning.pairsAddedByPricing} more priced back in, rounded, repaired and improved.)`,
    );
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

/**
 * The optimisation core of an input, after validation, pins and the walking
 * limit: one item per household left to optimise (`householdIds[i]`), with
 * its allowed digesters (indices into `input.digesters`), decimetre costs and
 * penalty; rooms net of kept pins. For tests, benchmarks and diagnostics.
 */
export function prepareAssignmentModel(input: AssignmentInput): { model: AssignmentModel; householdIds: string[] } {
  const prep = prepare(input);
  return { model: prep.model, householdIds: prep.itemHousehold.map((i) => input.households[i]!.id) };
}

/**
 * Assigns households to digesters minimising total walking distance
 * (haversine metres) without exceeding any digester's weekly room, keeping
 * pins, honouring the walking limit, and reporting every household it cannot
 * place with the reason and a suggestion. See the module comment for the
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

/**
 * Checks a result against its input, for tests and the server's sanity
 * check before applying: digesters whose load exceeds their weekly room,
 * households neither assigned nor reported unplaced, and households listed
 * twice. Loads are recomputed from the input's kg, not trusted.
 */
export function auditAssignment(
  input: AssignmentInput,
  result: AssignmentResult,
): { overloadedDigesterIds: string[]; missingHouseholdIds: string[]; duplicateHouseholdIds: string[] } {
  const kgById = new Map(input.households.map((h) => [h.id, h.weeklyKg]));
  const load = new Map<string, number>();
  const seen = new Map<string, number>();
  for (const a of result.assignments) {
    load.set(a.digesterId, (load.get(a.digesterId) ?? 0) + (kgById.get(a.householdId) ?? 0));
    seen.set(a.householdId, (seen.get(a.householdId) ?? 0) + 1);
  }
  for (const u of result.unplaced) seen.set(u.householdId, (seen.get(u.householdId) ?? 0) + 1);
  const overloaded = input.digesters
    .filter((d, j, all) => all.findIndex((x) => x.id === d.id) === j)
    .filter(
      (d) =>
        (load.get(d.id) ?? 0) >
        (d.available && Number.isFinite(d.weeklyRoomKg) ? Math.max(0, d.weeklyRoomKg) : 0) + 1e-6,
    )
    .map((d) => d.id);
  const ids = [...new Set(input.households.map((h) => h.id))];
  return {
    overloadedDigesterIds: overloaded,
    missingHouseholdIds: ids.filter((id) => !seen.has(id)),
    duplicateHouseholdIds: [...seen].filter(([, c]) => c > 1).map(([id]) => id),
  };
}
