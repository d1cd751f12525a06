/** Hourly: deletes expired sessions, spent rate-limit counters and old one-time links. */
import { createTask } from "node-cron";
import { env } from "../config/env";
import { logger } from "../lib/logger";
import { pruneExpired } from "../modules/auth/housekeeping.service";

export function startHousekeepingJob(): () => Promise<void> {
  const task = createTask(
    "7 * * * *",
    () => pruneExpired().catch((err: unknown) => logger.warn({ err: (err as Error).message }, "housekeeping failed")),
    { name: "housekeeping", timezone: env().TIMEZONE, noOverlap: true },
  );
  void task.start();
  return async () => {
    await task.stop();
    await task.destroy();
  };
}
