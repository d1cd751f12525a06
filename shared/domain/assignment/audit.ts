/** The audit of a plan against its input: overloads, missing and duplicate households. */
import type { AssignmentInput } from "./input";
import type { AssignmentResult } from "./result";

/**
 * Checks a result against its input, for tests and the server's sanity
 * check before applying: digesters whose load exceeds their weekly room,
 * households neither assigned nor reported unplaced, and households listed
 * twice. Loads are recomputed from the input's kg, not trusted.
 */
export function auditAssignment(
  input: AssignmentInput,
  result: AssignmentResult,
): { overloadedDigesterIds: string[]; missingHouseholdIds: string[]; duplicateHouseholdIds: string[] } {
  const kgById = new Map(input.households.map((h) => [h.id, h.weeklyKg]));
  const load = new Map<string, number>();
  const seen = new Map<string, number>();
  for (const a of result.assignments) {
    load.set(a.digesterId, (load.get(a.digesterId) ?? 0) + (kgById.get(a.householdId) ?? 0));
    seen.set(a.householdId, (seen.get(a.householdId) ?? 0) + 1);
  }
  for (const u of result.unplaced) seen.set(u.householdId, (seen.get(u.householdId) ?? 0) + 1);
  const overloaded = input.digesters
    .filter((d, j, all) => all.findIndex((x) => x.id === d.id) === j)
    .filter(
      (d) =>
        (load.get(d.id) ?? 0) >
        (d.available && Number.isFinite(d.weeklyRoomKg) ? Math.max(0, d.weeklyRoomKg) : 0) + 1e-6,
    )
    .map((d) => d.id);
  const ids = [...new Set(input.households.map((h) => h.id))];
  return {
    overloadedDigesterIds: overloaded,
    missingHouseholdIds: ids.filter((id) => !seen.has(id)),
    duplicateHouseholdIds: [...seen].filter(([, c]) => c > 1).map(([id]) => id),
  };
}
