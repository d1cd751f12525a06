/**
 * Collection requests from neighbours who cannot carry their buckets, for tomorrow and the
 * day after (the coordinator plans the cargo-bike rounds for them; the demo seeds no rounds).
 */
import type { Clock } from "./clock";
import { at } from "./numbers";
import type { DemoCollectionRequest, DemoHousehold } from "./types";

/** One request per household that needs a collection, plus one from a neighbour with an ankle in plaster. */
export function buildCollectionRequests(households: readonly DemoHousehold[], clock: Clock): DemoCollectionRequest[] {
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
  return collectionRequests;
}
