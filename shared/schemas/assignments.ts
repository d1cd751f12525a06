/**
 * Coordinator contracts: assignment proposals (households → digesters), applying them,
 * pinning, and today's rebalancing of pending drop-offs. Requests are `.strict()`; responses
 * are plain `z.object`s (an added field does not break an older client) that the API client parses.
 */
import { z } from "zod";
import { oneLineText } from "./common";

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
    version: oneLineText("Send the proposal's version.").min(1).max(128),
    changes: z.array(AssignmentChangeSchema).max(20_000, "Too many changes."),
    reason: oneLineText("The reason must be text.").trim().max(300, "Use at most 300 characters.").optional(),
  })
  .strict();
export type ApplyRequest = z.infer<typeof ApplyRequestSchema>;

/** `PUT /api/households/:id/pin`. */
export const PinRequestSchema = z
  .object({ pinned: z.boolean({ error: "Say pinned true or false." }), digesterId: id.optional() })
  .strict();
export const HouseholdIdParamsSchema = z
  .object({ id: z.coerce.number({ error: "must be a number" }).int().positive().max(2_147_483_647) })
  .strict();

/** One household's place in a proposal; `distanceM` in metres, `weeklyKg` in fresh kg a week. */
export const ProposalAssignmentSchema = z.object({
  householdId: z.number(),
  householdName: z.string(),
  lat: z.number(),
  lng: z.number(),
  fromDigesterId: z.number().nullable(),
  toDigesterId: z.number(),
  distanceM: z.number(),
  weeklyKg: z.number(),
  pinned: z.boolean(),
  changed: z.boolean(),
});
export type ProposalAssignment = z.infer<typeof ProposalAssignmentSchema>;

/** A digester's load in a proposal; kg are fresh kg a week, `utilisation` load ÷ room (null without room). */
export const ProposalDigesterSchema = z.object({
  id: z.number(),
  name: z.string(),
  lat: z.number(),
  lng: z.number(),
  status: z.enum(["active", "resting", "offline"]),
  excluded: z.boolean(),
  available: z.boolean(),
  loadKg: z.number(),
  roomKg: z.number(),
  utilisation: z.number().nullable(),
  householdCount: z.number(),
});
export type ProposalDigester = z.infer<typeof ProposalDigesterSchema>;

/** Why a household could not be placed (the code of an unplaced household; see shared/domain/assignment). */
export const UnplacedReasonSchema = z.enum(["noLocation", "invalidAmount", "noDigesterWithinReach", "noRoom"]);

/** What an unplaced household can do instead: another day at a digester (metres from home), or compost at home. */
export const SuggestedActionSchema = z.discriminatedUnion("code", [
  z.object({ code: z.literal("anotherDay"), digesterId: z.number(), digesterName: z.string(), distanceM: z.number() }),
  z.object({ code: z.literal("compostAtHome") }),
]);
export type SuggestedAction = z.infer<typeof SuggestedActionSchema>;

/**
 * A household the proposal could not place: `reason` is the code and `suggestedAction` the
 * code of what it could do instead, with their parameters (`walkingLimitM` in metres, set for
 * `noDigesterWithinReach` when the walking limit is what kept it out); `message` and
 * `suggestion` are the coordinator's words for them (shared/words/assignment-board.ts).
 */
export const ProposalUnplacedSchema = z.object({
  householdId: z.number(),
  householdName: z.string(),
  weeklyKg: z.number(),
  reason: UnplacedReasonSchema,
  walkingLimitM: z.number().nullable(),
  suggestedAction: SuggestedActionSchema,
  message: z.string(),
  suggestion: z.string(),
});
export type ProposalUnplaced = z.infer<typeof ProposalUnplacedSchema>;

const named = { id: z.number(), name: z.string() };

/**
 * Something worth knowing about a proposal, as a code with its parameters: ids are the API's,
 * names resolved, distances metres, amounts kg fresh scraps a week, `gapToLpBound` a fraction.
 * The codes the solver gives (shared/domain/assignment/messages.ts) keep their meaning; the
 * others are the proposal's own (unknown ids in the request, summaries). `Proposal.messages[i]`
 * is the coordinator's words for `Proposal.notes[i]`.
 */
