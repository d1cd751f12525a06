/**
 * Larkmoor: the invented demo neighbourhood that the start command seeds.
 *
 * Everything here is made up: the place, its streets, parks and stream, the
 * people and the digesters. The map is drawn only on our own offline basemap
 * (`public/basemap/larkmoor.geojson`, written from {@link buildLarkmoorBasemap}).
 *
 * {@link buildDemoNeighbourhood} is pure and deterministic: a fixed-seed PRNG,
 * no clock (the caller passes `today`), no disk, no database. It returns plain
 * objects linked by string keys; the seeder turns keys into row ids.
 */

// ───────────────────────────── exported types ─────────────────────────────

export type DemoRole = "resident" | "steward" | "coordinator" | "gardener";
export type DemoHeating = "none" | "solar" | "electric" | "waste-heat";
export type DemoInsulation = "none" | "partial" | "full";
export type DemoDigesterStatus = "active" | "resting" | "offline";
export type DemoScrapMix = "mixed" | "fruitVeg" | "cooked" | "breadGrains" | "coffee";
export type DemoDropOffStatus = "pending" | "fed" | "turned_away";
export type DemoTurnedAwayReason = "contamination" | "too_much_citrus" | "over_budget";
export type DemoFertiliserClaimStatus = "claimed" | "collected";

/** A GeoJSON position: [longitude, latitude] in degrees (RFC 7946 §3.1.1). */
export type LngLat = [lng: number, lat: number];

export interface DemoPerson {
  key: string;
  email: string;
  name: string;
  roles: DemoRole[];
  householdKey: string | null;
  isVolunteer: boolean;
  /** Cargo-bike load a volunteer can carry, kg; null for non-volunteers. */
  bikeLoadKg: number | null;
  /** Where a volunteer's collection rounds start (their home); null for non-volunteers. */
  startLat: number | null;
  startLng: number | null;
}

export interface DemoHousehold {
  key: string;
  name: string;
  addressText: string;
  lat: number;
  lng: number;
  memberKeys: string[];
  declaredWeeklyKg: number;
  /** Nearest digester at seeding time; null for the three households that signed up this week. */
  assignedDigesterKey: string | null;
  needsCollection: boolean;
}

export interface DemoDigester {
  key: string;
  name: string;
  siteDescription: string;
  lat: number;
  lng: number;
  workingVolumeM3: number;
  drumDiameterM: number;
  drumMassKg: number;
  addedMassKg: number;
  burnerLitresPerHour: number;
  heating: DemoHeating;
  insulation: DemoInsulation;
  status: DemoDigesterStatus;
  statusReason: string | null;
  /** ISO date (YYYY-MM-DD, local). */
  startedOn: string;
  /** ISO date (YYYY-MM-DD, local); null until the gas first burned. */
  gasFirstBurnedOn: string | null;
  olrRefKgVsPerM3Day: number;
  stewardKeys: string[];
}

export interface DemoReading {
  key: string;
  digesterKey: string;
  personKey: string;
  /** ISO instant with Z. */
  takenAt: string;
  temperatureC: number | null;
  ph: number | null;
  vfaTaRatio: number | null;
  gasLevelPercent: number | null;
  gasUsedMinutes: number | null;
  note: string | null;
}

export interface DemoFeeding {
  key: string;
  digesterKey: string;
  personKey: string;
  /** ISO date (YYYY-MM-DD, local). */
  fedOn: string;
  /** Sum of the linked drop-offs' fresh mass (weighed, else bucket litres × 0.5 kg/L). */
  freshKg: number;
  /** Dilution water to about 8 % TS (DOMAIN.md §2.7), litres. */
  waterLitres: number;
  dropOffKeys: string[];
  note: string | null;
}

export interface DemoDropOff {
  key: string;
  householdKey: string;
  digesterKey: string;
  personKey: string;
  /** ISO instant with Z. */
  createdAt: string;
  /** ISO date (YYYY-MM-DD, local) of the day the drop-off is for. */
  forDate: string;
  bucketCount: number;
  bucketLitres: number;
  /** Set when the bucket was weighed; otherwise the mass is estimated from litres. */
  weightKg: number | null;
  mix: DemoScrapMix;
  citrusPercent: number;
  status: DemoDropOffStatus;
  turnedAwayReason: DemoTurnedAwayReason | null;
  note: string | null;
}

export interface DemoCollectionRequest {
  key: string;
  householdKey: string;
  personKey: string;
  /** ISO date (YYYY-MM-DD, local): tomorrow or the day after. */
  forDate: string;
  bucketCount: number;
  bucketLitres: number;
  note: string | null;
}

export interface DemoFertiliserClaim {
  key: string;
  digesterKey: string;
  personKey: string;
  litres: number;
  /** ISO instants with Z. */
  windowStart: string;
  windowEnd: string;
  bedAreaM2: number | null;
  status: DemoFertiliserClaimStatus;
}

export interface DemoNeighbourhood {
  name: string;
  centre: { lat: number; lng: number };
  people: DemoPerson[];
  households: DemoHousehold[];
  digesters: DemoDigester[];
  readings: DemoReading[];
  feedings: DemoFeeding[];
  dropOffs: DemoDropOff[];
  collectionRequests: DemoCollectionRequest[];
  fertiliserClaims: DemoFertiliserClaim[];
}

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

// ───────────────────────────── the map, in metres ─────────────────────────────

/** Centre of the invented neighbourhood (an arbitrary spot: it is drawn only on our own basemap). */
export const LARKMOOR_CENTRE = { lat: 53.274, lng: -1.612 } as const;

/*
 * Metres per degree at the centre's latitude (WGS84 series expansion, good to
 * well under a metre over 1 km). Only used to draw the invented map.
 */
const M_PER_DEG_LAT = 111_292;
const M_PER_DEG_LNG = 66_712;

/** Half-extent of the drawn area: 1.2 km east–west by 0.9 km north–south. */
const HALF_WIDTH_M = 600;
const HALF_HEIGHT_M = 450;

type Xy = readonly [x: number, y: number];

const round6 = (value: number): number => Math.round(value * 1e6) / 1e6;
const toLngLat = ([x, y]: Xy): LngLat => [
  round6(LARKMOOR_CENTRE.lng + x / M_PER_DEG_LNG),
  round6(LARKMOOR_CENTRE.lat + y / M_PER_DEG_LAT),
];

/** [west, south, east, north] of the drawn area in degrees. */
export const LARKMOOR_BOUNDS: [number, number, number, number] = [
  ...toLngLat([-HALF_WIDTH_M, -HALF_HEIGHT_M]),
  ...toLngLat([HALF_WIDTH_M, HALF_HEIGHT_M]),
] as [number, number, number, number];

interface StreetSpec {
  name: string;
  main?: boolean;
  /** Footpaths and the bridge lane carry no house numbers. */
  noHomes?: boolean;
  points: readonly Xy[];
}

