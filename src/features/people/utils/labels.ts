import type { Role } from "@shared/schemas/auth";
import type { PersonStatus } from "@shared/schemas/people";

export const roleLabels: Record<Role, string> = {
  resident: "Resident",
  steward: "Steward",
  coordinator: "Coordinator",
  gardener: "Gardener",
};

export const roleDescriptions: Record<Role, string> = {
  resident: "Brings or asks to have scraps collected for their household.",
  steward: "Looks after one or more digesters: feeding, readings, turning scraps away.",
  coordinator: "Runs the network: assignments, rounds, people and reports.",
  gardener: "Claims liquid fertiliser for their beds.",
};

export const statusLabels: Record<PersonStatus, string> = {
  active: "Active",
  invited: "Invited",
  disabled: "Disabled",
};

export const statusTone = {
  active: "success",
  invited: "info",
  disabled: "danger",
} as const satisfies Record<PersonStatus, "success" | "info" | "danger">;
