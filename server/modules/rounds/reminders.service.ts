/**
 * Day-before collection reminders: every planned round of tomorrow not reminded yet e-mails its
 * volunteer (with the round sheet's link) and the active residents of each household on it,
 * through the outbox in one transaction with the round's mark, so a round is reminded once
 * however many app processes run the job (rows locked with SKIP LOCKED, marked, deduplicated).
 */
import { appUrl } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { addDays, localDate } from "../../lib/clock";
import { enqueueEmail } from "../outbox/outbox.service";
import * as repo from "./reminders.repository";
import { collectionReminderEmail, roundReminderEmail } from "./rounds.emails";

export interface ReminderRun {
  forDate: string;
  rounds: number;
  emailsQueued: number;
}

export async function sendCollectionReminders(now = new Date()): Promise<ReminderRun> {
  const forDate = addDays(localDate(now), 1);
  return sequelize().transaction(async (transaction) => {
    const rounds = await repo.roundsToRemind(transaction, forDate);
    const residents = await repo.stopResidents(
      transaction,
      rounds.map((r) => r.id),
    );
    let emailsQueued = 0;
    const queue = async (email: Parameters<typeof enqueueEmail>[1]) => {
      if ((await enqueueEmail(transaction, email)) > 0) emailsQueued++;
    };
    for (const round of rounds) {
      if (round.volunteerStatus === "active") {
        await queue(
          roundReminderEmail({
            to: round.volunteerEmail,
            name: round.volunteerName,
            roundId: round.id,
            forDate: round.forDate,
            stopCount: round.stopCount,
            bucketCount: round.bucketCount,
            endDigesterName: round.endDigesterName,
            link: `${appUrl()}/rounds/${round.id}`,
          }),
        );
      }
      for (const r of residents.filter((x) => x.roundId === round.id)) {
        await queue(
          collectionReminderEmail({
            to: r.email,
            name: r.name,
            roundId: round.id,
            householdName: r.householdName,
            forDate: round.forDate,
            bucketCount: r.bucketCount,
            link: `${appUrl()}/household`,
          }),
        );
      }
    }
    await repo.markReminded(
      transaction,
      rounds.map((r) => r.id),
    );
    return { forDate, rounds: rounds.length, emailsQueued };
  });
}
