/**
 * Rebalancing today: pending drop-offs for today and tomorrow at digesters that cannot take
 * them (resting/offline, or whose remaining room for that day is below their pending load),
 * with the nearest other digesters that have room; the coordinator moves one or all.
 *
 * Room on a day: today = today's feed budget (science core, after what is fed or accepted)
 * minus what else is pending today; tomorrow = day 1 of the weekly-room projection
 * (shared/domain/weekly-room.ts) minus what is pending tomorrow. Fresh kg throughout.
 *
 * Only drop-offs a resident still has to carry are listed and movable: one made by marking a
 * collection-round stop collected is already at the round's end digester (it still takes room).
 */
import type { Transaction } from "sequelize";
import { haversineM, isValidLatLng } from "../../../shared/domain/geo";
import { closedPhrase, closedReason } from "../../../shared/domain/room";
import { freshKgFromKgVs } from "../../../shared/domain/scraps";
import { projectWeeklyRoom } from "../../../shared/domain/weekly-room";
import type { RebalanceItem, RebalanceView } from "../../../shared/schemas/assignments";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest } from "../../lib/app-error";
import { addDays, localDate } from "../../lib/clock";
import * as digesters from "../digesters";
import { type DigesterToday, loadDigestersToday } from "../digesters";
import { residentsOf } from "../people";
import { dropOffsMadeByRounds } from "../rounds";
import { dropOffMovedEmail } from "../assignments/assignments.emails";
import { enqueueEmail } from "../outbox/outbox.service";

const SUGGESTIONS = 3;

/**
 * Pending drop-offs on `days` that a resident still has to carry: one made by marking a
 * collection-round stop collected is left out (its buckets are already at the round's end
 * digester; it still counts in the pending loads). With `lock`, locked after the digesters.
 */
async function movableDropOffs(
  days: string[],
  options: { transaction?: Transaction; lock?: boolean } = {},
): Promise<digesters.PendingDropOff[]> {
  const pending = await digesters.pendingDropOffs(days, options);
  const collected = new Set(
    await dropOffsMadeByRounds(
      pending.map((p) => p.id),
      options.transaction,
    ),
  );
  return pending.filter((p) => !collected.has(p.id));
}

interface DayRoom {
  /** Room left for new pending loads, fresh kg (capacity − pending). */
  free: Map<string, number>;
  pending: Map<string, number>;
}

const key = (digesterId: number, day: string) => `${digesterId}|${day}`;

/** Capacity of each digester on `today` and `tomorrow`, fresh kg, before pending loads. */
function capacity(state: DigesterToday, day: string): number {
  if (state.closed) return 0;
  if (day === state.today) return state.budget.budgetKgScraps;
  const projection = projectWeeklyRoom({
    limits: state.budget.limits,
    previous7DaysKgVs: state.budget.limits.weekRamp === null ? null : state.previous7DaysKgVs,
    fedTodayKgVs: state.committedTodayKgVs,
    closed: false,
  });
  return freshKgFromKgVs(projection.dailyKgVs[1] ?? 0);
}

function rooms(states: DigesterToday[], loads: digesters.PendingLoad[], days: string[]): DayRoom {
  const pend = new Map<string, number>();
  for (const l of loads)
    pend.set(key(l.digesterId, l.forDate), (pend.get(key(l.digesterId, l.forDate)) ?? 0) + l.freshKg);
  const free = new Map<string, number>();
  for (const s of states)
    for (const day of days)
      free.set(key(s.digester.id, day), capacity(s, day) - (pend.get(key(s.digester.id, day)) ?? 0));
  return { free, pending: pend };
}

function problemOf(state: DigesterToday, day: string, room: DayRoom): string | null {
  if (state.closed) {
    return `${closedPhrase(state.digester.name, closedReason(state.digester)!)}.`;
  }
  const pending = room.pending.get(key(state.digester.id, day)) ?? 0;
  const free = room.free.get(key(state.digester.id, day)) ?? 0;
  if (pending > 0 && free < -1e-9) {
    const cap = pending + free;
    return `${state.digester.name} can take ${cap.toFixed(1)} kg on ${day} but ${pending.toFixed(1)} kg is waiting (${state.budget.explanation.split(". ")[0]}).`;
  }
  return null;
}

