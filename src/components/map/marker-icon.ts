import L from "leaflet";

/**
 * ok: taking scraps with room today; full: taking scraps but no room left today; warning: a
 * stop or caution warning (acid risk, cold, no reading); resting, offline: takes no scraps;
 * home: the viewer's own household (label shown); household: someone else's (symbol only).
 */
export type MarkerTone = "ok" | "full" | "warning" | "resting" | "offline" | "household" | "home";

const symbols: Record<MarkerTone, string> = {
  ok: "●",
  full: "○",
  warning: "!",
  resting: "‖",
  offline: "×",
  household: "⌂",
  home: "⌂",
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
