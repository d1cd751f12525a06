/**
 * The street list for people who place their household without the map: every named street of
 * the basemap GeoJSON (the file the offline map draws, public/basemap/larkmoor.geojson) with the
 * point halfway along it. One source for map and list, so they cannot disagree; a neighbourhood
 * with its own basemap gets its own streets by replacing that file.
 */
import { readFile } from "node:fs/promises";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { haversineM, type LatLng } from "../../../shared/domain/geo";
import type { Street } from "../../../shared/schemas/households";

const here = path.dirname(fileURLToPath(import.meta.url));
/** The basemap the client draws when no tile server is configured. */
export const DEFAULT_STREETS_GEOJSON = path.resolve(here, "../../../public/basemap/larkmoor.geojson");

interface GeoJsonFeature {
  type?: unknown;
  properties?: Record<string, unknown> | null;
  geometry?: { type?: unknown; coordinates?: unknown } | null;
}

function toLatLng(position: unknown): LatLng | null {
  if (!Array.isArray(position) || position.length < 2) return null;
  const [lng, lat] = position as unknown[];
  if (typeof lat !== "number" || typeof lng !== "number" || !Number.isFinite(lat) || !Number.isFinite(lng)) return null;
  if (Math.abs(lat) > 90 || Math.abs(lng) > 180) return null;
  return { lat, lng };
}

/** The point at half the line's length (metres along great circles, linear within a segment). */
export function halfwayAlong(points: readonly LatLng[]): LatLng | null {
  if (points.length === 0) return null;
  if (points.length === 1) return points[0]!;
  const lengths = points.slice(1).map((p, i) => haversineM(points[i]!, p) as number);
  const total = lengths.reduce((a, b) => a + b, 0);
  if (total === 0) return points[0]!;
  let remaining = total / 2;
  for (let i = 0; i < lengths.length; i++) {
    const segment = lengths[i]!;
    if (remaining <= segment) {
      const a = points[i]!;
      const b = points[i + 1]!;
      const t = segment === 0 ? 0 : remaining / segment;
      return { lat: a.lat + (b.lat - a.lat) * t, lng: a.lng + (b.lng - a.lng) * t };
    }
    remaining -= segment;
  }
  return points[points.length - 1]!;
}

const round6 = (v: number) => Math.round(v * 1e6) / 1e6;

/**
 * Named streets of a GeoJSON FeatureCollection (RFC 7946, [lng, lat]): LineString and
 * MultiLineString features with a `name`, whose `kind` is absent or contains "street".
 * A street drawn in several pieces is one entry, placed halfway along its longest piece.
 */
export function streetsFromGeoJson(collection: unknown): Street[] {
  const features = (collection as { features?: unknown } | null)?.features;
  if (!Array.isArray(features)) return [];
  const best = new Map<string, { lengthM: number; point: LatLng }>();
  for (const f of features as GeoJsonFeature[]) {
    const name = typeof f?.properties?.name === "string" ? f.properties.name.trim() : "";
    const kind = f?.properties?.kind;
    if (!name || (typeof kind === "string" && !kind.includes("street"))) continue;
    const g = f.geometry;
    const lines: unknown[] =
      g?.type === "LineString"
        ? [g.coordinates]
        : g?.type === "MultiLineString" && Array.isArray(g.coordinates)
          ? g.coordinates
          : [];
    for (const line of lines) {
      if (!Array.isArray(line)) continue;
      const points = line.map(toLatLng).filter((p): p is LatLng => p !== null);
      const point = halfwayAlong(points);
      if (!point) continue;
      const lengthM = points.slice(1).reduce((sum, p, i) => sum + (haversineM(points[i]!, p) as number), 0);
      const known = best.get(name);
      if (!known || lengthM > known.lengthM) best.set(name, { lengthM, point });
    }
  }
  return [...best.entries()]
    .map(([name, { point }]) => ({ name, location: { lat: round6(point.lat), lng: round6(point.lng) } }))
    .sort((a, b) => a.name.localeCompare(b.name, "en"));
}

const cache = new Map<string, Promise<Street[]>>();

/** The streets of the basemap file, read once per process (a failed read is retried next time). */
export function listStreets(file = DEFAULT_STREETS_GEOJSON): Promise<Street[]> {
  let streets = cache.get(file);
  if (!streets) {
    streets = readFile(file, "utf8").then((text) => streetsFromGeoJson(JSON.parse(text)));
    streets.catch(() => cache.delete(file));
    cache.set(file, streets);
  }
  return streets;
}