// x east, y north, metres from the centre. Side streets start and end on the vertices of the
// streets they meet, so junctions are exact and the block outlines below can find them.
// prettier-ignore
const STREETS_M: readonly StreetSpec[] = [
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

interface AreaSpec {
  name: string;
  points: readonly Xy[];
}

// prettier-ignore
const PARKS_M: readonly AreaSpec[] = [
  { name: "Larkmoor Green", points: [[-80, 172], [65, 160], [70, 282], [-76, 288]] },
  { name: "Cobnut Orchard", points: [[-430, 312], [-292, 314], [-288, 405], [-428, 408]] },
  { name: "Beckside Meadow", points: [[250, -318], [420, -312], [505, -300], [560, -330], [598, -370], [598, -440], [250, -440]] },
  { name: "Lanternfield School garden", points: [[275, 318], [345, 318], [345, 392], [275, 392]] },
];

// prettier-ignore
const BECK_M: { name: string; points: readonly Xy[] } = {
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

// ───────────────────────────── plane geometry (metres) ─────────────────────────────

const dist = (a: Xy, b: Xy): number => Math.hypot(a[0] - b[0], a[1] - b[1]);

function at<T>(items: readonly T[], index: number): T {
  const item = items[index];
  if (item === undefined) throw new Error(`demo data: index ${index} out of range`);
  return item;
}

function segments(points: readonly Xy[]): [Xy, Xy][] {
  const out: [Xy, Xy][] = [];
  for (let i = 1; i < points.length; i++) out.push([at(points, i - 1), at(points, i)]);
  return out;
}

function pathLength(points: readonly Xy[]): number {
  return segments(points).reduce((sum, [a, b]) => sum + dist(a, b), 0);
}

/** Point at distance `s` along a polyline, with the unit direction of travel there. */
function pointAlong(points: readonly Xy[], s: number): { point: Xy; dir: Xy } {
  let left = s;
  const segs = segments(points);
  for (const [a, b] of segs) {
    const len = dist(a, b);
    if (left <= len) {
      const t = left / len;
      return {
        point: [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t],
        dir: [(b[0] - a[0]) / len, (b[1] - a[1]) / len],
      };
    }
    left -= len;
  }
  const [a, b] = at(segs, segs.length - 1);
  const len = dist(a, b);
  return { point: b, dir: [(b[0] - a[0]) / len, (b[1] - a[1]) / len] };
}

function distToSegment(p: Xy, a: Xy, b: Xy): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy)));
  return dist(p, [a[0] + dx * t, a[1] + dy * t]);
}

function distToPath(p: Xy, points: readonly Xy[]): number {
  return Math.min(...segments(points).map(([a, b]) => distToSegment(p, a, b)));
}

