/**
 * The steward's day: the today view, and accepting, feeding or turning away drop-offs. Every
 * decision that spends budget locks the digester row, recomputes the budget from the database
 * and writes in the same transaction (see feed-capacity.ts).
 */
import type { Transaction } from "sequelize";
import type { z } from "zod";
import type {
  AcceptDropOffSchema,
  DropOffDecision,
  FeedDropOffSchema,
  StewardDigesterDay,
  StewardToday,
  TurnAwayDropOffSchema,
} from "../../../shared/schemas/steward";
import type { Feeding } from "../../../shared/schemas/feedings";
import { sequelize } from "../../db/sequelize";
import { conflict, notFound } from "../../lib/app-error";
import { localDate } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { assertStewardOf } from "../../middleware/require-role";
import * as repo from "../digesters";
import {
  closedDigester,
  findLatestReadings,
  findStewards,
  loadDigestersToday,
  reserveToday,
  suggestedWaterLitres,
  toProfile,
  withLedgerGuard,
  type DigesterToday,
} from "../digesters";
import type { DigesterDetail } from "../../../shared/schemas/steward";
import { latestReadings, stewardBudget, stewardDropOff } from "./steward-view";

type AcceptInput = z.output<typeof AcceptDropOffSchema>;
type FeedInput = z.output<typeof FeedDropOffSchema>;
type TurnAwayInput = z.output<typeof TurnAwayDropOffSchema>;

/** The digesters on a caller's today page: coordinators see all, stewards theirs. */
function digesterIdsFor(caller: Caller): number[] | null {
  return caller.roles.includes("coordinator") ? null : caller.stewardOf;
}

/** Assembles the steward's day for the given digester states (three more queries, whatever their number). */
export async function stewardDays(states: DigesterToday[], now: Date): Promise<StewardDigesterDay[]> {
  if (states.length === 0) return [];
  const ids = states.map((s) => s.digester.id);
  const today = states[0]!.today;
  const [latest, open, fed] = await Promise.all([
    findLatestReadings(ids),
    repo.listOpenDropOffs(ids, today),
    repo.listFeedings(ids, today, today),
  ]);
  return states.map((state) => {
    const d = state.digester;
    const mine = open.filter((o) => o.digesterId === d.id);
    return {
      id: d.id,
      name: d.name,
      status: d.status,
      statusReason: d.statusReason,
      workingVolumeM3: d.workingVolumeM3,
      budget: stewardBudget(state),
      readings: latestReadings(
        latest.find((l) => l.digesterId === d.id),
        now,
      ),
      waiting: mine.filter((o) => o.status === "pending").map((o) => stewardDropOff(o, state)),
      accepted: mine.filter((o) => o.status === "accepted").map((o) => stewardDropOff(o, state)),
      fedToday: fed.filter((f) => f.digesterId === d.id),
    };
  });
}

/** `GET /api/digesters/:id`: the digester's profile and the steward's view of its day. */
export async function digesterDetail(caller: Caller, digesterId: number, now = new Date()): Promise<DigesterDetail> {
  assertStewardOf(caller, digesterId);
  const [state] = await loadDigestersToday([digesterId], { now });
  if (!state) throw notFound("This digester");
  const [stewards, [day]] = await Promise.all([findStewards(digesterId), stewardDays([state], now)]);
  return { profile: toProfile(state.digester, stewards), day: day! };
}

/** `GET /api/steward/today`. */
export async function today(caller: Caller, now = new Date()): Promise<StewardToday> {
  const ids = digesterIdsFor(caller);
  const states = ids !== null && ids.length === 0 ? [] : await loadDigestersToday(ids, { now });
  return { date: localDate(now), digesters: await stewardDays(states, now) };
}

interface Locked {
  state: DigesterToday;
  dropOff: repo.DropOffRow;
}

/** Finds the drop-off, checks the caller looks after its digester, then locks the digester and the drop-off (in that order). */
async function lockForDecision(t: Transaction, caller: Caller, dropOffId: number, now: Date): Promise<Locked> {
  const digesterId = await repo.findDropOffDigester(t, dropOffId);
  if (digesterId === null) throw notFound("This drop-off");
  assertStewardOf(caller, digesterId);
  const [state] = await loadDigestersToday([digesterId], { now, transaction: t, lock: true });
  const dropOff = await repo.lockDropOff(t, dropOffId);
  if (!state || !dropOff) throw notFound("This drop-off");
  // The drop-off could have been moved to another digester between the first read and the lock.
  if (dropOff.digesterId !== digesterId)
    throw conflict("This drop-off was just moved to another digester. Reload and try again.");
  return { state, dropOff };
}

const statusWords: Record<string, string> = {
  pending: "is still waiting",
  accepted: "was already accepted",
  fed: "was already fed",
  turned_away: "was already turned away",
  cancelled: "was cancelled by the household",
};

