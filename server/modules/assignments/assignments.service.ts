/**
 * The coordinator's assignment board: proposals (nothing changes), applying one in a single
 * transaction guarded by a version, and pins. Households bring their expected weekly kg (last
 * 8 weeks of fed or accepted drop-offs, or the declared amount with under 2 weeks of history);
 * digesters offer their weekly room (shared/domain/weekly-room.ts from today's feed budget).
 */
import { Transaction } from "sequelize";
import {
  type AssignmentDigester,
  type AssignmentHousehold,
  type AssignmentInput,
  nearestWithRoomBaseline,
} from "../../../shared/domain/assignment";
import { haversineM, isValidLatLng } from "../../../shared/domain/geo";
import { householdWeeklyKg } from "../../../shared/domain/room";
import { WEEKLY_ROOM_METHOD, projectWeeklyRoom } from "../../../shared/domain/weekly-room";
import type {
  ApplyRequest,
  ApplyResult,
  Proposal,
  ProposalAssignment,
  ProposalDigester,
  ProposalNote,
  ProposalRequest,
  ProposalUnplaced,
} from "../../../shared/schemas/assignments";
import { proposalNoteWords, suggestionWords, unplacedWords } from "../../../shared/words/assignment-board";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, conflict, notFound } from "../../lib/app-error";
import { localDate } from "../../lib/clock";
import { type DigesterToday, loadDigestersToday, recentDeliveries } from "../digesters";
import { assignmentRows, assignmentVersion, setAssignment, type AssignmentRow } from "../households";
import { residentsOf } from "../people";
import { enqueueEmail } from "../outbox/outbox.service";
import { type MoveReason, newDigesterEmail } from "./assignments.emails";
import { solverNotes } from "./assignments.notes";
import { solveOffThread } from "./solver-pool";
import * as repo from "./assignments.repository";

export interface AssignableHousehold extends AssignmentRow {
  /** kg fresh fed or accepted in the last 56 days. */
  recentKg: number;
  /** Distinct weeks (Monday-based) with a fed or accepted drop-off in the last 56 days. */
  recentWeeks: number;
  /** First day of a fed or accepted drop-off in the last 56 days. */
  firstRecentDay: string | null;
}

/**
 * Every household with what the scheduler needs: place, current assignment and pin, declared
 * amount and its last 8 weeks of fed or accepted drop-offs.
 */
async function assignableHouseholds(today: string, transaction?: Transaction): Promise<AssignableHousehold[]> {
  const [rows, deliveries] = await Promise.all([assignmentRows(transaction), recentDeliveries(today, transaction)]);
  const byHousehold = new Map(deliveries.map((d) => [d.householdId, d]));
  return rows.map((h) => {
    const d = byHousehold.get(h.id);
    return {
      ...h,
      recentKg: d?.recentKg ?? 0,
      recentWeeks: d?.recentWeeks ?? 0,
      firstRecentDay: d?.firstRecentDay ?? null,
    };
  });
}

/** A household's expected weekly kg: shared/domain/room.ts (recent history, else declared). */
export { MIN_HISTORY_WEEKS, householdWeeklyKg } from "../../../shared/domain/room";

/** Weekly room of a digester in fresh kg (0 when closed or excluded). */
export function digesterWeeklyRoomKg(state: DigesterToday, excluded: boolean): number {
  return projectWeeklyRoom({
    limits: state.budget.limits,
    // The budget applied the week limits only when it had history; project the same way.
    previous7DaysKgVs: state.budget.limits.weekRamp === null ? null : state.previous7DaysKgVs,
    fedTodayKgVs: state.committedTodayKgVs,
    closed: state.closed || excluded,
  }).weeklyKgScraps;
}

