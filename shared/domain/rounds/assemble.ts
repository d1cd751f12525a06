/**
 * From the solver's index rounds to the plan the caller reads.
 */
import { KG_EPS } from "./model";
import { kg, metres } from "../../units";
import { type Ended, type Network, loadOf } from "./network";
import type { CollectionPlan, CollectionRound, RoundStop } from "./result";

/**
 * Turns index rounds into the {@link CollectionPlan}: each round gets the
 * nearest volunteer whose bike carries it, legs are measured, stops left
 * over are reported as without room, and the load per digester is summed.
 */
export function buildPlan(
  net: Network,
  ended: Ended[],
  dropped: number[],
  method: CollectionPlan["method"],
): CollectionPlan {
  const n = net.stopIdx.length;
  const E = net.rooms.length;
  const { volunteers, digesters, stops } = net.input;
  const unplaced = [...net.unplaced];
  for (const a of dropped) {
    const s = stops[net.stopIdx[a]!]!;
    unplaced.push({
      householdId: s.householdId,
      loadKg: kg(s.loadKg),
      reason: "noDigesterWithRoom",
      takenByOtherRounds: true,
      largestRoomKg: kg(net.maxRoomKg),
      maxEndLegM: metres(net.maxEndLegM),
    });
  }
  const delivered = new Float64Array(E);
  const rounds: CollectionRound[] = ended.map(({ seq, digester }) => {
    const loadKg = loadOf(net, seq);
    let v = -1;
    net.bikes.forEach((b, k) => {
      if (b + KG_EPS >= loadKg && (v < 0 || net.dVS[k * n + seq[0]!]! < net.dVS[v * n + seq[0]!]!)) v = k;
    });
    const roundStops: RoundStop[] = seq.map((a, k) => {
      const s = stops[net.stopIdx[a]!]!;
      const legM = k === 0 ? net.dVS[v * n + a]! : net.dSS[seq[k - 1]! * n + a]!;
      return { householdId: s.householdId, loadKg: kg(s.loadKg), lat: s.lat!, lng: s.lng!, legM: metres(legM) };
    });
    const endLegM = net.dSE[seq[seq.length - 1]! * E + digester]!;
    delivered[digester] = delivered[digester]! + loadKg;
    return {
      volunteerId: volunteers[v]!.id,
      stops: roundStops,
      endDigesterId: digesters[digester]!.id,
      loadKg: kg(loadKg),
      lengthM: metres(roundStops.reduce((s, x) => s + x.legM, 0) + endLegM),
      endLegM: metres(endLegM),
    };
  });
  const messages = [...net.messages];
  if (unplaced.length > 0) messages.push({ code: "stopsUnplaced", count: unplaced.length });
  return {
    method,
    rounds,
    unplacedStops: unplaced,
    totalLengthM: metres(rounds.reduce((s, r) => s + r.lengthM, 0)),
    digesterLoads: digesters.map((d, e) => ({
      digesterId: d.id,
      loadKg: kg(delivered[e]!),
      roomKg: kg(net.rooms[e]!),
    })),
    messages,
  };
}