async function decisionAnswer(
  t: Transaction,
  dropOffId: number,
  digesterId: number,
  feeding: Feeding | null,
  now: Date,
): Promise<DropOffDecision> {
  const [after] = await loadDigestersToday([digesterId], { now, transaction: t });
  const row = await repo.lockDropOff(t, dropOffId);
  return { dropOff: stewardDropOff(row!, after), feeding, budget: stewardBudget(after!) };
}

async function feedFromDropOff(
  t: Transaction,
  caller: Caller,
  state: DigesterToday,
  dropOff: repo.DropOffRow,
  waterLitres: number | undefined,
  overrideReason: string | null,
  now: Date,
): Promise<Feeding> {
  // Status first, then the feeding: the ledger sees the accepted load leave before the fed load arrives.
  await repo.updateDropOffDecision(t, dropOff.id, { status: "fed", personId: caller.id, overrideReason });
  return repo.insertFeeding(t, {
    digesterId: state.digester.id,
    fedOn: state.today,
    fedAt: now,
    freshKg: dropOff.freshKg,
    kgVs: dropOff.kgVs,
    waterLitres:
      waterLitres ??
      suggestedWaterLitres(dropOff.freshKg, dropOff.mix, dropOff.citrusPercent, state.digester.targetTsPercent),
    dropOffId: dropOff.id,
    personId: caller.id,
    mix: dropOff.mix,
    citrusPercent: dropOff.citrusPercent,
    overrideReason,
    note: null,
  });
}

/**
 * Accepts a waiting drop-off into today's budget (or, with `feedNow`, feeds it at once). A
 * drop-off from an earlier day is accepted for today, when its load goes in; one for a later
 * day waits for that day. Beyond the budget it needs `override.reason`, which is recorded.
 */
export async function acceptDropOff(
  caller: Caller,
  dropOffId: number,
  input: AcceptInput,
  now = new Date(),
): Promise<DropOffDecision> {
  return withLedgerGuard(() =>
    sequelize().transaction(async (t) => {
      const { state, dropOff } = await lockForDecision(t, caller, dropOffId, now);
      if (dropOff.status !== "pending") {
        throw conflict(`This drop-off ${statusWords[dropOff.status] ?? "cannot be accepted"}.`);
      }
      if (dropOff.forDate > state.today) {
        throw conflict(`This drop-off is for ${dropOff.forDate}: accept it on that day, when its budget is known.`);
      }
      const reservation = await reserveToday(t, state, dropOff.kgVs, input.override);
      const overrideReason = reservation.overridden ? input.override!.reason : null;
      await repo.updateDropOffDecision(t, dropOff.id, {
        status: "accepted",
        forDate: state.today,
        personId: caller.id,
        overrideReason,
      });
      const feeding = input.feedNow
        ? await feedFromDropOff(t, caller, state, dropOff, input.waterLitres, overrideReason, now)
        : null;
      return decisionAnswer(t, dropOff.id, state.digester.id, feeding, now);
    }),
  );
}

/**
 * Feeds an accepted drop-off. Accepted today, its load is already counted; accepted on an
 * earlier day, it goes in today and needs today's room (or an override).
 */
export async function feedDropOff(
  caller: Caller,
  dropOffId: number,
  input: FeedInput,
  now = new Date(),
): Promise<DropOffDecision> {
  return withLedgerGuard(() =>
    sequelize().transaction(async (t) => {
      const { state, dropOff } = await lockForDecision(t, caller, dropOffId, now);
      if (dropOff.status !== "accepted") {
        throw conflict(
          dropOff.status === "pending"
            ? "Accept this drop-off before feeding it."
            : `This drop-off ${statusWords[dropOff.status] ?? "cannot be fed"}.`,
        );
      }
      if (state.closed) throw closedDigester(state);
      let overrideReason: string | null = null;
      if (dropOff.forDate !== state.today) {
        // Its old day's commitment is released by the status change; today's room must hold it.
        const reservation = await reserveToday(t, state, dropOff.kgVs, input.override);
        overrideReason = reservation.overridden ? input.override!.reason : null;
      }
      const feeding = await feedFromDropOff(
        t,
        caller,
        state,
        dropOff,
        input.waterLitres,
        overrideReason ?? dropOff.overrideReason,
        now,
      );
      return decisionAnswer(t, dropOff.id, state.digester.id, feeding, now);
    }),
  );
}

/** Turns a waiting or accepted drop-off away with a reason (an accepted one gives its room back). */
export async function turnAwayDropOff(
  caller: Caller,
  dropOffId: number,
  input: TurnAwayInput,
  now = new Date(),
): Promise<DropOffDecision> {
  return sequelize().transaction(async (t) => {
    const { state, dropOff } = await lockForDecision(t, caller, dropOffId, now);
    if (dropOff.status !== "pending" && dropOff.status !== "accepted") {
      throw conflict(`This drop-off ${statusWords[dropOff.status] ?? "cannot be turned away"}.`);
    }
    await repo.updateDropOffDecision(t, dropOff.id, {
      status: "turned_away",
      turnedAwayReason: input.reason,
      stewardNote: input.note ?? null,
      personId: caller.id,
    });
    return decisionAnswer(t, dropOff.id, state.digester.id, null, now);
  });
}