export const ProposalNoteSchema = z.discriminatedUnion("code", [
  z.object({ code: z.literal("excludedDigesterUnknown"), digesterId: z.number() }),
  z.object({ code: z.literal("pinHouseholdUnknown"), householdId: z.number() }),
  z.object({
    code: z.literal("pinsContradictory"),
    household: z.object(named),
    keptDigester: z.object(named),
    droppedDigester: z.object(named),
  }),
  z.object({
    code: z.literal("pinContradiction"),
    kind: z.enum(["unknownDigester", "digesterUnavailable", "pinsOverloadDigester"]),
    household: z.object(named),
    /** The pinned digester; `name` is null when it does not exist. */
    digester: z.object({ id: z.number(), name: z.string().nullable() }),
  }),
  z.object({ code: z.literal("walkingLimitInvalid"), walkingLimitM: z.number().nullable() }),
  z.object({ code: z.literal("duplicateDigester"), digester: z.object(named) }),
  z.object({ code: z.literal("duplicateHousehold"), household: z.object(named) }),
  z.object({ code: z.literal("digesterWithoutLocation"), digester: z.object(named) }),
  z.object({ code: z.literal("digesterRoomInvalid"), digester: z.object(named), weeklyRoomKg: z.number().nullable() }),
  z.object({
    code: z.literal("pinBeyondWalkingLimit"),
    household: z.object(named),
    digester: z.object(named),
    distanceM: z.number(),
    walkingLimitM: z.number(),
  }),
  z.object({ code: z.literal("solverGaveNoPlan"), solverStatus: z.string(), gapBounded: z.boolean() }),
  z.object({ code: z.literal("solverFailedOnPart"), error: z.string() }),
  z.object({ code: z.literal("timeLimitBeforeProof"), solverStatuses: z.array(z.string()) }),
  z.object({
    code: z.literal("approximatePlan"),
    householdsToPlace: z.number(),
    gapToLpBound: z.number().nullable(),
    candidatesPerHousehold: z.number(),
    pairsAddedByPricing: z.number(),
  }),
  z.object({ code: z.literal("householdsWithoutLocation"), households: z.array(z.object(named)) }),
  z.object({
    code: z.literal("walkingLimitUnreachable"),
    walkingLimitM: z.number(),
    householdCount: z.number(),
    /** The smallest limit that reaches every household left out, metres. */
    neededM: z.number(),
  }),
  z.object({ code: z.literal("noDigesterTakingScraps") }),
  z.object({ code: z.literal("digestersWithoutRoom"), digesters: z.array(z.object(named)) }),
]);
export type ProposalNote = z.infer<typeof ProposalNoteSchema>;

/** `POST /api/assignments/proposals`: distances in metres, `solveMs` in milliseconds. */
export const ProposalSchema = z.object({
  version: z.string(),
  assignments: z.array(ProposalAssignmentSchema),
  digesters: z.array(ProposalDigesterSchema),
  unplaced: z.array(ProposalUnplacedSchema),
  /** The coordinator's words for `notes`, one each, in the same order. */
  messages: z.array(z.string()),
  notes: z.array(ProposalNoteSchema),
  totalDistanceM: z.number(),
  baselineDistanceM: z.number(),
  currentDistanceM: z.number(),
  changedCount: z.number(),
  method: z.string(),
  solverStatus: z.string(),
  provenOptimal: z.boolean(),
  gapToLpBound: z.number().nullable(),
  solveMs: z.number(),
  weeklyRoomMethod: z.string(),
});
export type Proposal = z.infer<typeof ProposalSchema>;

/** `POST /api/assignments/apply`: how many changes were applied, e-mails queued, and the new version. */
export const ApplyResultSchema = z.object({
  applied: z.number(),
  emailsQueued: z.number(),
  version: z.string(),
});
export type ApplyResult = z.infer<typeof ApplyResultSchema>;

/** `POST /api/rebalancing/moves`. */
export const RebalanceMovesSchema = z
  .object({
    moves: z
      .array(z.object({ dropOffId: id, digesterId: id }).strict())
      .min(1, "Choose at least one drop-off to move.")
      .max(500, "At most 500 moves at once."),
  })
  .strict();

/** `POST /api/rebalancing/moves`: drop-offs moved and e-mails queued. */
export const RebalanceMovesResultSchema = z.object({ moved: z.number(), emailsQueued: z.number() });
export type RebalanceMovesResult = z.infer<typeof RebalanceMovesResultSchema>;

/** A digester with room to take a drop-off; `distanceM` in metres, `roomKg` in fresh kg that day. */
export const RebalanceSuggestionSchema = z.object({
  digesterId: z.number(),
  name: z.string(),
  distanceM: z.number(),
  roomKg: z.number(),
});
export type RebalanceSuggestion = z.infer<typeof RebalanceSuggestionSchema>;

/** A pending drop-off whose digester cannot take it, with where it could go instead. */
export const RebalanceItemSchema = z.object({
  dropOffId: z.number(),
  forDate: z.string(),
  householdId: z.number(),
  householdName: z.string(),
  freshKg: z.number(),
  digesterId: z.number(),
  digesterName: z.string(),
  why: z.string(),
  suggestions: z.array(RebalanceSuggestionSchema),
});
export type RebalanceItem = z.infer<typeof RebalanceItemSchema>;

/** A digester involved in rebalancing today: room and pending load in fresh kg, and its problem. */
export const RebalanceDigesterSchema = z.object({
  id: z.number(),
  name: z.string(),
  status: z.string(),
  roomKg: z.number(),
  pendingKg: z.number(),
  problem: z.string().nullable(),
});
export type RebalanceDigester = z.infer<typeof RebalanceDigesterSchema>;

/** `GET /api/rebalancing`. */
export const RebalanceViewSchema = z.object({
  items: z.array(RebalanceItemSchema),
  digesters: z.array(RebalanceDigesterSchema),
});
export type RebalanceView = z.infer<typeof RebalanceViewSchema>;
