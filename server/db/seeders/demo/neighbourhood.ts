/**
 * Larkmoor: the invented demo neighbourhood that the start command seeds, put together from
 * the parts in this folder.
 *
 * Everything here is made up: the place, its streets, parks and stream, the people and the
 * digesters. {@link buildDemoNeighbourhood} is pure and deterministic: fixed-seed random
 * streams, no clock (the caller passes `today`), no disk, no database. It returns plain
 * objects linked by string keys; the writer turns keys into row ids.
 */
import { makeClock } from "./clock";
import { buildCollectionRequests } from "./collections";
import { simProfile, simulateConditions } from "./conditions";
import { buildDigesters, DIGESTER_SPECS } from "./digesters";
import { addPendingToday, addTurnedAway, DropOffLog } from "./drop-offs";
import { buildFertiliserClaims } from "./fertiliser";
import { feedDigester } from "./feedings";
import { at } from "./numbers";
import { buildCommunity } from "./people";
import { LARKMOOR_CENTRE } from "./place";
import { readDigester } from "./readings";
import type { DemoFeeding, DemoNeighbourhood, DemoReading } from "./types";

/**
 * Builds the whole Larkmoor demo for the given day. Pure and deterministic:
 * the same `today` (same local date and time) gives the same objects. Nothing
 * is dated after `today`, except tomorrow's collections and claims.
 */
export function buildDemoNeighbourhood(today: Date): DemoNeighbourhood {
  const clock = makeClock(today);
  const { people, households } = buildCommunity();
  const digesters = buildDigesters(clock);
  const residentHouseholdKey = at(households, 0).key;

  // Each digester's history: its conditions, the feedings they allowed, then the readings that
  // show them. The drop-off log numbers the buckets in this order, then the turned-away and
  // today's pending ones.
  const log = new DropOffLog(clock, households);
  const readings: DemoReading[] = [];
  const feedings: DemoFeeding[] = [];
  for (const spec of DIGESTER_SPECS) {
    const conditions = simulateConditions(spec, simProfile(spec.key));
    const fed = feedDigester(spec, conditions, log, clock, residentHouseholdKey);
    feedings.push(...fed.feedings);
    readings.push(...readDigester(spec, conditions, fed.vsFedByDay, clock));
  }
  addTurnedAway(log, clock);
  addPendingToday(log, clock, residentHouseholdKey);
  const dropOffs = log.dropOffs;
  dropOffs.sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.key.localeCompare(b.key));
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
    collectionRequests: buildCollectionRequests(households, clock),
    fertiliserClaims: buildFertiliserClaims(clock),
  };
}
