/**
 * Sends queued e-mail every 15 seconds, and straight after a transaction queues some. Several
 * app processes may run this; the advisory lock inside deliverDueEmails() lets one send.
 */
import { createTask } from "node-cron";
import { env } from "../config/env";
import { logger } from "../lib/logger";
import { deliverDueEmails, onEmailQueued } from "../modules/outbox/outbox.service";

export function startOutboxJob(): () => Promise<void> {
  let running: Promise<unknown> | undefined;
  let again = false;
  const run = () => {
    // Coalesce: a nudge during a run asks for one more run after it, never a parallel one.
    if (running) {
      again = true;
      return;
    }
    running = deliverDueEmails()
      .catch((err: unknown) => logger.warn({ err: (err as Error).message }, "outbox run failed"))
      .finally(() => {
        running = undefined;
        if (again) {
          again = false;
          run();
        }
      });
  };
  const task = createTask("*/15 * * * * *", run, { name: "outbox", timezone: env().TIMEZONE, noOverlap: true });
  const stopListening = onEmailQueued(run);
  void task.start();
  return async () => {
    stopListening();
    await task.stop();
    await task.destroy();
    await running;
  };
}
