import { DEFAULT_BUCKET_KG_PER_LITRE, DEFAULT_BUCKET_LITRES } from "@shared/domain";
import type { DigesterSummary } from "@shared/schemas/digester";
import type { MarkerTone } from "@/components/map/marker-icon";
import type { BadgeTone } from "@/components/ui";

export type DigesterState = {
  tone: MarkerTone;
  badge: BadgeTone;
  /** A few words for the marker label, e.g. "room for 3 buckets". */
  short: string;
  /** The state in a sentence, for the list and the popup. */
  words: string;
  /** Room left today, kg of scraps (0 when closed). */
  roomKg: number;
  takesScraps: boolean;
};

const format1 = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 1 });

/**
 * A digester's state today in words and symbol: closed (resting/offline), a stop warning, no
 * room, or room left (today's budget minus the drop-offs already waiting).
 */
export function digesterState(d: DigesterSummary): DigesterState {
  if (d.status === "offline")
    return {
      tone: "offline",
      badge: "danger",
      short: "offline",
      words: `Offline${d.statusReason ? `: ${d.statusReason}` : ""}. Takes no scraps.`,
      roomKg: 0,
      takesScraps: false,
    };
  if (d.status === "resting")
    return {
      tone: "resting",
      badge: "warning",
      short: "resting",
      words: `Resting${d.statusReason ? `: ${d.statusReason}` : ""}. Takes no scraps.`,
      roomKg: 0,
      takesScraps: false,
    };
  const roomKg = Math.max(0, d.today.budgetKgScraps - d.today.pendingKgScraps);
  const stop = d.today.warnings.find((w) => w.severity === "stop");
  if (roomKg < 0.05) {
    return {
      tone: stop ? "warning" : "full",
      badge: stop ? "danger" : "neutral",
      short: stop ? "no scraps today" : "full today",
      words: `No room left today. ${stop ? stop.message : d.today.explanation}`,
      roomKg: 0,
      takesScraps: true,
    };
  }
  const buckets = Math.floor(roomKg / (DEFAULT_BUCKET_LITRES * DEFAULT_BUCKET_KG_PER_LITRE));
  const caution = d.today.warnings.find((w) => w.severity === "caution");
  const room = `Room for about ${format1.format(roomKg)} kg today${buckets >= 1 ? ` (${buckets} ${buckets === 1 ? "bucket" : "buckets"} of ${DEFAULT_BUCKET_LITRES} L)` : ""}.`;
  return {
    tone: caution ? "warning" : "ok",
    badge: caution ? "warning" : "success",
    short: buckets >= 1 ? `room for ${buckets}` : `room for ${format1.format(roomKg)} kg`,
    words: caution ? `${room} ${caution.message}` : room,
    roomKg,
    takesScraps: true,
  };
}
