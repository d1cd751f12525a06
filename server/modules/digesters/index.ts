/**
 * The digester's day: the module that owns `digesters`, `digester_stewards`, `drop_offs`,
 * `feedings`, `readings` and the daily ledger `digester_days`. Other modules (drop-offs,
 * feedings, readings, steward, rebalancing, rounds, assignments, households, people) call what is
 * exported here, never a repository of this folder (eslint.config.js enforces it).
 */
export { digesterToday, loadDigestersToday, type DigesterToday } from "./digester-state.service";
export { findDigesters, type DigesterRow } from "./digester-state.repository";
export { toSummary } from "./digesters.service";
export { toProfile } from "./digester-profile.service";
export {
  closedDigester,
  reserveToday,
  suggestedWaterLitres,
  todayLimitKgVs,
  withLedgerGuard,
  type Reservation,
} from "./feed-capacity";
export {
  digesterPoints,
  findStewards,
  lockDigester,
  removeStewardships,
  replaceStewards,
  type DigesterPoint,
} from "./digesters.repository";
export {
  cancelIfPending,
  dropOffStatus,
  findDropOffDigester,
  findHouseholdDropOffs,
  impactTotals,
  insertDropOff,
  listOpenDropOffs,
  lockDropOff,
  moveDropOff,
  pendingDropOffs,
  pendingKgOnDate,
  pendingLoads,
  recentDeliveries,
  updateDropOffDecision,
  HOUSEHOLD_LIST_LIMIT,
  type DecisionUpdate,
  type DropOffRow,
  type ImpactTotals,
  type NewDropOff,
  type PendingDropOff,
  type PendingLoad,
  type RecentDelivery,
} from "./drop-offs.repository";
export { insertFeeding, listFeedings, type NewFeeding } from "./feedings.repository";
export { widenLedgerDay } from "./ledger.repository";
export {
  findLatestReadings,
  insertReading,
  insertSensorRows,
  listReadings,
  type LatestReadingRow,
  type NewReading,
  type SensorRows,
} from "./readings.repository";
