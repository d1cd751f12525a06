import { createHash, randomBytes } from "node:crypto";

/** Bytes of randomness in a one-time link token (256 bits, OWASP Forgot Password Cheat Sheet). */
const TOKEN_BYTES = 32;

/**
 * A new one-time token for an e-mailed link, and the SHA-256 hash stored in its place: a
 * database leak then reveals no usable link. A fast hash is enough because the token has
 * 256 bits of entropy (nothing to guess, unlike a password).
 */
export function newOneTimeToken(): { token: string; hash: string } {
  const token = randomBytes(TOKEN_BYTES).toString("base64url");
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/** A short, non-reversible label for a secret-ish value (e.g. rate-limit keys holding an e-mail). */
export function fingerprint(value: string): string {
  return createHash("sha256").update(value, "utf8").digest("base64url").slice(0, 22);
}