/** A proposal: nothing is written. */
export async function propose(request: ProposalRequest, now = new Date()): Promise<Proposal> {
  const today = localDate(now);
  const [[households, version], states] = await Promise.all([
    // One snapshot for the households and the version, so a change landing in between cannot
    // give a stale proposal a fresh version (apply would then not answer 409).
    sequelize().transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ }, async (transaction) => {
      const rows = await assignableHouseholds(today, transaction);
      return [rows, await assignmentVersion(transaction)] as const;
    }),
    loadDigestersToday(null, { now }),
  ]);
  // What is worth knowing, as codes; the coordinator's words are made from them at the end.
  const notes: ProposalNote[] = [];
  const householdById = new Map(households.map((h) => [h.id, h]));
  const stateById = new Map(states.map((s) => [s.digester.id, s]));
  const digesterName = (id: number | string) => stateById.get(Number(id))?.digester.name ?? `digester ${id}`;
  const householdName = (id: number | string) => householdById.get(Number(id))?.name ?? `household ${id}`;

  const excluded = new Set(request.excludeDigesterIds ?? []);
  for (const id of excluded) if (!stateById.has(id)) notes.push({ code: "excludedDigesterUnknown", digesterId: id });

  // Pins: those stored, then those in the request (which win). Two request pins for one household contradict.
  const pins = new Map<number, number>();
  const unpins = new Set(request.unpins ?? []);
  for (const h of households)
    if (h.pinned && h.assignedDigesterId !== null && !unpins.has(h.id)) pins.set(h.id, h.assignedDigesterId);
  const requested = new Map<number, number>();
  for (const pin of request.pins ?? []) {
    if (!householdById.has(pin.householdId)) {
      notes.push({ code: "pinHouseholdUnknown", householdId: pin.householdId });
      continue;
    }
    const earlier = requested.get(pin.householdId);
    if (earlier !== undefined && earlier !== pin.digesterId) {
      notes.push({
        code: "pinsContradictory",
        household: { id: pin.householdId, name: householdName(pin.householdId) },
        keptDigester: { id: earlier, name: digesterName(earlier) },
        droppedDigester: { id: pin.digesterId, name: digesterName(pin.digesterId) },
      });
      continue;
    }
    requested.set(pin.householdId, pin.digesterId);
    pins.set(pin.householdId, pin.digesterId);
  }

  // Digesters that can take nobody are left out of the model (they only slow HiGHS down), except
  // those a pin names, so the contradiction is reported; their load is 0 below.
  const pinnedTo = new Set([...pins.values()].map(String));
  const modelDigesters = states
    .map<AssignmentDigester>((s) => ({
      id: String(s.digester.id),
      lat: s.digester.lat,
      lng: s.digester.lng,
      weeklyRoomKg: digesterWeeklyRoomKg(s, excluded.has(s.digester.id)),
      available: !s.closed && !excluded.has(s.digester.id),
    }))
    .filter((d) => (d.available && d.weeklyRoomKg > 0) || pinnedTo.has(d.id));
  const weekly = new Map(households.map((h) => [h.id, householdWeeklyKg(h, today)]));
  const input: AssignmentInput = {
    households: households.map<AssignmentHousehold>((h) => ({
      id: String(h.id),
      lat: h.lat,
      lng: h.lng,
      weeklyKg: weekly.get(h.id)!,
      pinnedDigesterId: pins.has(h.id) ? String(pins.get(h.id)) : null,
    })),
    digesters: modelDigesters,
    maxWalkingDistanceM: request.maxWalkM ?? null,
  };

  // On the worker thread: a tight network can keep HiGHS busy for seconds, and other requests go on meanwhile.
  const { result, solveMs } = await solveOffThread(input, { timeLimitS: 10 });
  const baseline = nearestWithRoomBaseline(input);

  notes.push(
    ...solverNotes(result, {
      household: householdName,
      digester: (id) => stateById.get(id)?.digester.name ?? null,
    }),
  );

  const noLocation = result.unplaced.filter((u) => u.reason === "noLocation");
  if (noLocation.length > 0) {
    notes.push({
      code: "householdsWithoutLocation",
      households: noLocation.map((u) => ({ id: Number(u.householdId), name: householdName(u.householdId) })),
    });
  }
  const available = modelDigesters.filter((d) => d.available);
  const outOfReach = result.unplaced.filter((u) => u.reason === "noDigesterWithinReach");
  if (outOfReach.length > 0 && request.maxWalkM != null && available.length > 0) {
    let needed = 0;
    for (const u of outOfReach) {
      const h = householdById.get(Number(u.householdId))!;
      if (!isValidLatLng(h.lat, h.lng)) continue;
      const nearest = Math.min(...available.map((d) => haversineM({ lat: h.lat!, lng: h.lng! }, d)));
      needed = Math.max(needed, nearest);
    }
    notes.push({
      code: "walkingLimitUnreachable",
      walkingLimitM: request.maxWalkM,
      householdCount: outOfReach.length,
      neededM: needed,
    });
  }
  if (available.length === 0) notes.push({ code: "noDigesterTakingScraps" });
  const noRoom = states.filter((s) => !s.closed && !excluded.has(s.digester.id) && digesterWeeklyRoomKg(s, false) <= 0);
  if (noRoom.length > 0) {
    notes.push({
      code: "digestersWithoutRoom",
      digesters: noRoom.map((s) => ({ id: s.digester.id, name: s.digester.name })),
    });
  }

  const assignments: ProposalAssignment[] = result.assignments.map((a) => {
    const h = householdById.get(Number(a.householdId))!;
    return {
      householdId: h.id,
      householdName: h.name,
      lat: h.lat!,
      lng: h.lng!,
      fromDigesterId: h.assignedDigesterId,
      toDigesterId: Number(a.digesterId),
      distanceM: a.distanceM,
      weeklyKg: a.weeklyKg,
      pinned: a.pinned,
      changed: h.assignedDigesterId !== Number(a.digesterId) || h.pinned !== a.pinned,
    };
  });
  const loads = new Map(result.digesterLoads.map((l) => [Number(l.digesterId), l]));
  const digesters: ProposalDigester[] = states.map((s) => {
    const l = loads.get(s.digester.id);
    return {
      id: s.digester.id,
      name: s.digester.name,
      lat: s.digester.lat,
      lng: s.digester.lng,
      status: s.digester.status,
      excluded: excluded.has(s.digester.id),
      available: !s.closed && !excluded.has(s.digester.id),
      loadKg: l?.loadKg ?? 0,
      roomKg: l?.roomKg ?? digesterWeeklyRoomKg(s, excluded.has(s.digester.id)),
      utilisation: l?.utilisation ?? null,
      householdCount: l?.householdCount ?? 0,
    };
  });
  const unplaced: ProposalUnplaced[] = result.unplaced.map((u) => {
    const coded = {
      householdId: Number(u.householdId),
      householdName: householdName(u.householdId),
      weeklyKg: u.weeklyKg,
      reason: u.reason,
      walkingLimitM: u.walkingLimitM,
      suggestedAction:
        u.suggestion.kind === "anotherDay"
          ? {
              code: "anotherDay" as const,
              digesterId: Number(u.suggestion.digesterId),
              digesterName: digesterName(u.suggestion.digesterId),
              distanceM: u.suggestion.distanceM,
            }
          : { code: "compostAtHome" as const },
    };
    return { ...coded, message: unplacedWords(coded), suggestion: suggestionWords(coded) };
  });
  let currentDistanceM = 0;
  for (const h of households) {
    const d = h.assignedDigesterId === null ? undefined : stateById.get(h.assignedDigesterId);
    if (d && isValidLatLng(h.lat, h.lng)) currentDistanceM += haversineM({ lat: h.lat!, lng: h.lng! }, d.digester);
  }
  return {
    version,
    assignments,
    digesters,
    unplaced,
    messages: notes.map(proposalNoteWords),
    notes,
    totalDistanceM: result.totalDistanceM,
    baselineDistanceM: baseline.totalDistanceM,
    currentDistanceM,
    changedCount: assignments.filter((a) => a.changed).length,
    method: result.method,
    solverStatus: result.solverStatus,
    provenOptimal: result.provenOptimal,
    gapToLpBound: result.gapToLpBound,
    solveMs: Math.round(solveMs * 10) / 10,
    weeklyRoomMethod: WEEKLY_ROOM_METHOD,
  };
}

