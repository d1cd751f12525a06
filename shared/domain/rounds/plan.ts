/**
 * The planner the product calls: construction with several savings shapes,
 * local search, then ruin and recreate.
 */
import { mulberry32 } from "../../random";
import { buildPlan } from "./assemble";
import { assignEnds, breakInfeasible, insertLeftovers, savings, twoOpt } from "./construction";
import { exactOnNetwork } from "./exact";
import { defaultImprovementIterations, endAwareSearch, ruinAndRecreate } from "./improvement";
import type { CollectionRoundsInput, CollectionRoundsOptions } from "./model";
import { type Ended, constructionCost, fixedEndCost, prepareNetwork } from "./network";
import type { CollectionPlan } from "./result";

/**
 * Plans collection rounds (see the module comment for model and method):
 * every round's load fits its volunteer's bike, the rounds ending at a
 * digester together stay within its room, and stops that cannot be planned
 * are listed with the reason. Deterministic for a given input and options.
 */
export function planCollectionRounds(
  input: CollectionRoundsInput,
  options: CollectionRoundsOptions = {},
): CollectionPlan {
  const net = prepareNetwork(input, options);
  if (net.stopIdx.length === 0) return buildPlan(net, [], []);
  if (net.stopIdx.length <= (options.exactMaxStops ?? 0)) {
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
  return buildPlan(net, ended, [...improved.dropped, ...insertLeftovers(net, ended, aside)]);
}
