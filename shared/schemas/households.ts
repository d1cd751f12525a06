/**
 * Household contracts: registering one's own household, changing it, adding members, what a
 * resident sees of it, the coordinators' list, the street list for keyboard users and the
 * household's impact. Request schemas are `.strict()`: an unknown key (say `assignedDigesterId`,
 * which only coordinators set) is a 400 naming it.
 */
import { z } from "zod";
import { EmailSchema } from "./auth";
import { oneLineText } from "./common";

const latitude = z
  .number({ error: "Latitude must be a number from -90 to 90 degrees." })
  .min(-90, { error: "Latitude must be a number from -90 to 90 degrees." })
  .max(90, { error: "Latitude must be a number from -90 to 90 degrees." });
const longitude = z
  .number({ error: "Longitude must be a number from -180 to 180 degrees." })
  .min(-180, { error: "Longitude must be a number from -180 to 180 degrees." })
  .max(180, { error: "Longitude must be a number from -180 to 180 degrees." });

/** A point in WGS 84 degrees, as sent by a form (strict: only lat and lng). */
export const LocationInputSchema = z.object({ lat: latitude, lng: longitude }).strict();
export type LocationInput = z.infer<typeof LocationInputSchema>;

export const HouseholdNameSchema = oneLineText("Enter a name for your household.")
  .trim()
  .min(1, "Enter a name for your household, such as your family name.")
  .max(120, "Use at most 120 characters.");

export const AddressTextSchema = oneLineText("The address must be text.")
  .trim()
  .max(200, "Use at most 200 characters.");

export const DeclaredWeeklyKgSchema = z
  .number({ error: "Scraps per week must be a number from 0 to 500 kg." })
  .min(0, { error: "Scraps per week must be a number from 0 to 500 kg." })
  .max(500, { error: "Scraps per week must be a number from 0 to 500 kg." });

/** `POST /api/households`: register the caller's own household. */
export const RegisterHouseholdSchema = z
  .object({
    name: HouseholdNameSchema,
    addressText: AddressTextSchema.default(""),
    location: LocationInputSchema,
    declaredWeeklyKg: DeclaredWeeklyKgSchema.optional(),
  })
  .strict();
export type RegisterHousehold = z.input<typeof RegisterHouseholdSchema>;

/** `PATCH /api/households/mine`: what a member may change (the assigned digester is the coordinator's). */
export const UpdateHouseholdSchema = z
  .object({
    name: HouseholdNameSchema.optional(),
    addressText: AddressTextSchema.optional(),
    location: LocationInputSchema.optional(),
    declaredWeeklyKg: DeclaredWeeklyKgSchema.optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Change at least one thing.");
export type UpdateHousehold = z.infer<typeof UpdateHouseholdSchema>;

/** `POST /api/households/mine/members`: invite someone to join the household by e-mail. */
export const AddMemberSchema = z
  .object({
    email: EmailSchema,
    name: oneLineText("The name must be text.").trim().max(120, "Use at most 120 characters.").default(""),
  })
  .strict();
export type AddMember = z.input<typeof AddMemberSchema>;

export const MemberAddedSchema = z.object({
  personId: z.number().int(),
  email: z.string(),
  expiresAt: z.string(),
});
export type MemberAdded = z.infer<typeof MemberAddedSchema>;

export const LocationSchema = z.object({ lat: z.number(), lng: z.number() });

/** A member as the household sees them: name and status, never their e-mail (only the caller's own). */
export const HouseholdMemberSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  status: z.enum(["invited", "active", "disabled"]),
  isYou: z.boolean(),
});
export type HouseholdMember = z.infer<typeof HouseholdMemberSchema>;

/**
 * The digester the household takes its scraps to: the one a coordinator assigned, or until then
 * the nearest active digester as the crow flies (`source: "nearest"`).
 */
export const HouseholdDigesterSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  source: z.enum(["assigned", "nearest"]),
  /** Straight-line distance from the household, metres; null when the household has no location. */
  distanceM: z.number().nullable(),
});
export type HouseholdDigester = z.infer<typeof HouseholdDigesterSchema>;

export const HouseholdSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  addressText: z.string(),
  location: LocationSchema.nullable(),
  declaredWeeklyKg: z.number(),
  digester: HouseholdDigesterSchema.nullable(),
  members: z.array(HouseholdMemberSchema),
});
export type Household = z.infer<typeof HouseholdSchema>;

/** `GET /api/households/mine`: the caller's household, or null before they register one. */
export const MyHouseholdSchema = z.object({ household: HouseholdSchema.nullable() });
export type MyHousehold = z.infer<typeof MyHouseholdSchema>;

/** One row of `GET /api/households` (coordinators: all; everyone else: their own only). */
export const HouseholdRowSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  addressText: z.string(),
  location: LocationSchema.nullable(),
  declaredWeeklyKg: z.number(),
  assignedDigesterId: z.number().int().nullable(),
  assignedDigesterName: z.string().nullable(),
  memberCount: z.number().int(),
  isMine: z.boolean(),
});
export type HouseholdRow = z.infer<typeof HouseholdRowSchema>;
export const HouseholdListSchema = z.array(HouseholdRowSchema);

/** `GET /api/streets`: street names from the basemap with a point halfway along each. */
export const StreetSchema = z.object({ name: z.string(), location: LocationSchema });
export type Street = z.infer<typeof StreetSchema>;
export const StreetListSchema = z.array(StreetSchema);

/**
 * `GET /api/households/mine/impact`: what the household's fed scraps became. Gas figures are
 * estimates from the ultimate methane yield (see `method`), never measured values.
 */
export const HouseholdImpactSchema = z.object({
  dropOffCount: z.number().int(),
  counts: z.object({
    pending: z.number().int(),
    accepted: z.number().int(),
    fed: z.number().int(),
    turnedAway: z.number().int(),
    cancelled: z.number().int(),
  }),
  /** Fresh kg of scraps that went into a digester (status fed). */
  fedFreshKg: z.number(),
  fedKgVs: z.number(),
  methaneM3: z.number(),
  biogasM3: z.number(),
  cookingMinutes: z.number(),
  /** Dilution water the stewards recorded with these feedings, litres. */
  dilutionWaterLitres: z.number(),
  digestateLitres: z.number(),
  /** First and last day with a fed drop-off (ISO dates); null before the first. */
  firstFedOn: z.string().nullable(),
  lastFedOn: z.string().nullable(),
  method: z.object({
    b0M3PerKgVs: z.number(),
    methaneFraction: z.number(),
    burnerLitresPerHour: z.number(),
    digestateOutFraction: z.number(),
    sentence: z.string(),
  }),
});
export type HouseholdImpact = z.infer<typeof HouseholdImpactSchema>;
