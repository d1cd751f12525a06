/**
 * Drop-off contracts: a resident logs buckets (count × litres) or a weight for a digester, and
 * the answer says at once whether today's feed budget there welcomes it. Request schemas are
 * `.strict()`: the household is taken from the session, so `householdId` in a body is a 400.
 */
import { z } from "zod";
import { DROP_OFF_MIXES } from "../domain/drop-offs";
import { IsoDateSchema, noteText } from "./common";

export { IsoDateSchema };

export const DropOffMixSchema = z.enum(DROP_OFF_MIXES, {
  error: `Choose what is in it: one of ${DROP_OFF_MIXES.join(", ")}.`,
});
export type DropOffMixChoice = z.infer<typeof DropOffMixSchema>;

export const DROP_OFF_STATUSES = ["pending", "accepted", "fed", "turned_away", "cancelled"] as const;
export const DropOffStatusSchema = z.enum(DROP_OFF_STATUSES);
export type DropOffStatus = z.infer<typeof DropOffStatusSchema>;

export const TURNED_AWAY_REASONS = ["contamination", "too_much_citrus", "over_budget", "other"] as const;
export const TurnedAwayReasonSchema = z.enum(TURNED_AWAY_REASONS);
export type TurnedAwayReason = z.infer<typeof TurnedAwayReasonSchema>;

/** Plain words for each status, for tables and screen readers. */
export const DROP_OFF_STATUS_LABELS: Readonly<Record<DropOffStatus, string>> = {
  pending: "Waiting for the steward",
  accepted: "Accepted",
  fed: "Fed to the digester",
  turned_away: "Turned away",
  cancelled: "Cancelled",
};

export const TURNED_AWAY_REASON_LABELS: Readonly<Record<TurnedAwayReason, string>> = {
  contamination: "Something from the refuse list was inside",
  too_much_citrus: "Too much citrus peel",
  over_budget: "The digester had no room that day",
  other: "Another reason (ask your steward)",
};

/** Largest bucket count, bucket size and weight the database accepts (0001-core.ts checks). */
export const MAX_BUCKET_COUNT = 20;
export const MAX_BUCKET_LITRES = 60;
export const MAX_DROP_OFF_WEIGHT_KG = 200;
export const MAX_NOTE_LENGTH = 500;

/** Rounds to the stored precision first, so the computed mass and the stored value agree. */
const roundedTo = (places: number) => (v: number) => Math.round(v * 10 ** places) / 10 ** places;

const bucketCount = z
  .number({ error: `Number of buckets must be a whole number from 1 to ${MAX_BUCKET_COUNT}.` })
  .int({ error: `Number of buckets must be a whole number from 1 to ${MAX_BUCKET_COUNT}.` })
  .min(1, { error: `Number of buckets must be a whole number from 1 to ${MAX_BUCKET_COUNT}.` })
  .max(MAX_BUCKET_COUNT, { error: `Number of buckets must be a whole number from 1 to ${MAX_BUCKET_COUNT}.` });

const bucketLitres = z
  .number({ error: `Bucket size must be a number from 0.5 to ${MAX_BUCKET_LITRES} litres.` })
  .min(0.5, { error: `Bucket size must be a number from 0.5 to ${MAX_BUCKET_LITRES} litres.` })
  .max(MAX_BUCKET_LITRES, { error: `Bucket size must be a number from 0.5 to ${MAX_BUCKET_LITRES} litres.` })
  .transform(roundedTo(1));

const weightKg = z
  .number({ error: `Weight must be a number from 0.1 to ${MAX_DROP_OFF_WEIGHT_KG} kg.` })
  .min(0.1, { error: `Weight must be a number from 0.1 to ${MAX_DROP_OFF_WEIGHT_KG} kg.` })
  .max(MAX_DROP_OFF_WEIGHT_KG, { error: `Weight must be a number from 0.1 to ${MAX_DROP_OFF_WEIGHT_KG} kg.` })
  .transform(roundedTo(2));

const citrusPercent = z
  .number({ error: "Citrus share must be a number from 0 to 100 %." })
  .min(0, { error: "Citrus share must be a number from 0 to 100 %." })
  .max(100, { error: "Citrus share must be a number from 0 to 100 %." })
  .transform(roundedTo(2));

/**
 * `POST /api/drop-offs`. Buckets (count and litres) or a weight; with both, the weight wins and
 * the drop-off is marked "weighed". `forDate` is today (default) or tomorrow in the
 * neighbourhood's time zone. `noRefuseConfirmed` is what the form's refuse-list check sends.
 */
