/**
 * The four demo digesters: where they stand, their size, heating and insulation, when they
 * started and first burned gas, and who looks after each.
 */
import type { Clock } from "./clock";
import type { Xy } from "./geometry";
import { DIGESTER_KEYS, PERSON_KEYS } from "./keys";
import { toLngLat } from "./place";
import type { DemoDigester } from "./types";

export interface DigesterSpec extends Omit<
  DemoDigester,
  "lat" | "lng" | "startedOn" | "gasFirstBurnedOn" | "stewardKeys"
> {
  at: Xy;
  startedDay: number;
  gasFirstBurnedDay: number;
  steward: "steward" | "steward2";
}

// Day numbers are relative to `today` (0); negative is the past.
export const DIGESTER_SPECS: readonly DigesterSpec[] = [
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

/** The digesters as records, dated from `clock`. */
export function buildDigesters(clock: Clock): DemoDigester[] {
  return DIGESTER_SPECS.map((spec) => {
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
}
