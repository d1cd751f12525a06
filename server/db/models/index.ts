import { sequelize } from "../sequelize";
import { DigesterModel } from "./digester.model";
import { HouseholdModel } from "./household.model";
import { DigesterStewardModel, PersonModel } from "./person.model";
import {
  CollectionRequestModel,
  DropOffModel,
  FeedingModel,
  FertiliserClaimModel,
  ReadingModel,
} from "./activity.model";

import type { Sequelize } from "sequelize";

let boundTo: Sequelize | undefined;

/** Registers every model on the process's current Sequelize instance (again after a reconnect). */
export function models() {
  const s = sequelize();
  if (boundTo !== s) {
    for (const m of [
      DigesterModel,
      HouseholdModel,
      PersonModel,
      DigesterStewardModel,
      DropOffModel,
      FeedingModel,
      ReadingModel,
      FertiliserClaimModel,
      CollectionRequestModel,
    ]) {
      m.initModel(s);
    }
    boundTo = s;
  }
  return {
    Digester: DigesterModel,
    Household: HouseholdModel,
    Person: PersonModel,
    DigesterSteward: DigesterStewardModel,
    DropOff: DropOffModel,
    Feeding: FeedingModel,
    Reading: ReadingModel,
    FertiliserClaim: FertiliserClaimModel,
    CollectionRequest: CollectionRequestModel,
  };
}
