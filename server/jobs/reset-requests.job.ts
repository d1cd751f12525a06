/**
 * Handles waiting password reset requests straight after each is stored (once its answer has
 * gone) and every 15 seconds, for requests another process stored or a crash left behind.
 * Several app processes may run this: each request row is taken `FOR UPDATE SKIP LOCKED`.
 */
import { createTask } from "node-cron";
import { env } from "../config/env";
import { logger } from "../lib/logger";
import { onResetRequested, processResetRequests } from "../modules/auth/auth.service";

export function startResetRequestsJob(): () => Promise<void> {
  let running: Promise<unknown> | undefined;
  let again = false;
  const run = () => {
    // Coalesce: a nudge during a run asks for one more run after it, never a parallel one.
    if (running) {
      again = true;
      return;
    }
    running = processResetRequests()
      .catch((err: unknown) => logger.warn({ err: (err as Error).message }, "reset requests run failed"))
      .finally(() => {
        running = undefined;
        if (again) {
          again = false;
          run();
        }
      });
  };
  const task = createTask("*/15 * * * * *", run, {
    name: "reset-requests",
    timezone: env().TIMEZONE,
    noOverlap: true,
  });
  const stopListening = onResetRequested(run);
  void task.start();
  return async () => {
    stopListening();
    await task.stop();
    await task.destroy();
    await running;
  };
}
