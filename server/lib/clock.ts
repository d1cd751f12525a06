import { env } from "../config/env";

/** The neighbourhood's calendar date (YYYY-MM-DD) of an instant, in the configured TIMEZONE. */
export function localDate(at: Date, timeZone = env().TIMEZONE): string {
  // en-CA formats as YYYY-MM-DD.
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(at);
}

export { addDays, daysBetween } from "../../shared/domain/calendar";

/** Milliseconds the time zone is ahead of UTC at an instant. */
function zoneOffsetMs(at: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat("en-GB", {
    timeZone,
    hourCycle: "h23",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    second: "2-digit",
  }).formatToParts(new Date(at));
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value ?? 0);
  const asUtc = Date.UTC(get("year"), get("month") - 1, get("day"), get("hour"), get("minute"), get("second"));
  return asUtc - Math.floor(at / 1000) * 1000;
}

/** The instant a calendar day (YYYY-MM-DD) begins in the neighbourhood's time zone. */
export function startOfLocalDay(isoDate: string, timeZone = env().TIMEZONE): Date {
  const midnightUtc = Date.parse(`${isoDate}T00:00:00Z`);
  // Two passes settle days on which the offset changes (summer time starts or ends).
  let guess = midnightUtc - zoneOffsetMs(midnightUtc, timeZone);
  guess = midnightUtc - zoneOffsetMs(guess, timeZone);
  return new Date(guess);
}
