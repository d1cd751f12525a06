/**
 * The plain records the demo generator returns and the writer inserts: linked by string
 * keys (`person-resident`, `digester-green` …), which the writer turns into row ids.
 */

export type DemoRole = "resident" | "steward" | "coordinator" | "gardener";
export type DemoHeating = "none" | "solar" | "electric" | "waste-heat";
export type DemoInsulation = "none" | "partial" | "full";
export type DemoDigesterStatus = "active" | "resting" | "offline";
export type DemoScrapMix = "mixed" | "fruitVeg" | "cooked" | "breadGrains" | "coffee";
export type DemoDropOffStatus = "pending" | "fed" | "turned_away";
export type DemoTurnedAwayReason = "contamination" | "too_much_citrus" | "over_budget";
export type DemoFertiliserClaimStatus = "claimed" | "collected";

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
