/**
 * People management contracts (coordinators): the people table, invitations, role and status
 * changes, steward assignment, and the e-mail outbox view. Request schemas are `.strict()`.
 */
import { z } from "zod";
import { EmailSchema, PersonNameSchema, RoleSchema } from "./auth";
import { oneLineText } from "./common";

export const PersonStatusSchema = z.enum(["invited", "active", "disabled"]);
export type PersonStatus = z.infer<typeof PersonStatusSchema>;

const RolesSchema = z
  .array(RoleSchema)
  .max(4)
  .refine((roles) => new Set(roles).size === roles.length, "Name each role once.");

/** One row of the coordinators' people table. */
export const PersonRowSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  email: z.string(),
  roles: z.array(RoleSchema),
  status: PersonStatusSchema,
  householdId: z.number().int().nullable(),
  householdName: z.string().nullable(),
  stewardOf: z.array(z.number().int()),
  isVolunteer: z.boolean(),
  bikeLoadKg: z.number().nullable(),
  createdAt: z.string(),
  /** For invited people: when their invitation link stops working (ISO 8601). */
  invitationExpiresAt: z.string().nullable(),
});
export type PersonRow = z.infer<typeof PersonRowSchema>;
export const PeopleListSchema = z.array(PersonRowSchema);

export const PersonIdParamsSchema = z.object({
  id: z.coerce.number({ error: "must be a number" }).int().positive().max(2_147_483_647),
});

export const InvitePersonSchema = z
  .object({
    email: EmailSchema,
    name: oneLineText("The name must be text.").trim().max(120, "Use at most 120 characters.").default(""),
    roles: RolesSchema.min(1, "Give the person at least one role."),
    householdId: z.number().int().positive().max(2_147_483_647).nullable().optional(),
  })
  .strict();
export type InvitePerson = z.input<typeof InvitePersonSchema>;

export const InvitationCreatedSchema = z.object({
  personId: z.number().int(),
  email: z.string(),
  expiresAt: z.string(),
});
export type InvitationCreated = z.infer<typeof InvitationCreatedSchema>;

/** What a coordinator may change on a person; status "invited" is set only by inviting. */
export const UpdatePersonSchema = z
  .object({
    name: PersonNameSchema.optional(),
    roles: RolesSchema.optional(),
    status: z.enum(["active", "disabled"]).optional(),
    householdId: z.number().int().positive().max(2_147_483_647).nullable().optional(),
    isVolunteer: z.boolean().optional(),
    bikeLoadKg: z.number().positive().max(500, "At most 500 kg.").nullable().optional(),
    startLat: z.number().min(-90).max(90).nullable().optional(),
    startLng: z.number().min(-180).max(180).nullable().optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Change at least one thing.")
  .refine((v) => (v.startLat === undefined) === (v.startLng === undefined), {
    message: "Give both latitude and longitude of the start point, or neither.",
    path: ["startLat"],
  });
export type UpdatePerson = z.infer<typeof UpdatePersonSchema>;

export const DigesterIdParamsSchema = PersonIdParamsSchema;

export const SetStewardsSchema = z
  .object({
    personIds: z
      .array(z.number().int().positive().max(2_147_483_647))
      .max(50)
      .refine((ids) => new Set(ids).size === ids.length, "Name each person once."),
  })
  .strict();
export type SetStewards = z.infer<typeof SetStewardsSchema>;

export const DigesterStewardsSchema = z.object({
  digesterId: z.number().int(),
  stewards: z.array(z.object({ id: z.number().int(), name: z.string() })),
});
export type DigesterStewards = z.infer<typeof DigesterStewardsSchema>;

/** An e-mail still waiting or given up on, for coordinators to see what did not arrive. */
export const OutboxEmailRowSchema = z.object({
  id: z.number().int(),
  toAddress: z.string(),
  subject: z.string(),
  status: z.enum(["pending", "sent", "failed"]),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  nextAttemptAt: z.string(),
});
export type OutboxEmailRow = z.infer<typeof OutboxEmailRowSchema>;
export const OutboxEmailListSchema = z.array(OutboxEmailRowSchema);
