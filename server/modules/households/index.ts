/**
 * Households: the module that owns `households`. Drop-offs, collections, people and the
 * assignment board call what is exported here, never households.repository.ts.
 */
export {
  assignmentRows,
  assignmentVersion,
  findHousehold,
  householdExists,
  lockHousehold,
  setAssignment,
  type AssignmentRow,
  type HouseholdRecord,
} from "./households.repository";