function insidePolygon(p: Xy, ring: readonly Xy[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = at(ring, i);
    const [xj, yj] = at(ring, j);
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Where two streets meet: a shared vertex or crossing; throws if they do not meet within 3 m. */
function junction(a: readonly Xy[], b: readonly Xy[]): Xy {
  for (const [p1, p2] of segments(a)) {
    for (const [q1, q2] of segments(b)) {
      const r: Xy = [p2[0] - p1[0], p2[1] - p1[1]];
      const s: Xy = [q2[0] - q1[0], q2[1] - q1[1]];
      const denom = r[0] * s[1] - r[1] * s[0];
      if (Math.abs(denom) < 1e-9) continue;
      const qp: Xy = [q1[0] - p1[0], q1[1] - p1[1]];
      const t = (qp[0] * s[1] - qp[1] * s[0]) / denom;
      const u = (qp[0] * r[1] - qp[1] * r[0]) / denom;
      const eps = 1e-6;
      if (t >= -eps && t <= 1 + eps && u >= -eps && u <= 1 + eps) return [p1[0] + r[0] * t, p1[1] + r[1] * t];
    }
  }
  let best: { gap: number; point: Xy } = { gap: Infinity, point: [0, 0] };
  for (const p of a) {
    const gap = distToPath(p, b);
    if (gap < best.gap) best = { gap, point: p };
  }
  for (const p of b) {
    const gap = distToPath(p, a);
    if (gap < best.gap) best = { gap, point: p };
  }
  if (best.gap > 3) throw new Error("demo data: block streets do not meet");
  return best.point;
}

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

// ───────────────────────────── seeded randomness ─────────────────────────────

const DEMO_SEED = 0x1a4b_3c2d;

interface Rng {
  next(): number;
  range(min: number, max: number): number;
  int(min: number, max: number): number;
  chance(probability: number): boolean;
  pick<T>(items: readonly T[]): T;
  weighted<T>(items: readonly (readonly [T, number])[]): T;
}

/** mulberry32: a tiny 32-bit PRNG, plenty for invented demo data. */
function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

function fnv1a(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return hash >>> 0;
}

// One stream per concern, so changing how one part is generated leaves the others as they were.
function makeRng(stream: string): Rng {
  const next = mulberry32(DEMO_SEED ^ fnv1a(stream));
  const rng: Rng = {
    next,
    range: (min, max) => min + (max - min) * next(),
    int: (min, max) => min + Math.floor((max - min + 1) * next()),
    chance: (probability) => next() < probability,
    pick: (items) => at(items, Math.floor(next() * items.length)),
    weighted: (items) => {
      const total = items.reduce((sum, [, weight]) => sum + weight, 0);
      let roll = next() * total;
      for (const [item, weight] of items) {
        roll -= weight;
        if (roll < 0) return item;
      }
      return at(items, items.length - 1)[0];
    },
  };
  return rng;
}

const round1 = (value: number): number => Math.round(value * 10) / 10;
const round2 = (value: number): number => Math.round(value * 100) / 100;
const clamp = (value: number, min: number, max: number): number => Math.min(max, Math.max(min, value));

// ───────────────────────────── people and places ─────────────────────────────

/** The four demo sign-ins, plus the second steward. */
export const DEMO_SIGN_IN_EMAILS = {
  resident: "resident@example.org",
  steward: "steward@example.org",
  coordinator: "coordinator@example.org",
  gardener: "gardener@example.org",
  steward2: "steward2@example.org",
} as const;

// prettier-ignore
const FIRST_NAMES = [
  "Aisha", "Bram", "Carys", "Dmitri", "Elif", "Femi", "Greta", "Hamid", "Ines", "Jonah",
  "Kezia", "Luca", "Maya", "Niall", "Oona", "Pavel", "Qamar", "Ruth", "Sami", "Tess",
  "Umar", "Vera", "Wen", "Xavier", "Yara", "Zeke", "Alma", "Ben", "Cleo", "Dev",
  "Esme", "Finn", "Gwen", "Hugo", "Isla", "Jude", "Kofi", "Lena", "Milo", "Nell",
  "Otis", "Pia", "Rafe", "Sian", "Theo", "Una", "Vikram", "Wilf", "Zofia", "Ada",
] as const;

// Household surnames; the first three belong to the demo resident, steward and second steward.
// prettier-ignore
const SURNAMES = [
  "Fennimore", "Marlowe", "Halloway", "Appleyard", "Birchall", "Coldwell", "Dimmock", "Eastoe", "Farrant", "Gilmour",
  "Hesketh", "Ibbotson", "Jessop", "Kilbride", "Lambourne", "Mossop", "Nettleship", "Okafor", "Pilling", "Quarmby",
  "Rudd", "Scarisbrick", "Thwaite", "Underhill", "Varley", "Wragg", "Nowak", "Ackroyd", "Bellamy", "Crabtree",
  "Dewhurst", "Entwistle", "Fothergill", "Haddad", "Sato", "Demir", "Lindqvist", "Moreau", "Ferreira", "Kaur",
  "Mensah", "Tattersall", "Whitworth", "Ormerod", "Lumb", "Midgley",
] as const;

const PARTNER_SURNAMES = ["Adeyemi", "Brennan", "Castillo", "Duffy", "Eriksen", "Gallo", "Hughes"] as const;

const HOUSEHOLD_COUNT = SURNAMES.length;
const TWO_MEMBER_HOUSEHOLDS = 7;
const UNASSIGNED_HOUSEHOLDS = 3;

interface DigesterSpec extends Omit<DemoDigester, "lat" | "lng" | "startedOn" | "gasFirstBurnedOn" | "stewardKeys"> {
  at: Xy;
  startedDay: number;
  gasFirstBurnedDay: number;
  steward: "steward" | "steward2";
}

const PERSON_KEYS = {
  resident: "person-resident",
  steward: "person-steward",
  steward2: "person-steward2",
  coordinator: "person-coordinator",
  gardener: "person-gardener",
} as const;

const DIGESTER_KEYS = {
  school: "digester-school",
  orchard: "digester-orchard",
  meadow: "digester-meadow",
  green: "digester-green",
} as const;

// Day numbers are relative to `today` (0); negative is the past.
const DIGESTER_SPECS: readonly DigesterSpec[] = [
  {
    key: DIGESTER_KEYS.school,
    name: "Lanternfield School digester",
    siteDescription: "Lanternfield School garden, behind the greenhouse. Gate open 7:30–17:30.",
    at: [310, 355],
    workingVolumeM3: 0.5,
    drumDiameterM: 0.6,
    drumMassKg: 12,
    addedMassKg: 6,
    burnerLitresPerHour: 200,
    heating: "none",
    insulation: "none",
    status: "active",
    statusReason: null,
    startedDay: -410,
    gasFirstBurnedDay: -384,
    olrRefKgVsPerM3Day: 1.5,
    steward: "steward",
  },
  {
    key: DIGESTER_KEYS.orchard,
    name: "Cobnut Orchard digester",
    siteDescription: "Cobnut Orchard, next to the tool shed. Enter from Quillfeather Street.",
    at: [-360, 360],
    workingVolumeM3: 1.2,
    drumDiameterM: 0.8,
    drumMassKg: 20,
    addedMassKg: 10,
    burnerLitresPerHour: 350,
    heating: "none",
    insulation: "full",
    status: "active",
    statusReason: null,
    startedDay: -300,
    gasFirstBurnedDay: -271,
    olrRefKgVsPerM3Day: 1.5,
    steward: "steward",
  },
  {
    key: DIGESTER_KEYS.meadow,
    name: "Beckside Meadow digester",
    siteDescription: "Beckside Meadow, on the north bank of Larkmoor Beck, at the end of Pennyroyal Walk.",
    at: [460, -322],
    workingVolumeM3: 2.5,
    drumDiameterM: 1,
    drumMassKg: 35,
    addedMassKg: 25,
    burnerLitresPerHour: 350,
    heating: "solar",
    insulation: "partial",
    status: "active",
    statusReason: null,
    startedDay: -20,
    gasFirstBurnedDay: -11,
    olrRefKgVsPerM3Day: 1.5,
    steward: "steward2",
  },
  {
    key: DIGESTER_KEYS.green,
    name: "Larkmoor Green digester",
    siteDescription: "Larkmoor Green, beside the community hall; warmed by the hall boiler's spare heat.",
    at: [-10, 200],
    workingVolumeM3: 6,
    drumDiameterM: 1.6,
    drumMassKg: 80,
    addedMassKg: 60,
    burnerLitresPerHour: 400,
    heating: "waste-heat",
    insulation: "full",
    status: "active",
    statusReason: null,
    startedDay: -720,
    gasFirstBurnedDay: -694,
    olrRefKgVsPerM3Day: 2,
    steward: "steward2",
  },
];

interface Site {
  at: Xy;
  street: string;
  addressText: string;
  nearestDigesterKey: string;
}

function placeHouseholdSites(): Site[] {
  const rng = makeRng("household-sites");
  const homeStreets = STREETS_M.filter((street) => !street.noHomes);
  const weightedStreets = homeStreets.map((street) => [street, pathLength(street.points)] as const);
  const usedAddresses = new Set<string>();
  const sites: Site[] = [];
  for (let attempt = 0; sites.length < HOUSEHOLD_COUNT; attempt++) {
    if (attempt > 20_000) throw new Error("demo data: could not place the households");
    const street = rng.weighted(weightedStreets);
    const length = pathLength(street.points);
    const s = rng.range(18, length - 18);
    const side = rng.chance(0.5) ? 1 : -1;
    const { point, dir } = pointAlong(street.points, s);
    // Left of the direction of travel is (−dy, dx).
    const offset = rng.range(14, 18) * side;
    const at: Xy = [point[0] - dir[1] * offset, point[1] + dir[0] * offset];
    const inside = Math.abs(at[0]) <= HALF_WIDTH_M - 12 && Math.abs(at[1]) <= HALF_HEIGHT_M - 12;
    if (!inside) continue;
    if (PARKS_M.some((park) => insidePolygon(at, park.points))) continue;
    if (STREETS_M.some((other) => distToPath(at, other.points) < 11)) continue;
    if (distToPath(at, BECK_M.points) < 25) continue;
    if (sites.some((site) => dist(site.at, at) < 18)) continue;
    let houseNumber = 2 * Math.max(1, Math.round(s / 12)) - (side > 0 ? 1 : 0);
    while (usedAddresses.has(`${houseNumber} ${street.name}`)) houseNumber += 2;
    const addressText = `${houseNumber} ${street.name}`;
    usedAddresses.add(addressText);
    const nearest = [...DIGESTER_SPECS].sort((a, b) => dist(a.at, at) - dist(b.at, at))[0];
    if (!nearest) throw new Error("demo data: no digesters");
    sites.push({ at, street: street.name, addressText, nearestDigesterKey: nearest.key });
  }
  return sites;
}

const emailFor = (first: string, last: string): string =>
  `${first}.${last}@larkmoor.example`.toLowerCase().replace(/[^a-z.@-]/g, "");

interface Community {
  people: DemoPerson[];
  households: DemoHousehold[];
}

function buildCommunity(): Community {
  const rng = makeRng("community");
  const sites = placeHouseholdSites();

  // The demo sign-ins live next to the digesters they use, so their screens have something to show.
  const takeSite = (digesterKey: string): Site => {
    const index = sites.findIndex((site) => site.nearestDigesterKey === digesterKey);
    if (index < 0) throw new Error(`demo data: no household near ${digesterKey}`);
    return at(sites.splice(index, 1), 0);
  };
  const ordered: Site[] = [
    takeSite(DIGESTER_KEYS.green),
    takeSite(DIGESTER_KEYS.orchard),
    takeSite(DIGESTER_KEYS.meadow),
    ...sites,
  ];

  const people: DemoPerson[] = [];
  const households: DemoHousehold[] = [];
  const person = (
    key: string,
    email: string,
    name: string,
    roles: DemoRole[],
    householdKey: string | null,
  ): DemoPerson => ({
    key,
    email,
    name,
    roles,
    householdKey,
    isVolunteer: false,
    bikeLoadKg: null,
    startLat: null,
    startLng: null,
  });

  const firstNames = [...FIRST_NAMES];
  let partnerIndex = 0;
  // Households that get a second member: the demo resident's, and six others spread through the list.
  const twoMember = new Set<number>([0, 5, 11, 17, 24, 30, 38].slice(0, TWO_MEMBER_HOUSEHOLDS));
  let residentNumber = 0;
  const nextResident = (householdKey: string, surname: string): DemoPerson => {
    const first = firstNames.shift();
    if (!first) throw new Error("demo data: ran out of first names");
    residentNumber += 1;
    return person(
      `person-${String(residentNumber).padStart(2, "0")}`,
      emailFor(first, surname),
      `${first} ${surname}`,
      ["resident"],
      householdKey,
    );
  };

  ordered.forEach((site, index) => {
    const key = `household-${String(index + 1).padStart(2, "0")}`;
    const surname = at(SURNAMES, index);
    const members: DemoPerson[] = [];
    if (index === 0)
      members.push(person(PERSON_KEYS.resident, DEMO_SIGN_IN_EMAILS.resident, "Rosa Fennimore", ["resident"], key));
    else if (index === 1)
      members.push(
        person(PERSON_KEYS.steward, DEMO_SIGN_IN_EMAILS.steward, "Idris Marlowe", ["steward", "resident"], key),
      );
    else if (index === 2)
      members.push(
        person(PERSON_KEYS.steward2, DEMO_SIGN_IN_EMAILS.steward2, "Priya Halloway", ["steward", "resident"], key),
      );
    else members.push(nextResident(key, surname));
    if (twoMember.has(index)) {
      // About half of the couples share a surname.
      const partnerSurname = rng.chance(0.5) ? surname : at(PARTNER_SURNAMES, partnerIndex++ % PARTNER_SURNAMES.length);
      members.push(nextResident(key, partnerSurname));
    }
    people.push(...members);
    const lngLat = toLngLat(site.at);
    households.push({
      key,
      name: `The ${surname} household`,
      addressText: site.addressText,
      lat: lngLat[1],
      lng: lngLat[0],
      memberKeys: members.map((member) => member.key),
      declaredWeeklyKg: rng.int(4, 16) / 2,
      // The last few signed up this week and wait for the coordinator to place them.
      assignedDigesterKey: index >= HOUSEHOLD_COUNT - UNASSIGNED_HOUSEHOLDS ? null : site.nearestDigesterKey,
      needsCollection: false,
    });
  });

  for (const index of [8, 14, 21, 27, 35]) at(households, index).needsCollection = true;

  // Volunteers with cargo bikes, starting from home; none of them needs a collection themselves.
  const volunteerHouseholds = [6, 19, 33].map((index) => at(households, index));
  volunteerHouseholds.forEach((household, i) => {
    const volunteer = people.find((candidate) => candidate.key === at(household.memberKeys, 0));
    if (!volunteer) throw new Error("demo data: volunteer missing");
    volunteer.isVolunteer = true;
    volunteer.bikeLoadKg = at([45, 60, 80], i);
    volunteer.startLat = household.lat;
    volunteer.startLng = household.lng;
  });

  people.push(
    person(PERSON_KEYS.coordinator, DEMO_SIGN_IN_EMAILS.coordinator, "Nadia Brightwater", ["coordinator"], null),
    person(PERSON_KEYS.gardener, DEMO_SIGN_IN_EMAILS.gardener, "Teodor Grainger", ["gardener"], null),
  );
  return { people, households };
}

// ───────────────────────────── time helpers ─────────────────────────────

interface Clock {
  /** Local instant on day `day` (0 = today) at hh:mm. */
  at(day: number, hour: number, minute: number): Date;
  /** Local calendar date of day `day`, YYYY-MM-DD. */
  date(day: number): string;
  today: Date;
}

function makeClock(today: Date): Clock {
  const y = today.getFullYear();
  const m = today.getMonth();
  const d = today.getDate();
  const pad = (n: number) => String(n).padStart(2, "0");
  return {
    today,
    at: (day, hour, minute) => new Date(y, m, d + day, hour, minute),
    date: (day) => {
      const local = new Date(y, m, d + day, 12, 0);
      return `${local.getFullYear()}-${pad(local.getMonth() + 1)}-${pad(local.getDate())}`;
    },
  };
}

// ───────────────────────────── the digesters' story ─────────────────────────────

/** Days of history, including today. */
const HISTORY_DAYS = 60;
const FIRST_DAY = -(HISTORY_DAYS - 1);

/** The orchard digester's acid episode: overfed on days −44…−42, rested −39…−34. */
const OVERFEED_DAYS = [-44, -43, -42];
const ACID_REST_FIRST_DAY = -39;
const ACID_REST_LAST_DAY = -34;
// prettier-ignore
const ACID_PH: ReadonlyMap<number, readonly [ph: number, vfaTaRatio: number]> = new Map([
  [-42, [6.95, 0.42]],
  [-41, [6.8, 0.48]],
  [-40, [6.6, 0.57]],
  [-39, [6.45, 0.64]],
  [-38, [6.3, 0.7]],
  [-37, [6.34, 0.68]],
  [-36, [6.48, 0.61]],
  [-35, [6.6, 0.55]],
  [-34, [6.74, 0.48]],
  [-33, [6.88, 0.42]],
  [-32, [6.98, 0.38]],
  [-31, [7.04, 0.35]],
  [-30, [7.08, 0.33]],
]);
/** Share of normal gas production while the orchard digester was sour. */
// prettier-ignore
const ACID_GAS_SHARE: ReadonlyMap<number, number> = new Map([
  [-41, 0.8], [-40, 0.55], [-39, 0.35], [-38, 0.2], [-37, 0.2], [-36, 0.3], [-35, 0.4],
  [-34, 0.5], [-33, 0.6], [-32, 0.7], [-31, 0.8], [-30, 0.9],
]);

/**
 * kg VS per fresh kg of each mix: TS × VS/TS with DOMAIN.md §1's defaults
 * (mixed 26 % × 87 %, fruit & veg 14 × 89, cooked 27 × 90, bread 55 × 96, coffee 40 × 98).
 */
const KG_VS_PER_FRESH_KG: Record<DemoScrapMix, number> = {
  mixed: 0.26 * 0.87,
  fruitVeg: 0.14 * 0.89,
  cooked: 0.27 * 0.9,
  breadGrains: 0.55 * 0.96,
  coffee: 0.4 * 0.98,
};
const TS_FRACTION: Record<DemoScrapMix, number> = {
  mixed: 0.26,
  fruitVeg: 0.14,
  cooked: 0.27,
  breadGrains: 0.55,
  coffee: 0.4,
};
/** Slurry target, 8 % TS (DOMAIN.md §2.7). */
const TARGET_TS_FRACTION = 0.08;
/** Bucket bulk density, kg/L (DOMAIN.md §1 default [judgement]). */
const BUCKET_KG_PER_LITRE = 0.5;

/** f(T) = 1.11^(T − 30) for 10 ≤ T < 30 °C, 1 above, 0 below (DOMAIN.md §2.2). Local copy: the demo must not move when budget code changes. */
const temperatureFactor = (temperatureC: number): number =>
  temperatureC < 10 ? 0 : temperatureC >= 30 ? 1 : 1.11 ** (temperatureC - 30);

interface SimProfile {
  key: string;
  /** Local reading times; single-reading digesters also get a morning check today (keeps one within 24 h). */
  slots: readonly (readonly [hour: number, minute: number])[];
  baseTemperatureC: number;
  swingC: number;
  eveningLiftC: number;
  coldTargetC: number;
  coldMinimumC: number;
  /** How deep the cold spell reaches on each day, 0…1: the uninsulated tank follows the air, an insulated one lags. */
  coldShape: ReadonlyMap<number, number>;
  phDaily: boolean;
  /** Share of the organic limit the stewards actually feed. */
  utilisation: readonly [number, number];
  size: "small" | "large";
  /** Minutes of cooking on a normal day. */
  normalGasMinutes: number;
}

// prettier-ignore
const SHAPE_FOLLOWS_AIR: ReadonlyMap<number, number> = new Map([
  [-29, 0.35], [-28, 1], [-27, 1], [-26, 1], [-25, 1], [-24, 1], [-23, 1], [-22, 0.55], [-21, 0.25], [-20, 0.1],
]);
// prettier-ignore
const SHAPE_LAGS: ReadonlyMap<number, number> = new Map([
  [-29, 0.1], [-28, 0.4], [-27, 0.7], [-26, 0.95], [-25, 1], [-24, 1], [-23, 0.95], [-22, 0.7], [-21, 0.45], [-20, 0.25], [-19, 0.1],
]);

// prettier-ignore
const SIM_PROFILES: ReadonlyMap<string, SimProfile> = new Map<string, SimProfile>([
  [DIGESTER_KEYS.school, {
    key: DIGESTER_KEYS.school, slots: [[15, 40]], baseTemperatureC: 19, swingC: 2.2, eveningLiftC: 0, coldTargetC: 9.6, coldMinimumC: 8,
    coldShape: SHAPE_FOLLOWS_AIR, phDaily: false, utilisation: [0.7, 0.95], size: "small", normalGasMinutes: 25,
  }],
  [DIGESTER_KEYS.orchard, {
    key: DIGESTER_KEYS.orchard, slots: [[17, 30]], baseTemperatureC: 22.5, swingC: 1.4, eveningLiftC: 0, coldTargetC: 11.6, coldMinimumC: 10.5,
    coldShape: SHAPE_LAGS, phDaily: false, utilisation: [0.75, 0.95], size: "small", normalGasMinutes: 45,
  }],
  [DIGESTER_KEYS.meadow, {
    key: DIGESTER_KEYS.meadow, slots: [[8, 30], [18, 15]], baseTemperatureC: 27, swingC: 1.8, eveningLiftC: 1.2, coldTargetC: 18, coldMinimumC: 15,
    coldShape: SHAPE_FOLLOWS_AIR, phDaily: true, utilisation: [0.8, 0.98], size: "large", normalGasMinutes: 150,
  }],
  [DIGESTER_KEYS.green, {
    key: DIGESTER_KEYS.green, slots: [[8, 10], [18, 40]], baseTemperatureC: 35.3, swingC: 0.4, eveningLiftC: 0.2, coldTargetC: 32.8, coldMinimumC: 32,
    coldShape: SHAPE_LAGS, phDaily: true, utilisation: [0.4, 0.55], size: "large", normalGasMinutes: 300,
  }],
]);

function simProfile(key: string): SimProfile {
  const profile = SIM_PROFILES.get(key);
  if (!profile) throw new Error(`demo data: no profile for ${key}`);
  return profile;
}

interface DayConditions {
  temperatures: number[];
  ph: number | null;
  vfaTaRatio: number | null;
}

/** Temperatures, pH and acid ratio per day for one digester (before any feeding is decided). */
function simulateConditions(spec: DigesterSpec, profile: SimProfile): Map<number, DayConditions> {
  const rng = makeRng(`conditions-${spec.key}`);
  const phase1 = rng.range(0, 2 * Math.PI);
  const phase2 = rng.range(0, 2 * Math.PI);
  const phPhase = rng.range(0, 2 * Math.PI);
  const out = new Map<number, DayConditions>();
  const firstDay = Math.max(FIRST_DAY, spec.startedDay);
  for (let day = firstDay; day <= 0; day++) {
    const drift =
      profile.swingC *
      (0.65 * Math.sin((2 * Math.PI * day) / 17 + phase1) + 0.35 * Math.sin((2 * Math.PI * day) / 6.3 + phase2));
    const normal = profile.baseTemperatureC + drift;
    const cold = profile.coldShape.get(day) ?? 0;
    const coldTemperature = profile.coldTargetC + rng.range(-0.8, 0.8);
    const temperatures = profile.slots.map((_, slot) => {
      const lift = slot === profile.slots.length - 1 && profile.slots.length > 1 ? profile.eveningLiftC : 0;
      const value = (1 - cold) * (normal + lift) + cold * coldTemperature + rng.range(-0.3, 0.3);
      return round1(cold > 0 ? Math.max(profile.coldMinimumC, value) : value);
    });

    let ph: number | null = null;
    let vfaTaRatio: number | null = null;
    const sinceStart = day - spec.startedDay;
    const normalPh = round2(
      clamp(7.17 + 0.09 * Math.sin((2 * Math.PI * day) / 11 + phPhase) + rng.range(-0.05, 0.05) - 0.06 * cold, 7, 7.4),
    );
    if (spec.key === DIGESTER_KEYS.orchard && ACID_PH.has(day)) {
      const acid = ACID_PH.get(day);
      if (acid) [ph, vfaTaRatio] = acid;
    } else if (profile.phDaily) {
      // A new digester runs a little low while the methane-formers catch up.
      ph = sinceStart < 12 ? round2(6.86 + 0.015 * sinceStart + rng.range(-0.03, 0.03)) : normalPh;
    } else if (spec.key === DIGESTER_KEYS.school) {
      // Weekly strips, the last one nine days ago: the demo shows the "measure pH" prompt here.
      if (day <= -9 && (day + 9) % 7 === 0) ph = normalPh;
    } else if ((day + 2) % 7 === 0) {
      ph = normalPh;
    }

    if (vfaTaRatio === null && ph !== null) {
      const titrationDay =
        (spec.key === DIGESTER_KEYS.green && day % 7 === 0) ||
        (spec.key === DIGESTER_KEYS.meadow && sinceStart % 3 === 0) ||
        (spec.key === DIGESTER_KEYS.orchard && (day === -58 || day === -23));
      if (titrationDay) vfaTaRatio = round2(sinceStart < 12 ? rng.range(0.36, 0.42) : rng.range(0.24, 0.36));
    }
    out.set(day, { temperatures, ph, vfaTaRatio });
  }
  return out;
}

interface DropOffPlan {
  mix: DemoScrapMix;
  bucketCount: number;
  bucketLitres: number;
  weightKg: number | null;
  freshKg: number;
}

const freshKgOf = (plan: Pick<DropOffPlan, "bucketCount" | "bucketLitres" | "weightKg">): number =>
  plan.weightKg ?? plan.bucketCount * plan.bucketLitres * BUCKET_KG_PER_LITRE;

const waterLitresFor = (mix: DemoScrapMix, freshKg: number): number =>
  freshKg * (TS_FRACTION[mix] / TARGET_TS_FRACTION - 1);

function pickMix(rng: Rng, size: SimProfile["size"]): DemoScrapMix {
  return rng.weighted<DemoScrapMix>([
    ["mixed", 55],
    ["fruitVeg", 25],
    ["cooked", size === "large" ? 8 : 5],
    ["coffee", 7],
    ["breadGrains", size === "large" ? 5 : 0],
  ]);
}

/** Buckets that add up to no more than the day's allowance (kg VS) and slurry (litres). */
function planDropOffs(
  rng: Rng,
  size: SimProfile["size"],
  allowanceKgVs: number,
  slurryLitres: number,
  forceMix?: readonly DemoScrapMix[],
): DropOffPlan[] {
  const plans: DropOffPlan[] = [];
  let kgVsLeft = allowanceKgVs;
  let slurryLeft = slurryLitres;
  // A weighed caddy of peelings can be small; nobody carries less than this.
  const minimumKg = size === "small" ? 0.25 : 0.5;
  // Stewards top up close to the allowance with a weighed caddy rather than stop short.
  const weighedKg = (maxFreshKg: number, low: number, high: number): number =>
    Math.floor((maxFreshKg < high ? maxFreshKg * rng.range(0.96, 1) : rng.range(low, high)) * 10) / 10;
  let misses = 0;
  for (let guard = 0; guard < 60 && misses < 6; guard++) {
    const mix = forceMix ? rng.pick(forceMix) : pickMix(rng, size);
    // About a litre per kg of scraps, plus its dilution water.
    const perKgSlurry = 1 + waterLitresFor(mix, 1);
    const maxFreshKg = Math.min(kgVsLeft / KG_VS_PER_FRESH_KG[mix], slurryLeft / perKgSlurry);
    if (maxFreshKg < minimumKg) {
      misses += 1;
      continue;
    }
    const buckets: (readonly [Omit<DropOffPlan, "mix" | "freshKg">, number])[] =
      size === "large"
        ? [
            [{ bucketCount: 1, bucketLitres: 10, weightKg: null }, 5],
            [{ bucketCount: 1, bucketLitres: 15, weightKg: null }, 3],
            [{ bucketCount: 2, bucketLitres: 10, weightKg: null }, 1],
            [{ bucketCount: 1, bucketLitres: 5, weightKg: null }, 1],
            [{ bucketCount: 1, bucketLitres: 15, weightKg: weighedKg(maxFreshKg, 3, 8.5) }, 1.5],
          ]
        : [
            [{ bucketCount: 1, bucketLitres: 5, weightKg: null }, 3],
            [{ bucketCount: 1, bucketLitres: 10, weightKg: null }, 1],
            [{ bucketCount: 1, bucketLitres: 5, weightKg: weighedKg(maxFreshKg, 0.6, 2.4) }, 3],
          ];
    const fitting = buckets.filter(
      ([bucket]) =>
        (bucket.weightKg === null || bucket.weightKg >= minimumKg) && freshKgOf(bucket) <= maxFreshKg + 1e-9,
    );
    if (fitting.length === 0) {
      misses += 1;
      continue;
    }
    const bucket = rng.weighted(fitting);
    const freshKg = freshKgOf(bucket);
    plans.push({ ...bucket, mix, freshKg });
    kgVsLeft -= freshKg * KG_VS_PER_FRESH_KG[mix];
    slurryLeft -= freshKg * perKgSlurry;
  }
  return plans;
}

const DROP_OFF_NOTES = [
  "Peelings from batch cooking.",
  "Chopped small, as asked.",
  "Mostly veg trimmings from the allotment.",
  "Left by the inlet; lid on.",
  "Includes the week's coffee grounds.",
] as const;

const READING_NOTES: ReadonlyMap<string, ReadonlyMap<number, string>> = new Map([
  [
    DIGESTER_KEYS.green,
    new Map([
      [-55, "Drained the condensate trap."],
      [-41, "Lunch club cooked for forty today."],
      [-26, "Cold snap: heating loop running flat out, tank a little cooler."],
      [-12, "Flame trap checked and cleaned."],
      [-3, "Stirred; broke up the crust."],
    ]),
  ],
  [
    DIGESTER_KEYS.orchard,
    new Map([
      [-44, "Leftovers from the harvest supper: a lot of bread and rice over three days."],
      [-41, "Flame weaker than usual."],
      [-40, "Sour smell; flame orange and weak. Halving the feed."],
      [-39, "pH below 6.5: stopped feeding, stirred, added 1 kg of sodium bicarbonate."],
      [-37, "Re-tested: acids still high. Resting."],
      [-35, "pH climbing. Resting two more days."],
      [-33, "Restarting at a quarter of the usual feed."],
      [-27, "Cold snap: wrapped the inlet pipe."],
      [-16, "Flame steady and blue again."],
    ]),
  ],
  [
    DIGESTER_KEYS.school,
    new Map([
      [-27, "Frost overnight. Lid covered with an old duvet."],
      [-25, "Too cold to feed today."],
      [-20, "Warming up again; the class timed the flame."],
      [-3, "Out of pH strips; new pack ordered."],
    ]),
  ],
  [
    DIGESTER_KEYS.meadow,
    new Map([
      [-20, "Filled with water and 200 L of digestate from the Green digester as a starter."],
      [-15, "Gas will not light yet; vented the drum."],
      [-11, "First steady blue flame."],
      [-5, "Solar loop pump restarted after the storm."],
    ]),
  ],
]);

interface TurnedAwayPlan {
  day: number;
  digesterKey: string;
  reason: DemoTurnedAwayReason;
  bucketLitres: number;
  mix: DemoScrapMix;
  citrusPercent: number;
  note: string;
}

const TURNED_AWAY: readonly TurnedAwayPlan[] = [
  {
    day: -52,
    digesterKey: DIGESTER_KEYS.green,
    reason: "contamination",
    bucketLitres: 10,
    mix: "cooked",
    citrusPercent: 0,
    note: "Chicken bones and a plastic bag in the bucket.",
  },
  {
    day: -47,
    digesterKey: DIGESTER_KEYS.green,
    reason: "too_much_citrus",
    bucketLitres: 15,
    mix: "fruitVeg",
    citrusPercent: 15,
    note: "Mostly orange peel from marmalade making.",
  },
  {
    day: -39,
    digesterKey: DIGESTER_KEYS.orchard,
    reason: "over_budget",
    bucketLitres: 5,
    mix: "mixed",
    citrusPercent: 2,
    note: "Digester resting after acid build-up; please take it to Larkmoor Green.",
  },
  {
    day: -37,
    digesterKey: DIGESTER_KEYS.orchard,
    reason: "over_budget",
    bucketLitres: 10,
    mix: "mixed",
    citrusPercent: 0,
    note: "Still resting; redirected to Larkmoor Green.",
  },
  {
    day: -26,
    digesterKey: DIGESTER_KEYS.school,
    reason: "over_budget",
    bucketLitres: 5,
    mix: "fruitVeg",
    citrusPercent: 5,
    note: "Too cold to digest this week.",
  },
  {
    day: -18,
    digesterKey: DIGESTER_KEYS.green,
    reason: "contamination",
    bucketLitres: 10,
    mix: "mixed",
    citrusPercent: 3,
    note: "'Compostable' bag inside; please empty it loose.",
  },
  {
    day: -6,
    digesterKey: DIGESTER_KEYS.meadow,
    reason: "too_much_citrus",
    bucketLitres: 10,
    mix: "fruitVeg",
    citrusPercent: 15,
    note: "Half lemon and lime peel; a new digester cannot take that.",
  },
];

/** Today's pending drop-offs: [digester, hour, minute, litres, weighed kg or null, mix]. */
// prettier-ignore
const PENDING_TODAY: readonly (readonly [string, number, number, number, number | null, DemoScrapMix])[] = [
  [DIGESTER_KEYS.green, 7, 40, 10, null, "mixed"],
  [DIGESTER_KEYS.green, 8, 25, 15, null, "fruitVeg"],
  [DIGESTER_KEYS.orchard, 9, 5, 5, 1.6, "fruitVeg"],
  [DIGESTER_KEYS.meadow, 9, 50, 5, null, "mixed"],
  [DIGESTER_KEYS.school, 10, 35, 5, 1.1, "fruitVeg"],
  [DIGESTER_KEYS.green, 11, 20, 10, null, "coffee"],
];

// ───────────────────────────── the generator ─────────────────────────────

/**
 * Builds the whole Larkmoor demo for the given day. Pure and deterministic:
 * the same `today` (same local date and time) gives the same objects. Nothing
 * is dated after `today`, except tomorrow's collections and claims.
 */
export function buildDemoNeighbourhood(today: Date): DemoNeighbourhood {
  const clock = makeClock(today);
  const { people, households } = buildCommunity();

  const digesters: DemoDigester[] = DIGESTER_SPECS.map((spec) => {
    const [lng, lat] = toLngLat(spec.at);
    const { at: _at, startedDay, gasFirstBurnedDay, steward, ...rest } = spec;
    return {
      ...rest,
      lat,
      lng,
      startedOn: clock.date(startedDay),
      gasFirstBurnedOn: clock.date(gasFirstBurnedDay),
      stewardKeys: [PERSON_KEYS[steward]],
    };
  });

  const readings: DemoReading[] = [];
  const feedings: DemoFeeding[] = [];
  const dropOffs: DemoDropOff[] = [];
  const membersOf = new Map(households.map((household) => [household.key, household.memberKeys]));
  const assigned = households.filter((household) => household.assignedDigesterKey !== null);
  const residentHouseholdKey = at(households, 0).key;

  // Residents mostly use their own digester; the big Green one also takes everyone's surplus.
  const poolFor = (digesterKey: string): readonly (readonly [string, number])[] => {
    if (digesterKey === DIGESTER_KEYS.green) {
      return assigned.map(
        (household) => [household.key, household.assignedDigesterKey === digesterKey ? 3 : 1] as const,
      );
    }
    const own = assigned.filter((household) => household.assignedDigesterKey === digesterKey);
    return (own.length > 0 ? own : assigned).map((household) => [household.key, 1] as const);
  };

  let dropOffNumber = 0;
  const addDropOff = (
    rng: Rng,
    fields: Omit<DemoDropOff, "key" | "personKey" | "forDate" | "createdAt" | "note"> & {
      createdAt: Date;
      day: number;
      note?: string | null;
    },
  ): DemoDropOff => {
    dropOffNumber += 1;
    const members = membersOf.get(fields.householdKey) ?? [];
    const { day, createdAt, note, ...rest } = fields;
    const dropOff: DemoDropOff = {
      key: `drop-off-${String(dropOffNumber).padStart(4, "0")}`,
      ...rest,
      personKey: rng.pick(members),
      createdAt: createdAt.toISOString(),
      forDate: clock.date(day),
      note: note ?? (rng.chance(0.06) ? rng.pick(DROP_OFF_NOTES) : null),
    };
    dropOffs.push(dropOff);
    return dropOff;
  };

  for (const spec of DIGESTER_SPECS) {
    const profile = simProfile(spec.key);
    const stewardKey = PERSON_KEYS[spec.steward];
    const conditions = simulateConditions(spec, profile);
    const rng = makeRng(`feeding-${spec.key}`);
    const gasRng = makeRng(`gas-${spec.key}`);
    const pool = poolFor(spec.key);
    const vsFedByDay = new Map<number, number>();
    const firstDay = Math.max(FIRST_DAY, spec.startedDay);
    const historyBeforeWindow = spec.startedDay < FIRST_DAY;

    // ── feeding, day by day (today's feed has not happened yet: only pending drop-offs) ──
    let latestPh: { day: number; ph: number; vfaTaRatio: number | null } | null = null;
    for (let day = firstDay; day <= -1; day++) {
      const c = conditions.get(day);
      if (!c) continue;
      if (c.ph !== null) latestPh = { day, ph: c.ph, vfaTaRatio: c.vfaTaRatio };
      const temperatureC = c.temperatures.reduce((sum, t) => sum + t, 0) / c.temperatures.length;
      const volumeM3 = spec.workingVolumeM3;
      const organicKgVs = spec.olrRefKgVsPerM3Day * temperatureFactor(temperatureC) * volumeM3;

      // Stability gate, as the stewards apply it (DOMAIN.md §2.3).
      let stability = 1;
      if (latestPh === null || day - latestPh.day > 7) stability = 0.8;
      else if (latestPh.ph < 6.5 || (latestPh.vfaTaRatio ?? 0) > 0.6) stability = 0;
      else if (latestPh.ph < 6.8 || (latestPh.vfaTaRatio ?? 0) > 0.5) stability = 0.5;

      // Start-up: nothing until the gas burns, then 25 % rising to 100 % over 42 days (DOMAIN.md §2.4).
      const sinceGas = day - spec.gasFirstBurnedDay;
      const startUp = sinceGas < 0 ? 0 : Math.min(1, 0.25 + (0.75 * sinceGas) / 42);

      // Week-on-week: ≤ 1.2 × the previous 7 days' mean, never below a quarter of the organic limit (DOMAIN.md §2.5).
      let weekCap = Infinity;
      if (!historyBeforeWindow || day - 7 >= FIRST_DAY) {
        let sum = 0;
        for (let back = 1; back <= 7; back++) sum += vsFedByDay.get(day - back) ?? 0;
        weekCap = Math.max((1.2 * sum) / 7, 0.25 * organicKgVs);
      }
      const hydraulicLitres = (volumeM3 * 1000) / (temperatureC >= 20 ? 40 : 100);

      let allowanceKgVs = Math.min(
        rng.range(...profile.utilisation) * stability * organicKgVs,
        weekCap,
        startUp * organicKgVs,
      );
      let forceMix: readonly DemoScrapMix[] | undefined;
      let feedingNote: string | null = null;
      if (spec.key === DIGESTER_KEYS.orchard) {
        if (OVERFEED_DAYS.includes(day)) {
          // The story of the acid episode: a harvest supper's leftovers, well over the limit.
          allowanceKgVs = 2.3 * organicKgVs;
          forceMix = ["cooked", "breadGrains", "cooked", "mixed"];
          feedingNote = "Harvest supper leftovers.";
        } else if (day >= ACID_REST_FIRST_DAY && day <= ACID_REST_LAST_DAY) {
          allowanceKgVs = 0;
        }
      }

      const plans = planDropOffs(rng, profile.size, allowanceKgVs, forceMix ? Infinity : hydraulicLitres, forceMix);
      if (plans.length === 0) continue;
      const times = plans.map(() => rng.int(7 * 60, 19 * 60 + 30)).sort((a, b) => a - b);
      const fed = plans.map((plan, index) => {
        const minutes = at(times, index);
        const householdKey =
          spec.key === DIGESTER_KEYS.green && index === 0 && (day + 90) % 3 === 0
            ? residentHouseholdKey
            : rng.weighted(pool);
        return addDropOff(rng, {
          householdKey,
          digesterKey: spec.key,
          day,
          createdAt: clock.at(day, Math.floor(minutes / 60), minutes % 60),
          bucketCount: plan.bucketCount,
          bucketLitres: plan.bucketLitres,
          weightKg: plan.weightKg,
          mix: plan.mix,
          citrusPercent: plan.mix === "fruitVeg" ? rng.int(0, 10) : rng.int(0, 4),
          status: "fed",
          turnedAwayReason: null,
        });
      });
      const freshKg = plans.reduce((sum, plan) => sum + plan.freshKg, 0);
      const waterLitres = plans.reduce((sum, plan) => sum + waterLitresFor(plan.mix, plan.freshKg), 0);
      vsFedByDay.set(
        day,
        plans.reduce((sum, plan) => sum + plan.freshKg * KG_VS_PER_FRESH_KG[plan.mix], 0),
      );
      feedings.push({
        key: `feeding-${spec.key.replace("digester-", "")}-${clock.date(day)}`,
        digesterKey: spec.key,
        personKey: stewardKey,
        fedOn: clock.date(day),
        freshKg: round1(freshKg),
        waterLitres: round1(waterLitres),
        dropOffKeys: fed.map((dropOff) => dropOff.key),
        note: feedingNote,
      });
    }

    // ── readings ──
    const notes = READING_NOTES.get(spec.key) ?? new Map<number, string>();
    const normalKgVs =
      spec.olrRefKgVsPerM3Day *
      temperatureFactor(profile.baseTemperatureC) *
      spec.workingVolumeM3 *
      profile.utilisation[0];
    let readingNumber = 0;
    for (let day = firstDay; day <= 0; day++) {
      const c = conditions.get(day);
      if (!c) continue;
      let recentKgVs = 0;
      for (let back = 0; back < 7; back++) recentKgVs += vsFedByDay.get(day - back) ?? 0;
      const coldShare = temperatureFactor(at(c.temperatures, 0)) / temperatureFactor(profile.baseTemperatureC);
      const acidShare = spec.key === DIGESTER_KEYS.orchard ? (ACID_GAS_SHARE.get(day) ?? 1) : 1;
      const fedShare = historyBeforeWindow && day - 7 < FIRST_DAY ? 1 : recentKgVs / 7 / normalKgVs;
      const health = clamp(Math.min(fedShare, 1) * Math.min(1, 0.5 + 0.5 * coldShare) * acidShare, 0, 1);
      const gasBurns = day >= spec.gasFirstBurnedDay;

      // Today a single-reading digester also gets a morning check, so one reading is always less than a day old.
      const morningCheck = day === 0 && profile.slots.length === 1;
      const slots: (readonly [number, number])[] = morningCheck ? [[7, 45], ...profile.slots] : [...profile.slots];
      slots.forEach(([hour, minute], slot) => {
        const takenAt = clock.at(day, hour, minute + gasRng.int(0, 9));
        if (takenAt.getTime() > today.getTime()) return;
        const isMorningCheck = morningCheck && slot === 0;
        const regular = morningCheck ? slot - 1 : slot;
        const temperatureC = isMorningCheck ? round1(at(c.temperatures, 0) - 0.6) : at(c.temperatures, regular);
        let gasLevelPercent: number;
        if (!gasBurns) gasLevelPercent = round1(clamp(15 + 2.5 * (day - spec.startedDay) + gasRng.range(-5, 5), 5, 60));
        else if (profile.slots.length > 1)
          gasLevelPercent = round1(
            clamp((regular === 0 ? 45 + 45 * health : 18 + 30 * health) + gasRng.range(-4, 4), 3, 97),
          );
        else gasLevelPercent = round1(clamp(28 + 50 * health + gasRng.range(-6, 6), 3, 97));
        const lastRegular = regular === profile.slots.length - 1;
        const gasUsedMinutes =
          gasBurns && lastRegular
            ? Math.round((profile.normalGasMinutes * health * gasRng.range(0.8, 1.1)) / 5) * 5
            : null;
        const phHere = regular === 0 ? c.ph : null;
        readingNumber += 1;
        readings.push({
          key: `reading-${spec.key.replace("digester-", "")}-${String(readingNumber).padStart(3, "0")}`,
          digesterKey: spec.key,
          personKey: stewardKey,
          takenAt: takenAt.toISOString(),
          temperatureC,
          ph: phHere,
          vfaTaRatio: phHere === null ? null : c.vfaTaRatio,
          gasLevelPercent,
          gasUsedMinutes,
          note: regular === 0 ? (notes.get(day) ?? null) : null,
        });
      });
    }
  }

  // ── turned away ──
  const turnedAwayRng = makeRng("turned-away");
  for (const plan of TURNED_AWAY) {
    addDropOff(turnedAwayRng, {
      householdKey: turnedAwayRng.weighted(poolFor(plan.digesterKey)),
      digesterKey: plan.digesterKey,
      day: plan.day,
      createdAt: clock.at(plan.day, turnedAwayRng.int(8, 18), turnedAwayRng.int(0, 59)),
      bucketCount: 1,
      bucketLitres: plan.bucketLitres,
      weightKg: null,
      mix: plan.mix,
      citrusPercent: plan.citrusPercent,
      status: "turned_away",
      turnedAwayReason: plan.reason,
      note: plan.note,
    });
  }

  // ── today's pending drop-offs, never later than `today` ──
  const pendingRng = makeRng("pending");
  const startOfToday = clock.at(0, 0, 0).getTime();
  PENDING_TODAY.forEach(([digesterKey, hour, minute, litres, weightKg, mix], index) => {
    const wanted = clock.at(0, hour, minute).getTime();
    // Early in the day the six are squeezed into the hours already gone.
    const createdAt =
      wanted <= today.getTime()
        ? wanted
        : startOfToday + ((today.getTime() - startOfToday) * (index + 1)) / (PENDING_TODAY.length + 1);
    addDropOff(pendingRng, {
      householdKey: index === 0 ? residentHouseholdKey : pendingRng.weighted(poolFor(digesterKey)),
      digesterKey,
      day: 0,
      createdAt: new Date(createdAt),
      bucketCount: 1,
      bucketLitres: litres,
      weightKg,
      mix,
      citrusPercent: mix === "fruitVeg" ? 6 : 0,
      status: "pending",
      turnedAwayReason: null,
      note: null,
    });
  });
  dropOffs.sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.key.localeCompare(b.key));

  // ── collections for neighbours who cannot carry ──
  const collectionHouseholds = households.filter((household) => household.needsCollection);
  const collectionRequests: DemoCollectionRequest[] = collectionHouseholds.map((household, index) => ({
    key: `collection-${index + 1}`,
    householdKey: household.key,
    personKey: at(household.memberKeys, 0),
    forDate: clock.date(index < 4 ? 1 : 2),
    bucketCount: index % 3 === 0 ? 2 : 1,
    bucketLitres: 10,
    note: index === 1 ? "Bucket is by the side gate." : null,
  }));
  const ankle = at(households, 12);
  collectionRequests.push({
    key: `collection-${collectionRequests.length + 1}`,
    householdKey: ankle.key,
    personKey: at(ankle.memberKeys, 0),
    forDate: clock.date(2),
    bucketCount: 1,
    bucketLitres: 15,
    note: "Ankle in plaster this week; thank you!",
  });

  // ── fertiliser for the gardener ──
  const claim = (
    n: number,
    digesterKey: string,
    litres: number,
    day: number,
    [hour, minute]: readonly [number, number],
    hours: number,
    status: DemoFertiliserClaimStatus,
  ): DemoFertiliserClaim => ({
    key: `fertiliser-claim-${n}`,
    digesterKey,
    personKey: PERSON_KEYS.gardener,
    litres,
    windowStart: clock.at(day, hour, minute).toISOString(),
    windowEnd: clock.at(day, hour + hours, minute).toISOString(),
    bedAreaM2: 24,
    status,
  });
  const fertiliserClaims: DemoFertiliserClaim[] = [
    claim(1, DIGESTER_KEYS.green, 150, -50, [10, 0], 1, "collected"),
    claim(2, DIGESTER_KEYS.green, 120, -36, [17, 30], 1, "collected"),
    claim(3, DIGESTER_KEYS.orchard, 40, -22, [9, 30], 1, "collected"),
    claim(4, DIGESTER_KEYS.green, 160, -15, [10, 0], 2, "collected"),
    claim(5, DIGESTER_KEYS.green, 140, -8, [16, 0], 1, "collected"),
    claim(6, DIGESTER_KEYS.green, 120, 1, [9, 30], 1, "claimed"),
    claim(7, DIGESTER_KEYS.orchard, 30, 3, [17, 0], 1, "claimed"),
  ];

  readings.sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.key.localeCompare(b.key));
  feedings.sort((a, b) => a.fedOn.localeCompare(b.fedOn) || a.key.localeCompare(b.key));

  return {
    name: "Larkmoor",
    centre: { lat: LARKMOOR_CENTRE.lat, lng: LARKMOOR_CENTRE.lng },
    people,
    households,
    digesters,
    readings,
    feedings,
    dropOffs,
    collectionRequests,
    fertiliserClaims,
  };
}
