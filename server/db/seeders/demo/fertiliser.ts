/** The gardener's claims on the digesters' liquid fertiliser: collected ones and two to come. */
import type { Clock } from "./clock";
import { DIGESTER_KEYS, PERSON_KEYS } from "./keys";
import type { DemoFertiliserClaim, DemoFertiliserClaimStatus } from "./types";

/** The gardener's claims, dated from `clock`. */
export function buildFertiliserClaims(clock: Clock): DemoFertiliserClaim[] {
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
  return [
    claim(1, DIGESTER_KEYS.green, 150, -50, [10, 0], 1, "collected"),
    claim(2, DIGESTER_KEYS.green, 120, -36, [17, 30], 1, "collected"),
    claim(3, DIGESTER_KEYS.orchard, 40, -22, [9, 30], 1, "collected"),
    claim(4, DIGESTER_KEYS.green, 160, -15, [10, 0], 2, "collected"),
    claim(5, DIGESTER_KEYS.green, 140, -8, [16, 0], 1, "collected"),
    claim(6, DIGESTER_KEYS.green, 120, 1, [9, 30], 1, "claimed"),
    claim(7, DIGESTER_KEYS.orchard, 30, 3, [17, 0], 1, "claimed"),
  ];
}
