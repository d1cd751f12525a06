/**
 * Heuristics on a plan (`assign[i]` = digester index or −1, unplaced): the nearest-with-room
 * baseline, repair of overloads by regret, local search by relocate and swap moves, and the
 * round-repair-improve plan that is never worse than the baseline.
 * Sources: regret-based construction — Martello & Toth 1981, "An algorithm for the
 * generalized assignment problem", Operational Research '81, pp. 589–603 [memory].
 */
import { type AssignmentModel, KG_EPS, costOf, planObjectiveDm } from "./model";

/** A plan under construction: digester index per item (−1 = unplaced) and the kg it puts on each digester. */
export interface Plan {
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
export function greedyNearestWithRoom(model: AssignmentModel): Plan {
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

/**
 * Round-repair-improve from an LP point, checked against the baseline
 * (nearest with room, input order): when the baseline is cheaper, the
 * baseline improved by local search is used instead, so the answer is
 * never worse than the baseline.
 */
export function heuristicPlan(model: AssignmentModel, start: Int32Array | null): Plan {
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
