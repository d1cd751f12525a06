import { Marker, Polyline } from "react-leaflet";
import type { RoundSheet } from "@shared/schemas/collections";
import { BaseMap } from "@/components/map/base-map";
import { textMarker } from "@/components/map/marker-icon";

const css = (name: string) =>
  typeof document === "undefined" ? "" : getComputedStyle(document.documentElement).getPropertyValue(name).trim();

/** A small map of the round: start, numbered stops, the end digester. The stop list is its text alternative. */
export function RoundMap({ sheet }: { sheet: RoundSheet }) {
  const line: [number, number][] = [
    ...(sheet.start ? [[sheet.start.lat, sheet.start.lng] as [number, number]] : []),
    ...sheet.stops.map((s) => [s.lat, s.lng] as [number, number]),
    [sheet.endDigester.lat, sheet.endDigester.lng],
  ];
  const lats = line.map((p) => p[0]);
  const lngs = line.map((p) => p[1]);
  const pad = 0.0008;
  return (
    <BaseMap
      label="Map of the round; the list of stops gives the same in order"
      center={line[0]!}
      bounds={[
        [Math.min(...lats) - pad, Math.min(...lngs) - pad],
        [Math.max(...lats) + pad, Math.max(...lngs) + pad],
      ]}
      className="h-72 w-full"
    >
      <Polyline positions={line} pathOptions={{ color: css("--hl-primary"), weight: 3 }} />
      {sheet.start ? (
        <Marker position={[sheet.start.lat, sheet.start.lng]} icon={textMarker("home", "Start")} alt="Start" />
      ) : null}
      {sheet.stops.map((s) => (
        <Marker
          key={s.requestId}
          position={[s.lat, s.lng]}
          icon={textMarker("household", `${s.seq}`)}
          alt={`Stop ${s.seq}`}
          title={`Stop ${s.seq}: ${s.addressText || s.householdName}`}
        />
      ))}
      <Marker
        position={[sheet.endDigester.lat, sheet.endDigester.lng]}
        icon={textMarker("ok", sheet.endDigester.name)}
        alt={sheet.endDigester.name}
      />
    </BaseMap>
  );
}
