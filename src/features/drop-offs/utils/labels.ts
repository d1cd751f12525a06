import { SCRAP_CATEGORY_PROFILES, type DropOffMix } from "@shared/domain";
import type { DropOff, DropOffStatus } from "@shared/schemas/drop-offs";
import type { BadgeTone } from "@/components/ui";

export const mixLabels: Record<DropOffMix, string> = {
  mixed: SCRAP_CATEGORY_PROFILES.mixed.label,
  fruitVeg: SCRAP_CATEGORY_PROFILES.fruitVeg.label,
  cooked: SCRAP_CATEGORY_PROFILES.cooked.label,
  breadGrains: SCRAP_CATEGORY_PROFILES.breadGrains.label,
  coffee: SCRAP_CATEGORY_PROFILES.coffee.label,
};

export const statusTones: Record<DropOffStatus, BadgeTone> = {
  pending: "info",
  accepted: "primary",
  fed: "success",
  turned_away: "danger",
  cancelled: "neutral",
};

const format1 = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 1 });
export const kg = (v: number) => `${format1.format(v)} kg`;

/** "2 × 10 L, about 10 kg" or "3.4 kg, weighed". */
export function amountText(
  d: Pick<DropOff, "bucketCount" | "bucketLitres" | "weightKg" | "freshKg" | "massSource">,
): string {
  const buckets =
    d.bucketCount !== null && d.bucketLitres !== null ? `${d.bucketCount} × ${format1.format(d.bucketLitres)} L` : null;
  if (d.massSource === "weighed") return buckets ? `${buckets}, ${kg(d.freshKg)} weighed` : `${kg(d.freshKg)} weighed`;
  return `${buckets ?? "Buckets"}, about ${kg(d.freshKg)}`;
}

/** A day as "Tue 3 Mar" (ISO date in, no time-zone shift). */
export function dayText(isoDate: string): string {
  return new Date(`${isoDate}T12:00:00Z`).toLocaleDateString("en-GB", {
    weekday: "short",
    day: "numeric",
    month: "short",
    timeZone: "UTC",
  });
}
