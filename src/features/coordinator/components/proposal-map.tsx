import { Fragment } from "react";
import { Marker, Polyline, Tooltip } from "react-leaflet";
import type { LatLngBoundsExpression } from "leaflet";
import type { Proposal } from "@shared/schemas/assignments";
import { BaseMap } from "@/components/map/base-map";
import { textMarker } from "@/components/map/marker-icon";

// Lines take the theme's role colours (never raw hex): moved households stand out as solid lines.
const css = (name: string) =>
  typeof document === "undefined" ? "" : getComputedStyle(document.documentElement).getPropertyValue(name).trim();

function boundsOf(p: Proposal): LatLngBoundsExpression | undefined {
  const points = [
    ...p.digesters.map((d) => [d.lat, d.lng] as const),
    ...p.assignments.map((a) => [a.lat, a.lng] as const),
  ];
  if (points.length === 0) return undefined;
  const lats = points.map((x) => x[0]);
  const lngs = points.map((x) => x[1]);
  const pad = 0.001;
  return [
    [Math.min(...lats) - pad, Math.min(...lngs) - pad],
    [Math.max(...lats) + pad, Math.max(...lngs) + pad],
  ];
}

/**
 * Household → digester lines of a proposal: solid for households that move, dashed for those
 * that stay. The table beside it lists the same (the map's text alternative).
 */
export function ProposalMap({ proposal }: { proposal: Proposal }) {
  const byId = new Map(proposal.digesters.map((d) => [d.id, d]));
  const first = proposal.digesters[0] ?? { lat: 53.274, lng: -1.612 };
  return (
    <BaseMap
      label="Map of the proposal: a line from each household to its proposed digester. The table below lists the same."
      center={[first.lat, first.lng]}
      bounds={boundsOf(proposal)}
      className="h-[26rem] min-h-72 w-full"
    >
      {proposal.assignments.map((a) => {
        const d = byId.get(a.toDigesterId);
        if (!d) return null;
        return (
          <Fragment key={a.householdId}>
            <Polyline
              positions={[
                [a.lat, a.lng],
                [d.lat, d.lng],
              ]}
              pathOptions={
                a.changed
                  ? { color: css("--hl-primary"), weight: 3, opacity: 0.9 }
                  : { color: css("--hl-muted"), weight: 1.5, opacity: 0.7, dashArray: "4 4" }
              }
            >
              <Tooltip>
                {a.householdName} → {d.name}: {Math.round(a.distanceM)} m{a.changed ? " (moves)" : ""}
              </Tooltip>
            </Polyline>
          </Fragment>
        );
      })}
      {proposal.digesters
        .filter((d) => d.available || d.householdCount > 0)
        .map((d) => (
          <Marker
            key={d.id}
            position={[d.lat, d.lng]}
            icon={textMarker(
              d.available ? (d.roomKg > 0 ? "ok" : "full") : d.status === "active" ? "resting" : d.status,
              d.name,
            )}
            title={`${d.name}: ${d.utilisation === null ? "no room" : `${Math.round(d.utilisation * 100)} % of its weekly room`}`}
            alt={d.name}
          />
        ))}
    </BaseMap>
  );
}
