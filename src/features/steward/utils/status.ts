import type { DigesterStatus } from "@shared/schemas/digester";
import type { BadgeTone } from "@/components/ui";

/** A digester's status in words with a badge tone (never colour alone). */
export const DIGESTER_STATUS_WORDS: Record<DigesterStatus, { label: string; tone: BadgeTone }> = {
  active: { label: "Active", tone: "success" },
  resting: { label: "Resting", tone: "warning" },
  offline: { label: "Offline", tone: "danger" },
};
