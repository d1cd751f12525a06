/** Demo time: day numbers relative to `today` (0; negative is the past) and the history window. */

/** Days of history, including today. */
export const HISTORY_DAYS = 60;
/** The first day of history. */
export const FIRST_DAY = -(HISTORY_DAYS - 1);

export interface Clock {
  /** Local instant on day `day` (0 = today) at hh:mm. */
  at(day: number, hour: number, minute: number): Date;
  /** Local calendar date of day `day`, YYYY-MM-DD. */
  date(day: number): string;
  today: Date;
}

/** The demo's local-time clock around `today`. */
export function makeClock(today: Date): Clock {
  const y = today.getFullYear();
  const m = today.getMonth();
  const d = today.getDate();
  const pad = (n: number) => String(n).padStart(2, "0");
  return {
    today,
    at: (day, hour, minute) => new Date(y, m, d + day, hour, minute),
    date: (day) => {
      const local = new Date(y, m, d + day, 12, 0);
      return `${local.getFullYear()}-${pad(local.getMonth() + 1)}-${pad(local.getDate())}`;
    },
  };
}
