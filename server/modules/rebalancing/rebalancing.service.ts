/**
 * Rebalancing today: pending drop-offs for today and tomorrow at digesters that cannot take
 * them (resting/offline, or whose remaining room for that day is below their pending load),
 * with the nearest other digesters that have room; the coordinator moves one or all.
 *
 * Room on a day: today = today's feed budget (science core, after what is fed or accepted)
 * minus what else is pending today; tomorrow = day 1 of the weekly-room projection
 * (shared/domain/weekly-room.ts) minus what is pending tomorrow. Fresh kg throughout.
 */
import type { Transaction } from "sequelize";
import { haversineM, isValidLatLng } from "../../../shared/domain/geo";
import { freshKgFromKgVs } from "../../../shared/domain/scraps";
import { projectWeeklyRoom } from "../../../shared/domain/weekly-room";
import type { RebalanceItem, RebalanceView } from "../../../shared/schemas/assignments";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, notFound } from "../../lib/app-error";
import { addDays, localDate } from "../../lib/clock";
import { type DigesterToday, loadDigestersToday } from "../digesters/digester-state.service";
import { residentsOf } from "../assignments/assignments.repository";
import { dropOffMovedEmail } from "../assignments/assignments.emails";
import { enqueueEmail } from "../outbox/outbox.service";
import * as repo from "./rebalancing.repository";

const SUGGESTIONS = 3;

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

function rooms(states: DigesterToday[], pending: repo.PendingDropOff[], days: string[]): DayRoom {
  const pend = new Map<string, number>();
  for (const p of pending) pend.set(key(p.digesterId, p.forDate), (pend.get(key(p.digesterId, p.forDate)) ?? 0) + p.freshKg);
  const free = new Map<string, number>();
  for (const s of states) for (const day of days) free.set(key(s.digester.id, day), capacity(s, day) - (pend.get(key(s.digester.id, day)) ?? 0));
  return { free, pending: pend };
}

function problemOf(state: DigesterToday, day: string, room: DayRoom): string | null {
  if (state.closed) {
    return `${state.digester.name} is ${state.digester.status}${state.digester.statusReason ? ` (${state.digester.statusReason})` : ""}.`;
  }
  const pending = room.pending.get(key(state.digester.id, day)) ?? 0;
  const free = room.free.get(key(state.digester.id, day)) ?? 0;
  if (pending > 0 && free < -1e-9) {
    const cap = pending + free;
    return `${state.digester.name} can take ${cap.toFixed(1)} kg on ${day} but ${pending.toFixed(1)} kg is waiting (${state.budget.explanation.split(". ")[0]}).`;
  }
  return null;
}

function suggestionsFor(p: repo.PendingDropOff, states: DigesterToday[], room: DayRoom) {
  const from = states.find((s) => s.digester.id === p.digesterId);
  const origin = isValidLatLng(p.lat, p.lng) ? { lat: p.lat!, lng: p.lng! } : from ? from.digester : null;
  return states
    .filter((s) => s.digester.id !== p.digesterId && !s.closed && (room.free.get(key(s.digester.id, p.forDate)) ?? 0) >= p.freshKg)
    .map((s) => ({
      digesterId: s.digester.id,
      name: s.digester.name,
      distanceM: origin ? Math.round(haversineM(origin, s.digester)) : 0,
      roomKg: Math.round((room.free.get(key(s.digester.id, p.forDate)) ?? 0) * 10) / 10,
    }))
    .sort((a, b) => a.distanceM - b.distanceM || a.digesterId - b.digesterId)
    .slice(0, SUGGESTIONS);
}

