/**
 * The place: Larkmoor's centre and bounds, its streets, parks, stream and street blocks,
 * drawn by hand in metres, and the offline basemap written from them.
 *
 * Everything here is made up and drawn only on our own basemap
 * (`public/basemap/larkmoor.geojson`, written from {@link buildLarkmoorBasemap}).
 */
import { at } from "./numbers";
import { junction, type Xy } from "./geometry";

/** A GeoJSON position: [longitude, latitude] in degrees (RFC 7946 §3.1.1). */
export type LngLat = [lng: number, lat: number];

export type BasemapProperties =
  | { kind: "street"; name: string; main: boolean }
  | { kind: "park"; name: string }
  | { kind: "water"; name: string }
  | { kind: "block" };

export type BasemapGeometry =
  { type: "LineString"; coordinates: LngLat[] } | { type: "Polygon"; coordinates: LngLat[][] };

export interface BasemapFeature {
  type: "Feature";
  properties: BasemapProperties;
  geometry: BasemapGeometry;
}

export interface BasemapFeatureCollection {
  type: "FeatureCollection";
  /** [west, south, east, north] (RFC 7946 §5). */
  bbox: [number, number, number, number];
  features: BasemapFeature[];
}

export interface LarkmoorStreet {
  name: string;
  main: boolean;
  coordinates: LngLat[];
}

export interface LarkmoorArea {
  name: string;
  /** Closed ring, first position repeated last. */
  ring: LngLat[];
}

/** Centre of the invented neighbourhood (an arbitrary spot: it is drawn only on our own basemap). */
export const LARKMOOR_CENTRE = { lat: 53.274, lng: -1.612 } as const;

/*
 * Metres per degree at the centre's latitude (WGS84 series expansion, good to
 * well under a metre over 1 km). Only used to draw the invented map.
 */
const M_PER_DEG_LAT = 111_292;
const M_PER_DEG_LNG = 66_712;

/** Half-extent of the drawn area: 1.2 km east–west by 0.9 km north–south. */
export const HALF_WIDTH_M = 600;
export const HALF_HEIGHT_M = 450;

const round6 = (value: number): number => Math.round(value * 1e6) / 1e6;
export const toLngLat = ([x, y]: Xy): LngLat => [
  round6(LARKMOOR_CENTRE.lng + x / M_PER_DEG_LNG),
  round6(LARKMOOR_CENTRE.lat + y / M_PER_DEG_LAT),
];

/** [west, south, east, north] of the drawn area in degrees. */
export const LARKMOOR_BOUNDS: [number, number, number, number] = [
  ...toLngLat([-HALF_WIDTH_M, -HALF_HEIGHT_M]),
  ...toLngLat([HALF_WIDTH_M, HALF_HEIGHT_M]),
] as [number, number, number, number];

export interface StreetSpec {
  name: string;
  main?: boolean;
  /** Footpaths and the bridge lane carry no house numbers. */
  noHomes?: boolean;
  points: readonly Xy[];
}

