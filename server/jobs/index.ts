/** node-cron schedules; each job only calls a service. Filled by the outbox and reminder work. */
const stops: Array<() => Promise<void> | void> = [];

export function startJobs() {
  // Jobs register here as they are added (outbox sender, reminders).
}

export async function stopJobs() {
  await Promise.all(stops.map((stop) => stop()));
  stops.length = 0;
}
