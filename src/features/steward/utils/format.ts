import { SCRAP_CATEGORY_PROFILES, type DropOffMix } from "@shared/domain";
import type { StewardDropOff } from "@shared/schemas/steward";

/** A number for reading: `decimals` places at most, no trailing zeros, grouped thousands. */
export function formatNumber(value: number, decimals = 1): string {
  return new Intl.NumberFormat("en-GB", { maximumFractionDigits: decimals }).format(value);
}

const relative = new Intl.RelativeTimeFormat("en-GB", { numeric: "auto" });

/** "12 minutes ago", "5 hours ago", "3 days ago" from an age in hours. */
export function formatAge(ageHours: number): string {
  if (ageHours < 1) return relative.format(-Math.max(1, Math.round(ageHours * 60)), "minute");
  if (ageHours < 48) return relative.format(-Math.round(ageHours), "hour");
  return relative.format(-Math.round(ageHours / 24), "day");
}

/** A date-time in the reader's words, e.g. "3 May, 08:30". */
export function formatDateTime(iso: string): string {
  return new Intl.DateTimeFormat("en-GB", {
    day: "numeric",
    month: "short",
    hour: "2-digit",
    minute: "2-digit",
  }).format(new Date(iso));
}

/** A calendar day (YYYY-MM-DD) in words, e.g. "Tuesday 3 May". */
export function formatDay(isoDate: string): string {
  return new Intl.DateTimeFormat("en-GB", { weekday: "long", day: "numeric", month: "long", timeZone: "UTC" }).format(
    new Date(`${isoDate}T00:00:00Z`),
  );
}

export function mixLabel(mix: DropOffMix | null): string {
  return mix ? SCRAP_CATEGORY_PROFILES[mix].label : "Not recorded";
}

/** "2 buckets of 10 L, about 10 kg (estimated)" or "6.5 kg (weighed)". */
export function amountText(
  d: Pick<StewardDropOff, "bucketCount" | "bucketLitres" | "weightKg" | "freshKg" | "massSource">,
): string {
  if (d.massSource === "weighed") return `${formatNumber(d.freshKg)} kg (weighed)`;
  const count = d.bucketCount ?? 0;
  return `${count} bucket${count === 1 ? "" : "s"} of ${formatNumber(d.bucketLitres ?? 0)} L, about ${formatNumber(d.freshKg)} kg (estimated)`;
}
