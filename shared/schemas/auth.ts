/**
 * Sign-in, session, password and account contracts: one zod schema per request and response,
 * used by the client forms, the server's `handle()` validation and the API client.
 * Request schemas are `.strict()`: an unknown key is a 400 naming it, so nobody can slip
 * `roles` or `status` into a body that does not ask for them.
 */
import { z } from "zod";
import { oneLineText } from "./common";

export const ROLES = ["resident", "steward", "coordinator", "gardener"] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

/** Password length limits (OWASP ASVS 5.0 V6.2: at least 8, allow at least 64; we allow 128). */
export const PASSWORD_MIN_LENGTH = 8;
export const PASSWORD_MAX_LENGTH = 128;

/** A new password: length only, no composition rules (ASVS V6.2); the server also refuses common ones. */
export const NewPasswordSchema = z
  .string({ error: "Enter a password." })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`);

/** A password typed to prove who you are: never trimmed, bounded so nobody sends megabytes to the hasher. */
export const CurrentPasswordSchema = z
  .string({ error: "Enter your password." })
  .min(1, "Enter your password.")
  .max(PASSWORD_MAX_LENGTH, `Passwords here are at most ${PASSWORD_MAX_LENGTH} characters.`);

export const EmailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .min(1, "Enter an e-mail address.")
  .max(254, "An e-mail address has at most 254 characters.")
  .pipe(z.email("Enter an e-mail address like name@example.org."));

export const PersonNameSchema = oneLineText("Enter a name.")
  .trim()
  .min(1, "Enter a name.")
  .max(120, "Use at most 120 characters.");

/** The signed-in person as the client sees themselves (login, /me, account changes). */
export const SessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  roles: z.array(RoleSchema),
  /** Ids of the digesters this person looks after as steward. */
  stewardOf: z.array(z.number().int()),
  householdId: z.number().int().nullable(),
});
export type SessionUser = z.infer<typeof SessionUserSchema>;

export const LoginRequestSchema = z
  .object({
    email: EmailSchema,
    password: CurrentPasswordSchema,
  })
  .strict();
export type LoginRequest = z.infer<typeof LoginRequestSchema>;

export const CsrfTokenSchema = z.object({ token: z.string() });

/** How long the current session has left; the client warns two minutes before the end. */
export const SessionInfoSchema = z.object({
  /** When the session ends if nothing else happens (ISO 8601). */
  expiresAt: z.string(),
  expiresInSeconds: z.number().int(),
  /** The hard end eight hours after sign-in, which "stay signed in" cannot move (ISO 8601). */
  absoluteExpiresAt: z.string(),
  idleTimeoutSeconds: z.number().int(),
});
export type SessionInfo = z.infer<typeof SessionInfoSchema>;

export const PasswordResetRequestSchema = z.object({ email: EmailSchema }).strict();
export type PasswordResetRequest = z.infer<typeof PasswordResetRequestSchema>;

export const PasswordResetCompleteSchema = z.object({ password: NewPasswordSchema }).strict();
export type PasswordResetComplete = z.infer<typeof PasswordResetCompleteSchema>;

/** One-time tokens are 32 random bytes in base64url (43 characters). */
export const TokenParamsSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, "This link is not complete; copy the whole link from the e-mail."),
});

export const InvitationInfoSchema = z.object({
  email: z.string(),
  name: z.string(),
  roles: z.array(RoleSchema),
  expiresAt: z.string(),
});
export type InvitationInfo = z.infer<typeof InvitationInfoSchema>;

export const AcceptInvitationSchema = z
  .object({
    name: PersonNameSchema,
    password: NewPasswordSchema,
  })
  .strict();
export type AcceptInvitation = z.infer<typeof AcceptInvitationSchema>;

export const UpdateAccountSchema = z.object({ name: PersonNameSchema }).strict();
export type UpdateAccount = z.infer<typeof UpdateAccountSchema>;

export const ChangePasswordSchema = z
  .object({
    currentPassword: CurrentPasswordSchema,
    newPassword: NewPasswordSchema,
  })
  .strict();
export type ChangePassword = z.infer<typeof ChangePasswordSchema>;

export const ChangeEmailSchema = z
  .object({
    password: CurrentPasswordSchema,
    newEmail: EmailSchema,
  })
  .strict();
export type ChangeEmail = z.infer<typeof ChangeEmailSchema>;
