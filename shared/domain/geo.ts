/**
 * Distances and boxes on the Earth for the scheduler: walking distance is
 * approximated by the great-circle distance on a sphere. Over a neighbourhood
 * (a few km) the sphere differs from the ellipsoid by < 0.5 %, far below the
 * detour factor of real streets, so nothing finer is worth its cost.
 */
import { type Metres, metres } from "../units";

/**
 * Mean Earth radius R1 = (2a + b)/3 of the GRS 80 ellipsoid, metres
 * [memory: Moritz 2000, "Geodetic Reference System 1980", J. Geodesy 74:128,
 * R1 = 6 371 008.7714 m; rounded to 0.1 m].
 */
export const EARTH_MEAN_RADIUS_M = 6_371_008.8;

const RAD_PER_DEG = Math.PI / 180;

/** A point in WGS 84 degrees: latitude −90…90, longitude −180…180. */
export interface LatLng {
  readonly lat: number;
  readonly lng: number;
}

/** An axis-aligned box in degrees (does not handle boxes crossing the 180° meridian). */
export interface LatLngBox {
  readonly minLat: number;
  readonly maxLat: number;
  readonly minLng: number;
  readonly maxLng: number;
}

/**
 * True when both coordinates are finite numbers inside the WGS 84 ranges
 * (|lat| ≤ 90°, |lng| ≤ 180°). Used to tell "no location" from a location.
 */
export function isValidLatLng(lat: number | null | undefined, lng: number | null | undefined): boolean {
  return (
    typeof lat === "number" &&
    typeof lng === "number" &&
    Number.isFinite(lat) &&
    Number.isFinite(lng) &&
    Math.abs(lat) <= 90 &&
    Math.abs(lng) <= 180
  );
}

/**
 * Great-circle distance between two points by the haversine formula, metres:
 *
 *   a = sin²(Δφ/2) + cos φ1 · cos φ2 · sin²(Δλ/2)
 *   d = 2 R · asin(√a)
 *
 * with φ latitude, λ longitude in radians and R = {@link EARTH_MEAN_RADIUS_M}.
 * The haversine form stays accurate for short distances where the spherical
 * law of cosines loses digits [memory: Sinnott 1984, "Virtues of the
 * Haversine", Sky & Telescope 68(2):159]. `a` is clamped to 1 so antipodal
 * rounding never yields NaN.
 * Check: 1° of latitude = π/180 × R = 111 195.08 m [derived].
 */
export function haversineM(a: LatLng, b: LatLng): Metres {
  const phi1 = a.lat * RAD_PER_DEG;
  const phi2 = b.lat * RAD_PER_DEG;
  const sinDPhi = Math.sin((phi2 - phi1) / 2);
  const sinDLambda = Math.sin(((b.lng - a.lng) * RAD_PER_DEG) / 2);
  const h = sinDPhi * sinDPhi + Math.cos(phi1) * Math.cos(phi2) * sinDLambda * sinDLambda;
  return metres(2 * EARTH_MEAN_RADIUS_M * Math.asin(Math.sqrt(Math.min(1, h))));
}

/**
 * Metres per degree of latitude on the sphere: π R / 180 = 111 195.08 m
 * [derived from {@link EARTH_MEAN_RADIUS_M}].
 */
export const METRES_PER_DEGREE_LATITUDE = (Math.PI * EARTH_MEAN_RADIUS_M) / 180;

/**
 * Smallest box holding all points, degrees; null for an empty list. Points
 * with invalid coordinates (see {@link isValidLatLng}) are skipped.
 */
export function boundingBox(points: readonly LatLng[]): LatLngBox | null {
  let minLat = Infinity;
  let maxLat = -Infinity;
  let minLng = Infinity;
  let maxLng = -Infinity;
  for (const p of points) {
    if (!isValidLatLng(p.lat, p.lng)) continue;
    minLat = Math.min(minLat, p.lat);
    maxLat = Math.max(maxLat, p.lat);
    minLng = Math.min(minLng, p.lng);
    maxLng = Math.max(maxLng, p.lng);
  }
  return minLat === Infinity ? null : { minLat, maxLat, minLng, maxLng };
}

/**
 * A box that contains every point within `radiusM` metres of `centre`
 * (a cheap pre-filter before {@link haversineM}). Latitude half-width =
 * r / (π R / 180); longitude half-width = that / cos φ, using the
 * latitude of the box edge nearer the pole, where meridians are closest,
 * so the box never cuts a point off. Near a pole the box spans all longitudes.
 */
export function boxAroundM(centre: LatLng, radiusM: number): LatLngBox {
  const r = Math.max(0, radiusM);
  const dLat = r / METRES_PER_DEGREE_LATITUDE;
  const minLat = Math.max(-90, centre.lat - dLat);
  const maxLat = Math.min(90, centre.lat + dLat);
  const poleward = Math.max(Math.abs(minLat), Math.abs(maxLat));
  const cosPhi = Math.cos(poleward * RAD_PER_DEG);
  if (poleward >= 90 || cosPhi <= 1e-12 || dLat / cosPhi >= 180) {
    return { minLat, maxLat, minLng: -180, maxLng: 180 };
  }
  const dLng = dLat / cosPhi;
  return { minLat, maxLat, minLng: centre.lng - dLng, maxLng: centre.lng + dLng };
}

/** True when the point lies inside the box (edges included). */
export function boxContains(box: LatLngBox, p: LatLng): boolean {
  return p.lat >= box.minLat && p.lat <= box.maxLat && p.lng >= box.minLng && p.lng <= box.maxLng;
}

/**
 * The point `distanceM` metres from `start` along initial bearing
 * `bearingDeg` (clockwise from north) on the sphere:
 *   φ2 = asin(sin φ1 cos δ + cos φ1 sin δ cos θ),
 *   λ2 = λ1 + atan2(sin θ sin δ cos φ1, cos δ − sin φ1 sin φ2), δ = d/R.
 * Used to generate test and benchmark positions at known distances
 * [derived: spherical triangle through the pole, sine and cosine rules].
 */
export function destinationPoint(start: LatLng, bearingDeg: number, distanceM: number): LatLng {
  const delta = distanceM / EARTH_MEAN_RADIUS_M;
  const theta = bearingDeg * RAD_PER_DEG;
  const phi1 = start.lat * RAD_PER_DEG;
  const lambda1 = start.lng * RAD_PER_DEG;
  const phi2 = Math.asin(Math.sin(phi1) * Math.cos(delta) + Math.cos(phi1) * Math.sin(delta) * Math.cos(theta));
  const lambda2 =
    lambda1 +
    Math.atan2(Math.sin(theta) * Math.sin(delta) * Math.cos(phi1), Math.cos(delta) - Math.sin(phi1) * Math.sin(phi2));
  const lng = ((lambda2 / RAD_PER_DEG + 540) % 360) - 180;
  return { lat: phi2 / RAD_PER_DEG, lng };
}