/** The rebalancing panel: what needs moving today and tomorrow, and where to. */
export async function rebalancingView(now = new Date()): Promise<RebalanceView> {
  const today = localDate(now);
  const days = [today, addDays(today, 1)];
  const [states, pending] = await Promise.all([loadDigestersToday(null, { now }), repo.pendingDropOffs(days)]);
  const room = rooms(states, pending, days);
  const byId = new Map(states.map((s) => [s.digester.id, s]));
  const items: RebalanceItem[] = [];
  for (const p of pending) {
    const state = byId.get(p.digesterId);
    if (!state) continue;
    const why = problemOf(state, p.forDate, room);
    if (why === null) continue;
    items.push({
      dropOffId: p.id,
      forDate: p.forDate,
      householdId: p.householdId,
      householdName: p.householdName,
      freshKg: p.freshKg,
      digesterId: p.digesterId,
      digesterName: state.digester.name,
      why,
      suggestions: suggestionsFor(p, states, room),
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
 * that day after the moves before it. Residents are told by e-mail (outbox, same transaction).
 */
export async function moveDropOffs(moves: { dropOffId: number; digesterId: number }[], now = new Date()): Promise<{ moved: number; emailsQueued: number }> {
  return sequelize().transaction(async (transaction: Transaction) => {
    const today = localDate(now);
    const days = [today, addDays(today, 1)];
    const states = await loadDigestersToday(null, { now, transaction, lock: true });
    const allPending = await repo.pendingDropOffs(days, { transaction, lock: true });
    const room = rooms(states, allPending, days);
    const byId = new Map(states.map((s) => [s.digester.id, s]));
    const pendingById = new Map(allPending.map((p) => [p.id, p]));
    const seen = new Set<number>();
    let emailsQueued = 0;
    let moved = 0;
    for (const [i, m] of moves.entries()) {
      if (seen.has(m.dropOffId)) throw badRequest(`Drop-off ${m.dropOffId} appears twice.`, { [`moves.${i}.dropOffId`]: "Listed twice." });
      seen.add(m.dropOffId);
      const p = pendingById.get(m.dropOffId);
      if (!p) {
        const status = await repo.dropOffStatus(m.dropOffId, transaction);
        if (!status) throw notFound(`Drop-off ${m.dropOffId}`);
        throw new AppError(409, "not_movable", `Drop-off ${m.dropOffId} can no longer be moved: only pending drop-offs for today or tomorrow can (it is ${status.status}, ${status.forDate}). Nothing was moved.`);
      }
      const target = byId.get(m.digesterId);
      if (!target) throw badRequest(`Digester ${m.digesterId} does not exist.`, { [`moves.${i}.digesterId`]: "No such digester." });
      if (m.digesterId === p.digesterId) continue;
      if (target.closed) throw new AppError(409, "digester_closed", `${target.digester.name} is ${target.digester.status}; choose another digester. Nothing was moved.`);
      const free = room.free.get(key(m.digesterId, p.forDate)) ?? 0;
      if (free < p.freshKg - 1e-9) {
        throw new AppError(409, "no_room", `${target.digester.name} has room for ${Math.max(0, free).toFixed(1)} kg on ${p.forDate}, not ${p.freshKg.toFixed(1)} kg. Nothing was moved.`);
      }
      const fromName = byId.get(p.digesterId)?.digester.name ?? "your digester";
      const why = problemOf(byId.get(p.digesterId)!, p.forDate, room) ?? `${fromName} has too little room that day.`;
      room.free.set(key(m.digesterId, p.forDate), free - p.freshKg);
      room.free.set(key(p.digesterId, p.forDate), (room.free.get(key(p.digesterId, p.forDate)) ?? 0) + p.freshKg);
      await repo.moveDropOff(transaction, p.id, m.digesterId);
      moved++;
      for (const r of await residentsOf([p.householdId], transaction)) {
        await enqueueEmail(transaction, dropOffMovedEmail({ to: r.email, name: r.name, forDate: p.forDate, fromName, toName: target.digester.name, why }));
        emailsQueued++;
      }
    }
    // A "move" to the digester it already has is skipped and not counted.
    return { moved, emailsQueued };
  });
}
