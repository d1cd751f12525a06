/**
 * The welcome shown while the form is filled in, from GET /api/digesters: the same room rule the
 * server applies on submit (shared/domain/room.ts: today's budget minus what neighbours have
 * already logged, kg VS, one tolerance), on the list's figures. The server decides again on
 * submit with unrounded figures, so the two can differ only when a drop-off just about fits.
 */
import { DEFAULT_KG_VS_PER_FRESH_KG, decideWelcome, roomTodayKgVs, type RoomCandidate } from "@shared/domain";
import type { DigesterSummary } from "@shared/schemas/digester";

export type LatLng = { lat: number; lng: number };

/** Room left today, kg VS (shared/domain/room.ts); 0 for a digester that takes nothing. */
function roomKgVs(d: DigesterSummary): number {
  return roomTodayKgVs({
    closed: d.status !== "active",
    budgetKgVs: d.today.budgetKgVs,
    pendingKgVs: d.today.pendingKgVs,
  });
}

/** Room left today, kg of scraps of the default mix (for display); 0 for a digester that takes nothing. */
export function roomKgScraps(d: DigesterSummary): number {
  return roomKgVs(d) / DEFAULT_KG_VS_PER_FRESH_KG;
}

export type Preview =
  | { kind: "welcome"; roomKg: number }
  | { kind: "closed" }
  | {
      kind: "full";
      roomKg: number;
      /** True when the digester has no room left at all (rather than too little for this drop-off). */
      noRoomLeft: boolean;
      alternative: { digester: DigesterSummary; distanceM: number | null } | null;
    };

interface Candidate extends RoomCandidate {
  summary: DigesterSummary;
}

const candidate = (d: DigesterSummary): Candidate => ({
  id: d.id,
  lat: d.location.lat,
  lng: d.location.lng,
  closed: d.status !== "active",
  roomKgVs: roomKgVs(d),
  summary: d,
});

export function previewWelcome(
  chosen: DigesterSummary,
  all: readonly DigesterSummary[],
  dropOffKgVs: number,
  home: LatLng | null,
): Preview {
  const decision = decideWelcome({
    chosen: candidate(chosen),
    all: all.map(candidate),
    loadKgVs: dropOffKgVs,
    from: home,
  });
  if (decision.basis === "tomorrow") return { kind: "welcome", roomKg: roomKgScraps(chosen) };
  const roomKg = decision.roomKgVs / DEFAULT_KG_VS_PER_FRESH_KG;
  if (decision.welcomed) return { kind: "welcome", roomKg };
  if (decision.reason === "closed") return { kind: "closed" };
  const best = decision.alternative;
  return {
    kind: "full",
    roomKg,
    noRoomLeft: decision.reason === "noRoomLeft",
    alternative: best ? { digester: best.digester.summary, distanceM: home ? best.distanceM : null } : null,
  };
}

/** The day after an ISO date. */
export function nextDay(isoDate: string): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString().slice(0, 10);
}
