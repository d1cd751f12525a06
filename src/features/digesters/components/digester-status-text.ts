import type { DigesterStatus } from "@shared/schemas/digester";
import type { MarkerTone } from "@/components/map/marker-icon";

export const statusWords: Record<DigesterStatus, string> = {
  active: "Taking scraps",
  resting: "Resting: no scraps",
  offline: "Offline: no scraps",
};

export const statusTone: Record<DigesterStatus, MarkerTone> = {
  active: "ok",
  resting: "resting",
  offline: "offline",
};
