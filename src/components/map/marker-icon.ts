import L from "leaflet";

export type MarkerTone = "ok" | "warning" | "resting" | "offline" | "household";

const symbols: Record<MarkerTone, string> = {
  ok: "●",
  warning: "!",
  resting: "‖",
  offline: "×",
  household: "⌂",
};

function escapeHtml(text: string) {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/**
 * A text marker (symbol and words, never colour alone). Built as a divIcon so no image
 * files are needed (Leaflet's default PNG icon breaks under Vite).
 */
export function textMarker(tone: MarkerTone, label: string) {
  return L.divIcon({
    className: `hl-marker hl-marker--${tone}`,
    html: `<span class="hl-marker__symbol" aria-hidden="true">${symbols[tone]}</span><span class="hl-marker__label">${escapeHtml(label)}</span>`,
    iconSize: undefined,
    iconAnchor: [14, 14],
  });
}
