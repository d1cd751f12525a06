import "leaflet/dist/leaflet.css";
import "./map.css";
import { GeoJSON, MapContainer, TileLayer } from "react-leaflet";
import type { LatLngBoundsExpression, LatLngExpression, PathOptions } from "leaflet";
import type { Feature } from "geojson";
import type { ReactNode } from "react";
import { clientEnv } from "@/config/env";
import { useOfflineBasemap } from "./basemap";

// Basemap styling reads the theme's CSS variables so colours stay role tokens.
const css = (name: string) =>
  typeof document === "undefined" ? "" : getComputedStyle(document.documentElement).getPropertyValue(name).trim();

function featureStyle(feature?: Feature): PathOptions {
  const kind = feature?.properties?.kind as string | undefined;
  if (kind === "park")
    return { color: css("--hl-success"), weight: 1, fillColor: css("--hl-success-subtle"), fillOpacity: 0.9 };
  if (kind === "water") return { color: css("--hl-info"), weight: 4, opacity: 0.6 };
  if (kind === "block")
    return { color: css("--hl-border"), weight: 0.5, fillColor: css("--hl-surface-muted"), fillOpacity: 0.8 };
  return { color: css("--hl-border"), weight: kind === "main-street" ? 7 : 4, opacity: 0.55 };
}

export interface BaseMapProps {
  center: LatLngExpression;
  zoom?: number;
  bounds?: LatLngBoundsExpression;
  /** Accessible name of the map region. */
  label: string;
  className?: string;
  children?: ReactNode;
}

/** A Leaflet map over the configured tiles, or the offline basemap when no tile URL is set. */
export function BaseMap({ center, zoom = 16, bounds, label, className, children }: BaseMapProps) {
  const offline = !clientEnv.tileUrl;
  const basemap = useOfflineBasemap(offline);
  return (
    <div role="region" aria-label={label} className={className}>
      {/* react-leaflet uses center+zoom when both are given, so bounds (when known) go alone. */}
      <MapContainer
        {...(bounds ? { bounds } : { center, zoom })}
        scrollWheelZoom={false}
        className="h-full w-full rounded-md bg-surface-muted"
      >
        {offline ? (
          basemap && <GeoJSON data={basemap} style={featureStyle} interactive={false} />
        ) : (
          <TileLayer url={clientEnv.tileUrl} attribution={clientEnv.tileAttribution} />
        )}
        {children}
      </MapContainer>
    </div>
  );
}