interface Move {
  householdId: number;
  fromDigesterId: number | null;
  toDigesterId: number;
}

/**
 * Why a household moves, as a code (the e-mail words it): its digester is closed, or over its
 * safe weekly feed, or the new one is closer; else the general reason. `loadsBefore` is each
 * digester's expected weekly kg before the change.
 */
function moveReason(
  m: Move,
  ctx: {
    stateById: Map<number, DigesterToday>;
    householdById: Map<number, AssignableHousehold>;
    loadsBefore: Map<number, number>;
  },
): MoveReason {
  const from = m.fromDigesterId === null ? undefined : ctx.stateById.get(m.fromDigesterId);
  const to = ctx.stateById.get(m.toDigesterId);
  if (!to) return { code: "rebalanced" };
  if (!from) return { code: "firstDigester", toName: to.digester.name };
  if (from.closed) {
    return {
      code: "digesterClosed",
      fromName: from.digester.name,
      status: from.digester.status,
      statusReason: from.digester.statusReason || null,
    };
  }
  const room = digesterWeeklyRoomKg(from, false);
  const load = ctx.loadsBefore.get(from.digester.id) ?? 0;
  if (load > room + 1e-6) {
    return {
      code: "digesterOverFull",
      fromName: from.digester.name,
      expectedKg: load,
      safeKg: room,
      toName: to.digester.name,
    };
  }
  const h = ctx.householdById.get(m.householdId);
  if (h && isValidLatLng(h.lat, h.lng)) {
    const home = { lat: h.lat!, lng: h.lng! };
    const closer = haversineM(home, from.digester) - haversineM(home, to.digester);
    if (closer >= 10)
      return { code: "closer", toName: to.digester.name, fromName: from.digester.name, closerM: closer };
  }
  return { code: "rebalanced" };
}

