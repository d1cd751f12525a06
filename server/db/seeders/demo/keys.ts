/** The fixed keys that link the demo's records to the demo sign-ins and the four digesters. */

export const PERSON_KEYS = {
  resident: "person-resident",
  steward: "person-steward",
  steward2: "person-steward2",
  coordinator: "person-coordinator",
  gardener: "person-gardener",
} as const;

export const DIGESTER_KEYS = {
  school: "digester-school",
  orchard: "digester-orchard",
  meadow: "digester-meadow",
  green: "digester-green",
} as const;
