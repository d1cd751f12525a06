/** node-cron schedules; each job only calls a service. */
import { startHousekeepingJob } from "./housekeeping.job";
import { startOutboxJob } from "./outbox.job";
import { startRemindersJob } from "./reminders.job";
import { startResetRequestsJob } from "./reset-requests.job";

const stops: Array<() => Promise<void> | void> = [];

/** Starts every job (server/index.ts calls this when JOBS_ENABLED). Add new jobs here. */
export function startJobs() {
  if (stops.length > 0) return;
  stops.push(startOutboxJob());
  stops.push(startHousekeepingJob());
  stops.push(startRemindersJob());
  stops.push(startResetRequestsJob());
}

export async function stopJobs() {
  await Promise.all(stops.map((stop) => stop()));
  stops.length = 0;
}