/** Kg below which a target's room still counts as enough (the same tolerance `moveDropOffs` allows). */
const EPS = 1e-9;

/** The nearest open digesters with room (`free`, fresh kg by digester and day) for this drop-off. */
function suggestionsFor(p: digesters.PendingDropOff, states: DigesterToday[], free: Map<string, number>) {
  const from = states.find((s) => s.digester.id === p.digesterId);
  const origin = isValidLatLng(p.lat, p.lng) ? { lat: p.lat!, lng: p.lng! } : from ? from.digester : null;
  return states
    .filter(
      (s) =>
        s.digester.id !== p.digesterId &&
        !s.closed &&
        (free.get(key(s.digester.id, p.forDate)) ?? 0) >= p.freshKg - EPS,
    )
    .map((s) => ({
      digesterId: s.digester.id,
      name: s.digester.name,
      distanceM: origin ? Math.round(haversineM(origin, s.digester)) : 0,
      roomKg: Math.round((free.get(key(s.digester.id, p.forDate)) ?? 0) * 10) / 10,
    }))
    .sort((a, b) => a.distanceM - b.distanceM || a.digesterId - b.digesterId)
    .slice(0, SUGGESTIONS);
}

/** The rebalancing panel: what needs moving today and tomorrow, and where to. */
export async function rebalancingView(now = new Date()): Promise<RebalanceView> {
  const today = localDate(now);
  const days = [today, addDays(today, 1)];
  const [states, pending, loads] = await Promise.all([
    loadDigestersToday(null, { now }),
    movableDropOffs(days),
    digesters.pendingLoads(days),
  ]);
  const room = rooms(states, loads, days);
  const byId = new Map(states.map((s) => [s.digester.id, s]));
  // Suggestions are made one item after another, in the list's order, against what is left:
  // each item's first suggestion takes its kg off that digester's room for that day before the
  // next item is looked at, so the first suggestions together fit ("Move all" sends exactly
  // those). The room freed at the item's own digester is not handed out again here, so any
  // subset of the first suggestions fits too, in any order. Problems and the digesters'
  // summary are judged on the room as it is now (`room`, left untouched).
  const free = new Map(room.free);
  const items: RebalanceItem[] = [];
  for (const p of pending) {
    const state = byId.get(p.digesterId);
    if (!state) continue;
    const why = problemOf(state, p.forDate, room);
    if (why === null) continue;
    const suggestions = suggestionsFor(p, states, free);
    const first = suggestions[0];
    if (first)
      free.set(key(first.digesterId, p.forDate), (free.get(key(first.digesterId, p.forDate)) ?? 0) - p.freshKg);
    items.push({
      dropOffId: p.id,
      forDate: p.forDate,
      householdId: p.householdId,
      householdName: p.householdName,
      freshKg: p.freshKg,
      digesterId: p.digesterId,
      digesterName: state.digester.name,
      why,
      suggestions,
    });
  }
  const involved = new Set(items.map((i) => i.digesterId));
  return {
    items,
    digesters: states
      .filter((s) => involved.has(s.digester.id))
      .map((s) => ({
        id: s.digester.id,
        name: s.digester.name,
        status: s.digester.status,
        roomKg: Math.round(Math.max(0, room.free.get(key(s.digester.id, today)) ?? 0) * 10) / 10,
        pendingKg: Math.round((room.pending.get(key(s.digester.id, today)) ?? 0) * 10) / 10,
        problem: problemOf(s, today, room) ?? problemOf(s, days[1]!, room),
      })),
  };
}

/**
 * Moves pending drop-offs (one transaction, digesters locked as the steward's day locks them):
 * each must still be pending today or tomorrow, and the target must be open with room for it on
 * that day after the moves before it; a drop-off collected on a round is not movable. All or
 * nothing: any refusal names its field (`moves.<i>.…`). Residents are told by e-mail (outbox,
 * same transaction).
 */
