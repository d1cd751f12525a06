/**
 * Coordinator contracts: assignment proposals (households → digesters), applying them,
 * pinning, and today's rebalancing of pending drop-offs. Requests are `.strict()`.
 * Responses are plain TypeScript types (the server builds them; the client trusts its own API).
 */
import { z } from "zod";

const id = z
  .number({ error: "Must be a whole number id." })
  .int("Must be a whole number id.")
  .positive("Must be a whole number id.")
  .max(2_147_483_647, "Must be a whole number id.");

export const PinInputSchema = z.object({ householdId: id, digesterId: id }).strict();

/** `POST /api/assignments/proposals`: nothing changes. */
export const ProposalRequestSchema = z
  .object({
    maxWalkM: z
      .number({ error: "Maximum walk must be a number of metres." })
      .positive("Maximum walk must be more than 0 m.")
      .max(50_000, "Maximum walk must be at most 50 000 m.")
      .nullable()
      .optional(),
    excludeDigesterIds: z.array(id).max(500, "At most 500 digesters.").optional(),
    pins: z.array(PinInputSchema).max(10_000, "Too many pins.").optional(),
    /** Households whose stored pin this proposal ignores (applying it then unpins them). */
    unpins: z.array(id).max(10_000, "Too many households.").optional(),
  })
  .strict();
export type ProposalRequest = z.infer<typeof ProposalRequestSchema>;

/** One change to apply: household → digester (null = no digester), and whether to pin it. */
export const AssignmentChangeSchema = z
  .object({ householdId: id, digesterId: id.nullable(), pinned: z.boolean().optional() })
  .strict();

/** `POST /api/assignments/apply`. */
export const ApplyRequestSchema = z
  .object({
    version: z.string({ error: "Send the proposal's version." }).min(1).max(128),
    changes: z.array(AssignmentChangeSchema).max(20_000, "Too many changes."),
    reason: z.string().trim().max(300, "Use at most 300 characters.").optional(),
  })
  .strict();
export type ApplyRequest = z.infer<typeof ApplyRequestSchema>;

/** `PUT /api/households/:id/pin`. */
export const PinRequestSchema = z.object({ pinned: z.boolean({ error: "Say pinned true or false." }), digesterId: id.optional() }).strict();
export const HouseholdIdParamsSchema = z.object({ id: z.coerce.number({ error: "must be a number" }).int().positive().max(2_147_483_647) }).strict();

export interface ProposalAssignment {
  householdId: number;
  householdName: string;
  lat: number;
  lng: number;
  fromDigesterId: number | null;
  toDigesterId: number;
  distanceM: number;
  weeklyKg: number;
  pinned: boolean;
  changed: boolean;
}

export interface ProposalDigester {
  id: number;
  name: string;
  lat: number;
  lng: number;
  status: "active" | "resting" | "offline";
  excluded: boolean;
  available: boolean;
  loadKg: number;
  roomKg: number;
  utilisation: number | null;
  householdCount: number;
}

export interface ProposalUnplaced {
  householdId: number;
  householdName: string;
  weeklyKg: number;
  reason: string;
  message: string;
  suggestion: string;
}

export interface Proposal {
  version: string;
  assignments: ProposalAssignment[];
  digesters: ProposalDigester[];
  unplaced: ProposalUnplaced[];
  messages: string[];
  totalDistanceM: number;
  baselineDistanceM: number;
  currentDistanceM: number;
  changedCount: number;
  method: string;
  solverStatus: string;
  provenOptimal: boolean;
  gapToLpBound: number | null;
  solveMs: number;
  weeklyRoomMethod: string;
}

export interface ApplyResult {
  applied: number;
  emailsQueued: number;
  version: string;
}

/** `POST /api/rebalancing/moves`. */
export const RebalanceMovesSchema = z
  .object({
    moves: z
      .array(z.object({ dropOffId: id, digesterId: id }).strict())
      .min(1, "Choose at least one drop-off to move.")
      .max(500, "At most 500 moves at once."),
  })
  .strict();

export interface RebalanceSuggestion {
  digesterId: number;
  name: string;
  distanceM: number;
  roomKg: number;
}

export interface RebalanceItem {
  dropOffId: number;
  forDate: string;
  householdId: number;
  householdName: string;
  freshKg: number;
  digesterId: number;
  digesterName: string;
  why: string;
  suggestions: RebalanceSuggestion[];
}

export interface RebalanceView {
  items: RebalanceItem[];
  digesters: { id: number; name: string; status: string; roomKg: number; pendingKg: number; problem: string | null }[];
}