// x east, y north, metres from the centre. Side streets start and end on the vertices of the
// streets they meet, so junctions are exact and the block outlines below can find them.
// prettier-ignore
export const STREETS_M: readonly StreetSpec[] = [
  {
    name: "Larkmoor Road",
    main: true,
    points: [[-600, -60], [-530, -53], [-450, -45], [-380, -37.1], [-300, -28], [-280, -25.6], [-180, -13.6], [-150, -10], [-100, -6.7], [0, 0], [20, 2], [80, 8], [150, 15], [220, 17.3], [260, 18.7], [300, 20], [430, 9.6], [450, 8], [600, -20]],
  },
  { name: "Quillfeather Street", points: [[-450, -45], [-448, 150], [-445, 300], [-440, 420]] },
  { name: "Cobnut Lane", points: [[-280, -25.6], [-280, 160], [-275, 300]] },
  { name: "Bellmoss Avenue", points: [[-100, -6.7], [-98, 150], [-95, 305], [-90, 440]] },
  { name: "Thistledown Street", points: [[80, 8], [82, 140], [88, 300]] },
  { name: "Lanternfield Row", points: [[260, 18.7], [262, 150], [255, 300], [250, 420]] },
  { name: "Chimneypot Terrace", points: [[430, 9.6], [432, 160], [445, 300]] },
  { name: "Wrenfold Close", points: [[445, 300], [510, 335], [565, 310], [570, 250]] },
  { name: "Fernwhistle Way", points: [[-595, 135], [-448, 150], [-280, 160], [-98, 150], [82, 140], [262, 150], [432, 160], [595, 175]] },
  { name: "Sorrel Row", points: [[-445, 300], [-275, 300], [-95, 305], [88, 300], [255, 300], [445, 300]] },
  { name: "Goosequill Lane", points: [[-440, 420], [-260, 432], [-90, 440], [80, 428], [250, 420]] },
  { name: "Hollyhock Way", points: [[-530, -53], [-534, -150], [-530, -245]] },
  { name: "Copperkettle Lane", points: [[-380, -37.1], [-382, -150], [-375, -262]] },
  { name: "Kindling Street", points: [[-180, -13.6], [-182, -150], [-185, -270]] },
  { name: "Slatehollow Street", points: [[20, 2], [18, -150], [12, -290]] },
  { name: "Oatstack Row", points: [[220, 17.3], [222, -140], [230, -295]] },
  { name: "Pennyroyal Walk", noHomes: true, points: [[450, 8], [455, -60], [470, -130], [500, -200], [520, -270], [530, -330]] },
  { name: "Brindlecroft", points: [[-595, -158], [-534, -150], [-382, -150], [-182, -150], [18, -150], [222, -140], [380, -128], [470, -130]] },
  { name: "Mill Leat Lane", points: [[-595, -240], [-530, -245], [-375, -262], [-185, -270], [12, -290], [130, -285], [230, -295]] },
  { name: "Plank Bridge Lane", noHomes: true, points: [[12, -290], [8, -350], [0, -410]] },
  { name: "Ropewalk", points: [[-320, -405], [-150, -410], [0, -410], [160, -425], [225, -432]] },
];

export interface AreaSpec {
  name: string;
  points: readonly Xy[];
}

// prettier-ignore
export const PARKS_M: readonly AreaSpec[] = [
  { name: "Larkmoor Green", points: [[-80, 172], [65, 160], [70, 282], [-76, 288]] },
  { name: "Cobnut Orchard", points: [[-430, 312], [-292, 314], [-288, 405], [-428, 408]] },
  { name: "Beckside Meadow", points: [[250, -318], [420, -312], [505, -300], [560, -330], [598, -370], [598, -440], [250, -440]] },
  { name: "Lanternfield School garden", points: [[275, 318], [345, 318], [345, 392], [275, 392]] },
];

// prettier-ignore
export const BECK_M: { name: string; points: readonly Xy[] } = {
  name: "Larkmoor Beck",
  points: [[-600, -300], [-480, -290], [-380, -315], [-250, -305], [-120, -330], [0, -340], [120, -330], [260, -350], [380, -365], [480, -350], [600, -395]],
};

/** Street blocks as [west street, east street, south street, north street]. */
// prettier-ignore
const BLOCK_CELLS: readonly (readonly [string, string, string, string])[] = [
  ["Quillfeather Street", "Cobnut Lane", "Larkmoor Road", "Fernwhistle Way"],
  ["Cobnut Lane", "Bellmoss Avenue", "Larkmoor Road", "Fernwhistle Way"],
  ["Bellmoss Avenue", "Thistledown Street", "Larkmoor Road", "Fernwhistle Way"],
  ["Thistledown Street", "Lanternfield Row", "Larkmoor Road", "Fernwhistle Way"],
  ["Lanternfield Row", "Chimneypot Terrace", "Larkmoor Road", "Fernwhistle Way"],
  ["Quillfeather Street", "Cobnut Lane", "Fernwhistle Way", "Sorrel Row"],
  ["Cobnut Lane", "Bellmoss Avenue", "Fernwhistle Way", "Sorrel Row"],
  ["Thistledown Street", "Lanternfield Row", "Fernwhistle Way", "Sorrel Row"],
  ["Lanternfield Row", "Chimneypot Terrace", "Fernwhistle Way", "Sorrel Row"],
  ["Bellmoss Avenue", "Lanternfield Row", "Sorrel Row", "Goosequill Lane"],
  ["Hollyhock Way", "Copperkettle Lane", "Larkmoor Road", "Brindlecroft"],
  ["Copperkettle Lane", "Kindling Street", "Larkmoor Road", "Brindlecroft"],
  ["Kindling Street", "Slatehollow Street", "Larkmoor Road", "Brindlecroft"],
  ["Slatehollow Street", "Oatstack Row", "Larkmoor Road", "Brindlecroft"],
  ["Oatstack Row", "Pennyroyal Walk", "Larkmoor Road", "Brindlecroft"],
  ["Hollyhock Way", "Copperkettle Lane", "Brindlecroft", "Mill Leat Lane"],
  ["Copperkettle Lane", "Kindling Street", "Brindlecroft", "Mill Leat Lane"],
  ["Kindling Street", "Slatehollow Street", "Brindlecroft", "Mill Leat Lane"],
  ["Slatehollow Street", "Oatstack Row", "Brindlecroft", "Mill Leat Lane"],
];