async function notifyMoves(
  transaction: Transaction,
  moves: Move[],
  why: MoveReason | ((m: Move) => MoveReason),
  now: Date,
): Promise<number> {
  if (moves.length === 0) return 0;
  const [residents, states, households] = await Promise.all([
    residentsOf(
      moves.map((m) => m.householdId),
      transaction,
    ),
    loadDigestersToday(null, { now, transaction }),
    assignableHouseholds(localDate(now), transaction),
  ]);
  const stateById = new Map(states.map((s) => [s.digester.id, s.digester]));
  const householdById = new Map(households.map((h) => [h.id, h]));
  let queued = 0;
  for (const m of moves) {
    const h = householdById.get(m.householdId);
    const to = stateById.get(m.toDigesterId);
    if (!h || !to) continue;
    const distanceM = isValidLatLng(h.lat, h.lng) ? haversineM({ lat: h.lat!, lng: h.lng! }, to) : null;
    for (const r of residents.filter((x) => x.householdId === m.householdId)) {
      await enqueueEmail(
        transaction,
        newDigesterEmail({
          to: r.email,
          name: r.name,
          householdName: h.name,
          digesterName: to.name,
          siteDescription: to.siteDescription,
          distanceM,
          previousDigesterName: m.fromDigesterId === null ? null : (stateById.get(m.fromDigesterId)?.name ?? null),
          why: typeof why === "function" ? why(m) : why,
        }),
      );
      queued++;
    }
  }
  return queued;
}

/**
 * Applies the coordinator's changes in one transaction. The proposal's version must still be
 * the current one (checked under an advisory lock that every assignment change takes), else 409
 * and nothing is written. Each moved household's active residents get an e-mail via the outbox.
 */
