/**
 * Room in today's feed budget, checked where it is spent. Callers lock the digester row first
 * (`loadDigestersToday([id], { transaction, lock: true })`), so concurrent accepts queue and
 * each sees what the previous one committed; the ledger's CHECK backs the same rule in the
 * database. Everything here runs inside the caller's transaction.
 */
import type { Transaction } from "sequelize";
import {
  closedPhrase,
  closedReason,
  fitsRoom,
  describeMix,
  dilutionWaterPerKg,
  dropOffMix,
  freshKgFromKgVs,
  FEED_LIMIT_NAMES,
  type DropOffMix,
} from "../../../shared/domain";
import type { BudgetOverride } from "../../../shared/schemas/feedings";
import { AppError, conflict } from "../../lib/app-error";
import type { DigesterToday } from "./digester-state.service";
import * as repo from "./ledger.repository";

/** Today's limit on the day's total load, kg VS: the smallest limit; 0 when the temperature is unknown or the digester is closed. */
export function todayLimitKgVs(state: DigesterToday): number {
  if (state.closed || state.budget.binding === "temperatureUnknown") return 0;
  const values = FEED_LIMIT_NAMES.flatMap((name) => {
    const v = state.budget.limits[name];
    return v === null ? [] : [v as number];
  });
  return values.length === 0 ? 0 : Math.max(0, Math.min(...values));
}

const round1 = (v: number) => Math.round(v * 10) / 10;
/** Rounds up to the ledger's 4 decimals, so a stored cap never sits below the computed one. */
const ceil4 = (v: number) => Math.ceil(v * 10_000 - 1e-6) / 10_000;

export const closedDigester = (state: DigesterToday) =>
  new AppError(
    409,
    "digester_closed",
    `${closedPhrase(state.digester.name, closedReason(state.digester)!)} and takes no scraps. Turn the drop-off away or set the digester active again.`,
  );

export interface Reservation {
  /** True when the load goes beyond today's budget on the steward's recorded override. */
  overridden: boolean;
  /** kg VS beyond the budget. */
  overrideKgVs: number;
}

/**
 * Reserves `addKgVs` of today's budget: fits → stamps the ledger; beyond the budget → 409
 * `over_budget` unless an override with a reason is given, which is then recorded as such.
 * Resting and offline digesters take nothing, override or not.
 */
export async function reserveToday(
  t: Transaction,
  state: DigesterToday,
  addKgVs: number,
  override: BudgetOverride | undefined,
): Promise<Reservation> {
  if (state.closed) throw closedDigester(state);
  const limit = todayLimitKgVs(state);
  const committed = state.committedTodayKgVs;
  const fits = fitsRoom(addKgVs, limit - committed);
  if (!fits && !override) {
    const room = Math.max(0, limit - committed);
    const roomKg = round1(freshKgFromKgVs(room));
    const needKg = round1(freshKgFromKgVs(addKgVs));
    const why =
      state.budget.binding === "temperatureUnknown"
        ? "the budget is unknown until a temperature is logged"
        : `only about ${roomKg} kg of scraps are still welcome today and this is about ${needKg} kg`;
    throw conflict(
      `Over today's budget at ${state.digester.name}: ${why}. Turn it away, or accept it with an override and a reason.`,
      {
        override: "Beyond today's budget: give a reason to override.",
      },
    );
  }
  const overrideKgVs = fits ? 0 : committed + addKgVs - Math.max(limit, committed);
  await repo.stampLedgerDay(t, state.digester.id, state.today, ceil4(limit), ceil4(overrideKgVs));
  return { overridden: !fits, overrideKgVs };
}

/** Suggested dilution water for scraps of a mix: fresh kg × (TS/TS_target − 1), litres to 0.1 (DOMAIN.md §2 limit 7). */
export function suggestedWaterLitres(
  freshKg: number,
  mix: DropOffMix | null,
  citrusPercent: number,
  targetTsPercent: number,
): number {
  const ts = describeMix(dropOffMix(mix ?? "mixed", citrusPercent)).tsPercent as number;
  return round1(freshKg * dilutionWaterPerKg(ts, targetTsPercent));
}

/** Runs `work`; the ledger's CHECK (a race past the lock, or a bug) becomes the same 409 as the application's check. */
export async function withLedgerGuard<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (err) {
    if (repo.isLedgerViolation(err)) {
      throw conflict("Over today's budget: another steward's accept took the last of the room. Reload and try again.", {
        override: "Beyond today's budget: give a reason to override.",
      });
    }
    throw err;
  }
}
