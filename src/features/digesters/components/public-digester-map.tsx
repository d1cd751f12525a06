import { Marker, Popup } from "react-leaflet";
import type { LatLngBoundsExpression } from "leaflet";
import { BaseMap } from "@/components/map/base-map";
import { textMarker } from "@/components/map/marker-icon";
import { Badge } from "@/components/ui";
import type { PublicDigester } from "@shared/schemas/digester";
import { statusTone, statusWords } from "./digester-status-text";

function boundsOf(digesters: PublicDigester[]): LatLngBoundsExpression | undefined {
  if (digesters.length === 0) return undefined;
  const lats = digesters.map((d) => d.location.lat);
  const lngs = digesters.map((d) => d.location.lng);
  const pad = 0.002;
  return [
    [Math.min(...lats) - pad, Math.min(...lngs) - pad],
    [Math.max(...lats) + pad, Math.max(...lngs) + pad],
  ];
}

/** The map and, beside it, a list with the same digesters for keyboard and screen-reader users. */
export function PublicDigesterMap({ digesters }: { digesters: PublicDigester[] }) {
  const first = digesters[0]?.location ?? { lat: 53.274, lng: -1.612 };
  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <BaseMap
        label="Map of the neighbourhood's digesters"
        center={[first.lat, first.lng]}
        bounds={boundsOf(digesters)}
        className="h-[28rem] min-h-80 w-full"
      >
        {digesters.map((d) => (
          <Marker
            key={d.id}
            position={[d.location.lat, d.location.lng]}
            icon={textMarker(statusTone[d.status], d.name)}
            title={`${d.name}: ${statusWords[d.status]}`}
            alt={d.name}
          >
            <Popup>
              <strong>{d.name}</strong>
              <br />
              {statusWords[d.status]} · {d.workingVolumeM3} m³
            </Popup>
          </Marker>
        ))}
      </BaseMap>
      <section aria-labelledby="digester-list-heading">
        <h2 id="digester-list-heading" className="mb-3 text-2xl font-bold">
          Digesters in the list
        </h2>
        <ul className="flex flex-col gap-3">
          {digesters.map((d) => (
            <li key={d.id} className="rounded-md border border-border bg-surface p-3">
              <p className="font-bold">{d.name}</p>
              <p className="text-muted">{d.siteDescription}</p>
              <p className="mt-1 flex flex-wrap items-center gap-2">
                <Badge tone={d.status === "active" ? "success" : d.status === "resting" ? "warning" : "danger"}>
                  {statusWords[d.status]}
                </Badge>
                <span>{d.workingVolumeM3} m³ working volume</span>
              </p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
