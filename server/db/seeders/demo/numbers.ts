/** Small list and number helpers the demo generator and writer share. */

/** The item at `index`; throws rather than hand on `undefined`. */
export function at<T>(items: readonly T[], index: number): T {
  const item = items[index];
  if (item === undefined) throw new Error(`demo data: index ${index} out of range`);
  return item;
}

export const round1 = (value: number): number => Math.round(value * 10) / 10;
export const round2 = (value: number): number => Math.round(value * 100) / 100;
export const clamp = (value: number, min: number, max: number): number => Math.min(max, Math.max(min, value));

/** Rounds to `places` decimals, as the database columns keep them. */
export function round(value: number, places: number) {
  const f = 10 ** places;
  return Math.round(value * f) / f;
}
