/**
 * The planner the product calls: the exact solver for a date with few
 * stops, else construction with several savings shapes, local search, then
 * ruin and recreate.
 */
import { mulberry32 } from "../../random";
import { buildPlan } from "./assemble";
import { assignEnds, breakInfeasible, insertLeftovers, savings, twoOpt } from "./construction";
import { EXACT_ROUNDS_MAX_STOPS, exactOnNetwork } from "./exact";
import { defaultImprovementIterations, endAwareSearch, ruinAndRecreate } from "./improvement";
import type { CollectionRoundsInput, CollectionRoundsOptions } from "./model";
import { type Ended, constructionCost, fixedEndCost, prepareNetwork } from "./network";
import type { CollectionPlan } from "./result";

/**
 * Up to this many plannable stops a date is planned by the exact solver
 * (exactCollectionRounds: fewest stops left out, then shortest); beyond it,
 * by the heuristic. Measured on this 2-core machine while it was shared
 * (load average about 20, so the times are several times the idle ones;
 * 15 seeded cases per size and kind — neighbourhood, tight room, sparse
 * with 1.5 km caps, small bikes — best of 3 runs): up to 9 stops the exact
 * solver took at most 59 ms (mean ≤ 10 ms) where the heuristic took
 * 135–360 ms on average, and the heuristic's plans were up to 11.6 %
 * longer, or left a stop more out; at 10 stops a tight-room case took the
 * exact solver 267 ms, more than the heuristic's worst there (236 ms); at
 * 11–12 it ran out of steps on 1 and 5 of 15 tight-room cases. On 100 cases
 * of 9 stops with room just about the load, the hardest kind, it needed at
 * most 458,562 of its {@link EXACT_ROUNDS_MAX_STEPS} steps and 453 ms — still
 * within the heuristic's range, and then with the best plan.
 */
export const DEFAULT_EXACT_MAX_STOPS = 9;

/**
 * Plans collection rounds (see index.ts for model and method): every
 * round's load fits its volunteer's bike, every leg is within its cap, the
 * rounds ending at a digester together stay within its room, and stops that
 * cannot be planned are listed with the reason. A date with at most
 * {@link DEFAULT_EXACT_MAX_STOPS} plannable stops gets the exact optimum.
 * Deterministic for a given input and options.
 */
export function planCollectionRounds(
  input: CollectionRoundsInput,
  options: CollectionRoundsOptions = {},
): CollectionPlan {
  const net = prepareNetwork(input, options);
  if (net.stopIdx.length === 0) return buildPlan(net, [], [], "exact");
  if (net.stopIdx.length <= Math.min(options.exactMaxStops ?? DEFAULT_EXACT_MAX_STOPS, EXACT_ROUNDS_MAX_STOPS)) {
    // Small dates get the best plan; the exact solver gives up (null) only past its step budget.
    const exact = exactOnNetwork(net);
    if (exact) return exact;
  }
  const shapes = options.savingsShapes ?? [1, 0.6, 1.4];
  const rng = options.perturbation ? mulberry32(options.perturbation.seed) : null;
  const noise = rng && options.perturbation ? () => options.perturbation!.noise * (rng() - 0.5) : null;
  let best: { ended: Ended[]; dropped: number[]; length: number } | null = null;
  for (const lambda of shapes) {
    let routes = savings(net, lambda, noise);
    routes = routes.map((r) => twoOpt(net, r, (s) => constructionCost(net, s)));
    const leftovers: number[] = [];
    const assigned = assignEnds(net, routes, leftovers);
    const dropped = insertLeftovers(
      net,
      assigned,
      [...leftovers].sort((x, y) => net.load[y]! - net.load[x]! || x - y),
    );
    const ended = endAwareSearch(
      net,
      assigned.map(({ seq, digester }) => ({ seq: twoOpt(net, seq, (s) => fixedEndCost(net, s, digester)), digester })),
    );
    const length = ended.reduce((s, r) => s + fixedEndCost(net, r.seq, r.digester), 0);
    // Fewer dropped stops first, then shorter.
    if (
      !best ||
      dropped.length < best.dropped.length ||
      (dropped.length === best.dropped.length && length < best.length - 1e-9)
    ) {
      best = { ended, dropped, length };
    }
  }
  const iterations = options.improvementIterations ?? defaultImprovementIterations(net.stopIdx.length);
  const improved = ruinAndRecreate(net, best!.ended, best!.dropped, iterations, options.perturbation?.seed ?? 1);
  // Every step keeps rounds rideable; this only guards the plan handed out (a stop it cannot put back is reported).
  const { ended, aside } = breakInfeasible(net, improved.ended);
  return buildPlan(net, ended, [...improved.dropped, ...insertLeftovers(net, ended, aside)], "heuristic");
}