export const CreateDropOffSchema = z
  .object({
    digesterId: z
      .number({ error: "Choose a digester." })
      .int({ error: "Choose a digester." })
      .positive({ error: "Choose a digester." })
      .max(2_147_483_647, { error: "Choose a digester." }),
    bucketCount: bucketCount.optional(),
    bucketLitres: bucketLitres.optional(),
    weightKg: weightKg.optional(),
    mix: DropOffMixSchema.default("mixed"),
    citrusPercent: citrusPercent.default(0),
    note: noteText("The note must be text.")
      .trim()
      .max(MAX_NOTE_LENGTH, `Use at most ${MAX_NOTE_LENGTH} characters.`)
      .optional()
      .transform((v) => (v === "" ? undefined : v)),
    forDate: IsoDateSchema.optional(),
    noRefuseConfirmed: z
      .literal(true, { error: "Please check that nothing from the refuse list is in it." })
      .optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.weightKg !== undefined) return;
    if (v.bucketCount === undefined && v.bucketLitres === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["bucketCount"],
        message: "Give the number of buckets and their size, or a weight.",
      });
    } else if (v.bucketCount === undefined) {
      ctx.addIssue({ code: "custom", path: ["bucketCount"], message: "Give the number of buckets." });
    } else if (v.bucketLitres === undefined) {
      ctx.addIssue({ code: "custom", path: ["bucketLitres"], message: "Give the bucket size in litres." });
    }
  });
export type CreateDropOff = z.input<typeof CreateDropOffSchema>;
export type CreateDropOffParsed = z.output<typeof CreateDropOffSchema>;

/** `GET /api/drop-offs?mine=true`: only the caller's household's drop-offs are listed. */
export const DropOffListQuerySchema = z
  .object({
    mine: z.literal("true", { error: "Add mine=true: residents see their own household's drop-offs here." }),
  })
  .strict();

export const DropOffIdParamsSchema = z.object({
  id: z.coerce.number({ error: "must be a number" }).int().positive().max(2_147_483_647),
});

/** A drop-off as its household sees it, with what became of it. */
export const DropOffSchema = z.object({
  id: z.number().int(),
  householdId: z.number().int(),
  digesterId: z.number().int(),
  digesterName: z.string(),
  /** Name of the member who logged it (null if their account is gone). */
  loggedBy: z.string().nullable(),
  forDate: z.string(),
  bucketCount: z.number().int().nullable(),
  bucketLitres: z.number().nullable(),
  weightKg: z.number().nullable(),
  massSource: z.enum(["weighed", "estimated"]),
  freshKg: z.number(),
  kgVs: z.number(),
  mix: DropOffMixSchema,
  citrusPercent: z.number(),
  noRefuseConfirmed: z.boolean(),
  status: DropOffStatusSchema,
  turnedAwayReason: TurnedAwayReasonSchema.nullable(),
  note: z.string().nullable(),
  /** Day it went into the digester (status fed). */
  fedOn: z.string().nullable(),
  createdAt: z.string(),
});
export type DropOff = z.infer<typeof DropOffSchema>;
export const DropOffListSchema = z.array(DropOffSchema);

/** Where else the scraps are welcome when the chosen digester has no room. */
export const WelcomeSuggestionSchema = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("digester"),
    digesterId: z.number().int(),
    digesterName: z.string(),
    /** Straight-line distance from the household, metres; null when the household has no location. */
    distanceM: z.number().nullable(),
    roomKgScraps: z.number(),
  }),
  z.object({
    kind: z.literal("tomorrow"),
    forDate: z.string(),
    digesterId: z.number().int(),
    digesterName: z.string(),
  }),
]);
export type WelcomeSuggestion = z.infer<typeof WelcomeSuggestionSchema>;

/**
 * Whether the digester's feed budget welcomes the drop-off: room = today's budget (what was fed
 * and accepted already taken off) minus the drop-offs already waiting, compared in kg VS.
 * `basis: "tomorrow"` means the drop-off is for tomorrow, whose budget is set by tomorrow's readings.
 */
export const WelcomeSchema = z.object({
  welcomed: z.boolean(),
  basis: z.enum(["today", "tomorrow"]),
  message: z.string(),
  /** Room before this drop-off, kg of scraps of the default mix (rounded to 0.1); null for tomorrow (not known yet). */
  roomKgScraps: z.number().nullable(),
  suggestion: WelcomeSuggestionSchema.optional(),
});
export type Welcome = z.infer<typeof WelcomeSchema>;

/** 201 answer of `POST /api/drop-offs` (and, byte for byte, of a retry with the same Idempotency-Key). */
export const CreatedDropOffSchema = DropOffSchema.extend({ welcome: WelcomeSchema });
export type CreatedDropOff = z.infer<typeof CreatedDropOffSchema>;

/** The `Idempotency-Key` header: 1–200 visible ASCII characters (a UUID is typical). */
export const IdempotencyKeySchema = z
  .string()
  .min(1, "The Idempotency-Key header must have 1 to 200 visible characters.")
  .max(200, "The Idempotency-Key header must have 1 to 200 visible characters.")
  .regex(/^[\x21-\x7e]+$/, "The Idempotency-Key header must have 1 to 200 visible characters.");