export async function moveDropOffs(
  moves: { dropOffId: number; digesterId: number }[],
  now = new Date(),
): Promise<{ moved: number; emailsQueued: number }> {
  return sequelize().transaction(async (transaction: Transaction) => {
    const today = localDate(now);
    const days = [today, addDays(today, 1)];
    const states = await loadDigestersToday(null, { now, transaction, lock: true });
    const allPending = await movableDropOffs(days, { transaction, lock: true });
    const room = rooms(states, await digesters.pendingLoads(days, transaction), days);
    const byId = new Map(states.map((s) => [s.digester.id, s]));
    const pendingById = new Map(allPending.map((p) => [p.id, p]));
    const seen = new Set<number>();
    let emailsQueued = 0;
    let moved = 0;
    for (const [i, m] of moves.entries()) {
      const dropOffField = `moves.${i}.dropOffId`;
      const digesterField = `moves.${i}.digesterId`;
      if (seen.has(m.dropOffId))
        throw badRequest(`Drop-off ${m.dropOffId} appears twice.`, { [dropOffField]: "Listed twice." });
      seen.add(m.dropOffId);
      const p = pendingById.get(m.dropOffId);
      if (!p) {
        const status = await digesters.dropOffStatus(m.dropOffId, transaction);
        if (!status)
          throw new AppError(404, "not_found", `Drop-off ${m.dropOffId} was not found. Nothing was moved.`, {
            [dropOffField]: "No such drop-off.",
          });
        const onRound = (await dropOffsMadeByRounds([m.dropOffId], transaction)).length > 0;
        if (onRound && status.status === "pending" && days.includes(status.forDate)) {
          throw new AppError(
            409,
            "not_movable",
            `Drop-off ${m.dropOffId} was collected on a collection round: its buckets are already at the round's digester, so it cannot be moved. Nothing was moved.`,
            { [dropOffField]: "Collected on a round; its buckets are already at the digester." },
          );
        }
        throw new AppError(
          409,
          "not_movable",
          `Drop-off ${m.dropOffId} can no longer be moved: only pending drop-offs for today or tomorrow can (it is ${status.status}, ${status.forDate}). Nothing was moved.`,
          { [dropOffField]: `It is ${status.status}, ${status.forDate}.` },
        );
      }
      const target = byId.get(m.digesterId);
      if (!target)
        throw badRequest(`Digester ${m.digesterId} does not exist.`, { [digesterField]: "No such digester." });
      if (m.digesterId === p.digesterId) continue;
      if (target.closed) {
        throw new AppError(
          409,
          "digester_closed",
          `${target.digester.name} is ${target.digester.status}; choose another digester. Nothing was moved.`,
          {
            [digesterField]: `${target.digester.name} is ${target.digester.status}.`,
          },
        );
      }
      const free = room.free.get(key(m.digesterId, p.forDate)) ?? 0;
      if (free < p.freshKg - EPS) {
        throw new AppError(
          409,
          "no_room",
          `${target.digester.name} has room for ${Math.max(0, free).toFixed(1)} kg on ${p.forDate}, not ${p.freshKg.toFixed(1)} kg. Nothing was moved.`,
          { [digesterField]: `Room for ${Math.max(0, free).toFixed(1)} kg on ${p.forDate}.` },
        );
      }
      const fromName = byId.get(p.digesterId)?.digester.name ?? "your digester";
      const why = problemOf(byId.get(p.digesterId)!, p.forDate, room) ?? `${fromName} has too little room that day.`;
      room.free.set(key(m.digesterId, p.forDate), free - p.freshKg);
      room.free.set(key(p.digesterId, p.forDate), (room.free.get(key(p.digesterId, p.forDate)) ?? 0) + p.freshKg);
      await digesters.moveDropOff(transaction, p.id, m.digesterId);
      moved++;
      for (const r of await residentsOf([p.householdId], transaction)) {
        await enqueueEmail(
          transaction,
          dropOffMovedEmail({
            to: r.email,
            name: r.name,
            forDate: p.forDate,
            fromName,
            toName: target.digester.name,
            why,
          }),
        );
        emailsQueued++;
      }
    }
    // A "move" to the digester it already has is skipped and not counted.
    return { moved, emailsQueued };
  });
}
