/**
 * Hourly from 08:05 to 20:05 local time: reminds tomorrow's collection rounds (volunteer and
 * households) once each, so a round planned during the day is still announced the day before.
 */
import { createTask } from "node-cron";
import { env } from "../config/env";
import { logger } from "../lib/logger";
import { sendCollectionReminders } from "../modules/rounds/reminders.service";

export function startRemindersJob(): () => Promise<void> {
  const task = createTask(
    "5 8-20 * * *",
    () =>
      sendCollectionReminders()
        .then((run) => {
          if (run.rounds > 0) logger.info(run, "collection reminders queued");
        })
        .catch((err: unknown) => logger.warn({ err: (err as Error).message }, "collection reminders failed")),
    { name: "collection-reminders", timezone: env().TIMEZONE, noOverlap: true },
  );
  void task.start();
  return async () => {
    await task.stop();
    await task.destroy();
  };
}
