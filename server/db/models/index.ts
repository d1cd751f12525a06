/**
 * Every table's model (one file per table, column for column as the migrations make them; the
 * test tests/server/models.test.ts compares them with information_schema) and the associations
 * between them. Repositories use `models()`; a repository reads and writes only the tables its
 * module owns (README, "Who owns which table").
 */
import type { Sequelize } from "sequelize";
import { sequelize } from "../sequelize";
import { CollectionRequestModel } from "./collection-request.model";
import { CollectionRoundStopModel } from "./collection-round-stop.model";
import { CollectionRoundModel } from "./collection-round.model";
import { DigesterDayModel } from "./digester-day.model";
import { DigesterStewardModel } from "./digester-steward.model";
import { DigesterModel } from "./digester.model";
import { DropOffModel } from "./drop-off.model";
import { FeedingModel } from "./feeding.model";
import { FertiliserClaimModel } from "./fertiliser-claim.model";
import { HouseholdModel } from "./household.model";
import { IdempotencyKeyModel } from "./idempotency-key.model";
import { InvitationModel } from "./invitation.model";
import { OutboxEmailModel } from "./outbox-email.model";
import { PasswordResetModel } from "./password-reset.model";
import { PasswordResetRequestModel } from "./password-reset-request.model";
import { PersonModel } from "./person.model";
import { RateLimitHitModel } from "./rate-limit-hit.model";
import { ReadingModel } from "./reading.model";
import { SessionModel } from "./session.model";

const all = {
  Digester: DigesterModel,
  Household: HouseholdModel,
  Person: PersonModel,
  DigesterSteward: DigesterStewardModel,
  DropOff: DropOffModel,
  Feeding: FeedingModel,
  Reading: ReadingModel,
  FertiliserClaim: FertiliserClaimModel,
  CollectionRequest: CollectionRequestModel,
  CollectionRound: CollectionRoundModel,
  CollectionRoundStop: CollectionRoundStopModel,
  DigesterDay: DigesterDayModel,
  IdempotencyKey: IdempotencyKeyModel,
  OutboxEmail: OutboxEmailModel,
  Invitation: InvitationModel,
  PasswordReset: PasswordResetModel,
  PasswordResetRequest: PasswordResetRequestModel,
  Session: SessionModel,
  RateLimitHit: RateLimitHitModel,
};

export type Models = typeof all;

/** The foreign keys of the migrations, as Sequelize associations (both directions where a read uses them). */
function associate(m: Models) {
  // A digester's day.
  m.Digester.hasMany(m.DropOff, { foreignKey: "digesterId", as: "dropOffs" });
  m.DropOff.belongsTo(m.Digester, { foreignKey: "digesterId", as: "digester" });
  m.Household.hasMany(m.DropOff, { foreignKey: "householdId", as: "dropOffs" });
  m.DropOff.belongsTo(m.Household, { foreignKey: "householdId", as: "household" });
  m.DropOff.belongsTo(m.Person, { foreignKey: "personId", as: "person" });
  m.DropOff.belongsTo(m.Person, { foreignKey: "handledByPersonId", as: "handledBy" });
  m.DropOff.hasOne(m.Feeding, { foreignKey: "dropOffId", as: "feeding" });
  m.Feeding.belongsTo(m.DropOff, { foreignKey: "dropOffId", as: "dropOff" });
  m.Digester.hasMany(m.Feeding, { foreignKey: "digesterId", as: "feedings" });
  m.Feeding.belongsTo(m.Digester, { foreignKey: "digesterId", as: "digester" });
  m.Feeding.belongsTo(m.Person, { foreignKey: "personId", as: "person" });
  m.Digester.hasMany(m.Reading, { foreignKey: "digesterId", as: "readings" });
  m.Reading.belongsTo(m.Digester, { foreignKey: "digesterId", as: "digester" });
  m.Reading.belongsTo(m.Person, { foreignKey: "personId", as: "person" });
  m.Digester.hasMany(m.DigesterDay, { foreignKey: "digesterId", as: "days" });
  m.DigesterDay.belongsTo(m.Digester, { foreignKey: "digesterId", as: "digester" });

  // Households and people.
  m.Household.belongsTo(m.Digester, { foreignKey: "assignedDigesterId", as: "assignedDigester" });
  m.Digester.hasMany(m.Household, { foreignKey: "assignedDigesterId", as: "assignedHouseholds" });
  m.Household.hasMany(m.Person, { foreignKey: "householdId", as: "members" });
  m.Person.belongsTo(m.Household, { foreignKey: "householdId", as: "household" });
  m.Digester.belongsToMany(m.Person, {
    through: m.DigesterSteward,
    foreignKey: "digesterId",
    otherKey: "personId",
    as: "stewards",
  });
  m.Person.belongsToMany(m.Digester, {
    through: m.DigesterSteward,
    foreignKey: "personId",
    otherKey: "digesterId",
    as: "stewardedDigesters",
  });
  m.Invitation.belongsTo(m.Person, { foreignKey: "personId", as: "person" });
  m.Invitation.belongsTo(m.Person, { foreignKey: "invitedBy", as: "inviter" });
  m.PasswordReset.belongsTo(m.Person, { foreignKey: "personId", as: "person" });
  m.IdempotencyKey.belongsTo(m.Person, { foreignKey: "personId", as: "person" });
  m.FertiliserClaim.belongsTo(m.Digester, { foreignKey: "digesterId", as: "digester" });
  m.FertiliserClaim.belongsTo(m.Person, { foreignKey: "personId", as: "person" });

  // Collections and rounds.
  m.Household.hasMany(m.CollectionRequest, { foreignKey: "householdId", as: "collectionRequests" });
  m.CollectionRequest.belongsTo(m.Household, { foreignKey: "householdId", as: "household" });
  m.CollectionRound.belongsTo(m.Person, { foreignKey: "volunteerId", as: "volunteer" });
  m.CollectionRound.belongsTo(m.Digester, { foreignKey: "endDigesterId", as: "endDigester" });
  m.CollectionRound.hasMany(m.CollectionRoundStop, { foreignKey: "roundId", as: "stops" });
  m.CollectionRoundStop.belongsTo(m.CollectionRound, { foreignKey: "roundId", as: "round" });
  m.CollectionRoundStop.belongsTo(m.CollectionRequest, { foreignKey: "requestId", as: "request" });
  m.CollectionRequest.hasOne(m.CollectionRoundStop, { foreignKey: "requestId", as: "stop" });
  m.CollectionRoundStop.belongsTo(m.DropOff, { foreignKey: "dropOffId", as: "dropOff" });
}

let boundTo: Sequelize | undefined;

/** Registers every model and association on the process's current Sequelize instance (again after a reconnect). */
export function models(): Models {
  const s = sequelize();
  if (boundTo !== s) {
    for (const m of Object.values(all)) m.initModel(s);
    associate(all);
    boundTo = s;
  }
  return all;
}