/** Pavement and front gardens between a street's centre line and its block outline. */
const BLOCK_INSET_M = 10;

function streetPoints(name: string): readonly Xy[] {
  const street = STREETS_M.find((candidate) => candidate.name === name);
  if (!street) throw new Error(`demo data: no street ${name}`);
  return street.points;
}

function blockOutline([west, east, south, north]: readonly [string, string, string, string]): Xy[] {
  const w = streetPoints(west);
  const e = streetPoints(east);
  const corners = [
    junction(w, streetPoints(south)),
    junction(e, streetPoints(south)),
    junction(e, streetPoints(north)),
    junction(w, streetPoints(north)),
  ];
  const cx = corners.reduce((sum, c) => sum + c[0], 0) / corners.length;
  const cy = corners.reduce((sum, c) => sum + c[1], 0) / corners.length;
  // Pulling each corner towards the centre by inset × √2 keeps roughly `inset` metres from each street.
  return corners.map(([x, y]): Xy => {
    const d = Math.hypot(cx - x, cy - y);
    const move = BLOCK_INSET_M * Math.SQRT2;
    return [x + ((cx - x) / d) * move, y + ((cy - y) / d) * move];
  });
}

/** Closes a ring and orders it counter-clockwise, as RFC 7946 §3.1.6 asks of exterior rings. */
function closedCounterClockwise(points: readonly Xy[]): LngLat[] {
  const ring = points.map(toLngLat);
  let twiceArea = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = at(ring, i);
    const [x2, y2] = at(ring, (i + 1) % ring.length);
    twiceArea += x1 * y2 - x2 * y1;
  }
  if (twiceArea < 0) ring.reverse();
  ring.push([...at(ring, 0)]);
  return ring;
}

/** The street centre lines of Larkmoor, [lng, lat], as drawn on the basemap. */
export const LARKMOOR_STREETS: readonly LarkmoorStreet[] = STREETS_M.map((street) => ({
  name: street.name,
  main: street.main === true,
  coordinates: street.points.map(toLngLat),
}));

/** The parks and green spaces of Larkmoor, as drawn on the basemap. */
export const LARKMOOR_PARKS: readonly LarkmoorArea[] = PARKS_M.map((park) => ({
  name: park.name,
  ring: closedCounterClockwise(park.points),
}));

/** Larkmoor Beck, the stream along the south of the neighbourhood. */
export const LARKMOOR_WATER: LarkmoorStreet = {
  name: BECK_M.name,
  main: false,
  coordinates: BECK_M.points.map(toLngLat),
};

/**
 * The offline basemap as a GeoJSON FeatureCollection (RFC 7946, [lng, lat]).
 * `public/basemap/larkmoor.geojson` is this object written out, so the map and
 * the demo addresses cannot drift apart (a test compares the two).
 */
export function buildLarkmoorBasemap(): BasemapFeatureCollection {
  const features: BasemapFeature[] = [];
  for (const park of LARKMOOR_PARKS) {
    features.push({
      type: "Feature",
      properties: { kind: "park", name: park.name },
      geometry: { type: "Polygon", coordinates: [park.ring] },
    });
  }
  for (const cell of BLOCK_CELLS) {
    features.push({
      type: "Feature",
      properties: { kind: "block" },
      geometry: { type: "Polygon", coordinates: [closedCounterClockwise(blockOutline(cell))] },
    });
  }
  features.push({
    type: "Feature",
    properties: { kind: "water", name: LARKMOOR_WATER.name },
    geometry: { type: "LineString", coordinates: LARKMOOR_WATER.coordinates },
  });
  for (const street of LARKMOOR_STREETS) {
    features.push({
      type: "Feature",
      properties: { kind: "street", name: street.name, main: street.main },
      geometry: { type: "LineString", coordinates: street.coordinates },
    });
  }
  return { type: "FeatureCollection", bbox: [...LARKMOOR_BOUNDS], features };
}