export async function apply(request: ApplyRequest, now = new Date()): Promise<ApplyResult> {
  return sequelize().transaction(async (transaction) => {
    await repo.lockAssignments(transaction);
    const current = await assignmentVersion(transaction);
    if (current !== request.version) {
      throw conflict(
        "The assignment changed since this proposal was made (another coordinator applied one, or a pin changed). Run a new proposal; nothing was changed.",
      );
    }
    const households = await assignableHouseholds(localDate(now), transaction);
    const byId = new Map(households.map((h) => [h.id, h]));
    const states = await loadDigestersToday(null, { now, transaction });
    const stateById = new Map(states.map((s) => [s.digester.id, s]));
    const seen = new Set<number>();
    const fields: Record<string, string> = {};
    request.changes.forEach((c, i) => {
      if (!byId.has(c.householdId)) fields[`changes.${i}.householdId`] = `Household ${c.householdId} does not exist.`;
      else if (seen.has(c.householdId))
        fields[`changes.${i}.householdId`] = `Household ${c.householdId} appears twice.`;
      seen.add(c.householdId);
      if (c.digesterId !== null) {
        const s = stateById.get(c.digesterId);
        if (!s) fields[`changes.${i}.digesterId`] = `Digester ${c.digesterId} does not exist.`;
        else if (s.closed)
          fields[`changes.${i}.digesterId`] = `${s.digester.name} is ${s.digester.status}: it takes no households.`;
      }
      if (c.digesterId === null && c.pinned)
        fields[`changes.${i}.pinned`] = "A household can be pinned only to a digester.";
    });
    if (Object.keys(fields).length > 0)
      throw badRequest("Some changes cannot be applied; nothing was changed.", fields);
    const moves: Move[] = [];
    for (const c of request.changes) {
      const h = byId.get(c.householdId)!;
      const pinned = c.digesterId === null ? false : (c.pinned ?? h.pinned);
      await setAssignment(transaction, c.householdId, c.digesterId, pinned);
      if (c.digesterId !== null && c.digesterId !== h.assignedDigesterId) {
        moves.push({ householdId: h.id, fromDigesterId: h.assignedDigesterId, toDigesterId: c.digesterId });
      }
    }
    const today = localDate(now);
    const loadsBefore = new Map<number, number>();
    for (const h of households) {
      if (h.assignedDigesterId !== null)
        loadsBefore.set(
          h.assignedDigesterId,
          (loadsBefore.get(h.assignedDigesterId) ?? 0) + householdWeeklyKg(h, today),
        );
    }
    const why = request.reason
      ? ({ code: "coordinatorReason", text: request.reason } as const)
      : (m: Move) => moveReason(m, { stateById, householdById: byId, loadsBefore });
    const emailsQueued = await notifyMoves(transaction, moves, why, now);
    return { applied: request.changes.length, emailsQueued, version: await assignmentVersion(transaction) };
  });
}

/** Pins or unpins one household (optionally to a new digester); a move e-mails its residents. */
export async function setPin(
  householdId: number,
  input: { pinned: boolean; digesterId?: number | undefined },
  now = new Date(),
): Promise<{ householdId: number; assignedDigesterId: number | null; pinned: boolean; version: string }> {
  return sequelize().transaction(async (transaction) => {
    await repo.lockAssignments(transaction);
    const households = await assignableHouseholds(localDate(now), transaction);
    const h = households.find((x) => x.id === householdId);
    if (!h) throw notFound("The household");
    const digesterId = input.digesterId ?? h.assignedDigesterId;
    if (input.pinned && digesterId === null) {
      throw badRequest("Choose a digester to pin this household to: it has none yet.", {
        digesterId: "Choose a digester.",
      });
    }
    if (input.digesterId !== undefined) {
      const [s] = await loadDigestersToday([input.digesterId], { now, transaction });
      if (!s) throw badRequest(`Digester ${input.digesterId} does not exist.`, { digesterId: "No such digester." });
      if (s.closed)
        throw new AppError(
          409,
          "digester_closed",
          `${s.digester.name} is ${s.digester.status}: it takes no households.`,
        );
    }
    await setAssignment(transaction, householdId, digesterId, input.pinned);
    if (digesterId !== null && digesterId !== h.assignedDigesterId) {
      await notifyMoves(
        transaction,
        [{ householdId, fromDigesterId: h.assignedDigesterId, toDigesterId: digesterId }],
        { code: "rebalanced" },
        now,
      );
    }
    return {
      householdId,
      assignedDigesterId: digesterId,
      pinned: input.pinned,
      version: await assignmentVersion(transaction),
    };
  });
}
