/**
 * Preparation of an assignment input: validation, pins, the walking limit, candidate pairs
 * and the unplaced penalty — everything before the optimisation core.
 */
import { metres } from "../../units";
import { haversineM, isValidLatLng } from "../geo";
import type { AssignmentInput } from "./input";
import type { AssignmentMessage, PinContradiction, PinContradictionKind, UnplacedReason } from "./messages";
import { type AssignmentModel, KG_EPS, type ModelItem } from "./model";

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

/** An input made ready to solve: the model, the map back to the input, pins, and what was found on the way. */
export interface Prepared {
  readonly input: AssignmentInput;
  readonly model: AssignmentModel;
  /** Input index of each model item. */
  readonly itemHousehold: readonly number[];
  /** Input index → digester index of kept pins. */
  readonly pinned: ReadonlyMap<number, number>;
  readonly preUnplaced: readonly { household: number; reason: UnplacedReason }[];
  readonly contradictions: PinContradiction[];
  readonly messages: AssignmentMessage[];
  /** Full room per digester index (0 when unusable). */
  readonly fullRoomKg: readonly number[];
  readonly usable: readonly boolean[];
  readonly pairCount: number;
}

/** Metres to the model's whole decimetres: round(10 · m). */
export const roundDm = (m: number) => Math.round(m * 10);

/**
 * Validates the input, keeps the pins that fit (in input order), applies the walking limit and
 * builds the optimisation core: per free household its allowed digesters nearest first, with
 * haversine distances rounded to whole decimetres, and its unplaced penalty
 * ({@link unplacedPenaltyM}). Problems become messages and contradictions, never throws.
 */
export function prepare(input: AssignmentInput): Prepared {
  const messages: AssignmentMessage[] = [];
  const contradictions: PinContradiction[] = [];
  const { households, digesters } = input;
  const maxM = input.maxWalkingDistanceM;
  const hasLimit = typeof maxM === "number" && Number.isFinite(maxM) && maxM >= 0;
  if (maxM !== undefined && maxM !== null && !hasLimit)
    messages.push({ code: "walkingLimitInvalid", walkingLimitM: maxM });

  const digIndex = new Map<string, number>();
  const usable: boolean[] = [];
  const fullRoom: number[] = [];
  digesters.forEach((d, j) => {
    if (digIndex.has(d.id)) messages.push({ code: "duplicateDigester", digesterId: d.id });
    else digIndex.set(d.id, j);
    const located = isValidLatLng(d.lat, d.lng);
    const roomOk = Number.isFinite(d.weeklyRoomKg) && d.weeklyRoomKg >= 0;
    const first = digIndex.get(d.id) === j;
    const ok = first && d.available && located;
    if (d.available && !located) messages.push({ code: "digesterWithoutLocation", digesterId: d.id });
    if (d.available && !roomOk)
      messages.push({ code: "digesterRoomInvalid", digesterId: d.id, weeklyRoomKg: d.weeklyRoomKg });
    usable.push(ok);
    const room = ok && roomOk ? d.weeklyRoomKg : 0;
    fullRoom.push(room);
    if (ok && room <= KG_EPS) messages.push({ code: "digesterWithoutRoom", digesterId: d.id });
  });
  if (!usable.some(Boolean) && households.length > 0) messages.push({ code: "noDigesterTakingScraps" });

  const roomLeft = [...fullRoom];
  const pinned = new Map<number, number>();
  const preUnplaced: { household: number; reason: UnplacedReason }[] = [];
  const free: number[] = [];
  const seen = new Set<string>();
  households.forEach((h, i) => {
    if (seen.has(h.id)) {
      messages.push({ code: "duplicateHousehold", householdId: h.id });
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
    const contradiction = (kind: PinContradictionKind) => {
      const weeklyRoomKg = j === undefined ? null : fullRoom[j]!;
      contradictions.push({
        code: "pinContradiction",
        householdId: h.id,
        digesterId: pin,
        kind,
        weeklyKg: h.weeklyKg,
        weeklyRoomKg,
      });
      free.push(i);
    };
    if (j === undefined) {
      contradiction("unknownDigester");
      return;
    }
    const dig = digesters[j]!;
    if (!usable[j]) {
      contradiction("digesterUnavailable");
      return;
    }
    if (h.weeklyKg > roomLeft[j]! + KG_EPS) {
      contradiction("pinsOverloadDigester");
      return;
    }
    roomLeft[j] = roomLeft[j]! - h.weeklyKg;
    pinned.set(i, j);
    if (hasLimit) {
      const dist = haversineM({ lat: h.lat!, lng: h.lng! }, dig);
      if (dist > maxM!)
        messages.push({
          code: "pinBeyondWalkingLimit",
          householdId: h.id,
          digesterId: pin,
          distanceM: metres(dist),
          walkingLimitM: maxM!,
        });
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
