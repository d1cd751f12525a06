/**
 * The welcome shown while the form is filled in, from GET /api/digesters: room = today's
 * budget minus what neighbours have already logged, in kg of the default mix, against this
 * drop-off's kg VS expressed the same way. The server decides again on submit in exact kg VS
 * (it knows the mix of what is waiting), so the two can differ by a few hundred grams.
 */
import { DEFAULT_KG_VS_PER_FRESH_KG } from "@shared/domain";
import { haversineM } from "@shared/domain/geo";
import type { DigesterSummary } from "@shared/schemas/digester";

export type LatLng = { lat: number; lng: number };

/** Room left today, kg of scraps of the default mix; 0 for a digester that takes nothing. */
export function roomKgScraps(d: DigesterSummary): number {
  if (d.status !== "active") return 0;
  return Math.max(0, d.today.budgetKgScraps - d.today.pendingKgScraps);
}

export type Preview =
  | { kind: "welcome"; roomKg: number }
  | { kind: "closed" }
  | { kind: "full"; roomKg: number; alternative: { digester: DigesterSummary; distanceM: number | null } | null };

/** A little slack so rounding in the list (0.1 kg) never flips a bucket that just fits. */
const SLACK_KG = 0.05;

export function previewWelcome(
  chosen: DigesterSummary,
  all: readonly DigesterSummary[],
  dropOffKgVs: number,
  home: LatLng | null,
): Preview {
  if (chosen.status !== "active") return { kind: "closed" };
  const needKg = dropOffKgVs / DEFAULT_KG_VS_PER_FRESH_KG;
  const roomKg = roomKgScraps(chosen);
  if (needKg <= roomKg + SLACK_KG) return { kind: "welcome", roomKg };
  const origin = home ?? chosen.location;
  const alternatives = all
    .filter((d) => d.id !== chosen.id && needKg <= roomKgScraps(d) + SLACK_KG)
    .map((d) => ({ digester: d, distanceM: haversineM(origin, d.location) as number }))
    .sort((a, b) => a.distanceM - b.distanceM);
  const best = alternatives[0];
  return {
    kind: "full",
    roomKg,
    alternative: best ? { digester: best.digester, distanceM: home ? best.distanceM : null } : null,
  };
}

/** The day after an ISO date. */
export function nextDay(isoDate: string): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}
