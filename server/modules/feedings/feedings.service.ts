import { dropOffQuantities } from "../../../shared/domain";
import {
  MAX_LATE_FEEDING_DAYS,
  type CreateFeedingParsed,
  type Feeding,
  type FeedingRangeQuery,
} from "../../../shared/schemas/feedings";
import type { HandFeedingResult } from "../../../shared/schemas/steward";
import { sequelize } from "../../db/sequelize";
import { badRequest, notFound } from "../../lib/app-error";
import { addDays, localDate, startOfLocalDay } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { assertStewardOf } from "../../middleware/require-role";
import * as digesters from "../digesters";
import { stewardBudget } from "../steward/steward-view";

const DEFAULT_RANGE_DAYS = 60;
const MAX_RANGE_DAYS = 3 * 366;

/**
 * Records scraps added by hand. Today's feeding spends today's budget (beyond it only with an
 * override, recorded); a late entry for an earlier day is history and is not checked.
 * Without `waterLitres` the suggested dilution water is recorded.
 */
export async function createFeeding(
  caller: Caller,
  digesterId: number,
  input: CreateFeedingParsed,
  now = new Date(),
): Promise<HandFeedingResult> {
  assertStewardOf(caller, digesterId);
  const today = localDate(now);
  const fedOn = input.fedOn ?? today;
  if (fedOn > today)
    throw badRequest("A feeding cannot be recorded for a later day.", { fedOn: "Choose today or an earlier day." });
  if (fedOn < addDays(today, -MAX_LATE_FEEDING_DAYS)) {
    throw badRequest("That day is too long ago.", { fedOn: `Record feedings within ${MAX_LATE_FEEDING_DAYS} days.` });
  }
  return digesters.withLedgerGuard(() =>
    sequelize().transaction(async (t) => {
      const [state] = await digesters.loadDigestersToday([digesterId], { now, transaction: t, lock: true });
      if (!state) throw notFound("This digester");
      const quantities = dropOffQuantities({
        weightKg: input.freshKg,
        mix: input.mix,
        citrusPercent: input.citrusPercent,
      });
      const kgVs = Math.round(quantities.kgVs * 10_000) / 10_000;
      let overrideReason: string | null = null;
      if (fedOn === today) {
        const reservation = await digesters.reserveToday(t, state, kgVs, input.override);
        if (reservation.overridden) overrideReason = input.override!.reason;
      } else {
        await digesters.widenLedgerDay(t, digesterId, fedOn, kgVs);
      }
      const feeding = await digesters.insertFeeding(t, {
        digesterId,
        fedOn,
        // A late entry is stamped at local noon of its day.
        fedAt: fedOn === today ? now : new Date(startOfLocalDay(fedOn).getTime() + 12 * 3_600_000),
        freshKg: input.freshKg,
        kgVs,
        waterLitres:
          input.waterLitres ??
          digesters.suggestedWaterLitres(input.freshKg, input.mix, input.citrusPercent, state.digester.targetTsPercent),
        dropOffId: null,
        personId: caller.id,
        mix: input.mix,
        citrusPercent: input.citrusPercent,
        overrideReason,
        note: input.note ?? null,
      });
      const [after] = await digesters.loadDigestersToday([digesterId], { now, transaction: t });
      return { feeding, budget: stewardBudget(after!) };
    }),
  );
}

/** The days a feedings query covers (default the last 60 days to today). */
export function feedingRange(query: FeedingRangeQuery, now = new Date()): { fromDay: string; toDay: string } {
  const toDay = query.to ?? localDate(now);
  const fromDay = query.from ?? addDays(toDay, -DEFAULT_RANGE_DAYS);
  if (fromDay > toDay) throw badRequest("The range ends before it starts.", { from: "Choose a start before the end." });
  if (fromDay < addDays(toDay, -MAX_RANGE_DAYS))
    throw badRequest("The range is too long.", { from: "Choose at most three years." });
  return { fromDay, toDay };
}

/** Feedings of a digester in a range of days, oldest first. */
export async function listFeedings(
  caller: Caller,
  digesterId: number,
  query: FeedingRangeQuery,
  now = new Date(),
): Promise<Feeding[]> {
  assertStewardOf(caller, digesterId);
  const [digester] = await digesters.findDigesters([digesterId]);
  if (!digester) throw notFound("This digester");
  const { fromDay, toDay } = feedingRange(query, now);
  return digesters.listFeedings([digesterId], fromDay, toDay);
}
