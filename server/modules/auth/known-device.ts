/**
 * Known devices: a signed cookie given to a browser when someone signs in (or sets a password
 * from a link) there, naming the account by a fingerprint of its e-mail. Sign-in throttling
 * counts a known device's failures apart from everyone else's, so a stranger guessing an
 * account's password from many addresses locks out new browsers, never the owner's own
 * (OWASP "Slow Down Online Guessing Attacks with Device Cookies"). Nothing is stored on the
 * server; the HMAC key is derived from SESSION_SECRET.
 */
import { createHmac, randomBytes, timingSafeEqual } from "node:crypto";
import type { CookieOptions, Request, Response } from "express";
import { env } from "../../config/env";
import { fingerprint } from "../../lib/tokens";

/** How long a browser stays known after its last sign-in there [judgement: half a year]. */
export const KNOWN_DEVICE_MAX_AGE_MS = 182 * 24 * 60 * 60_000;

/** Cookie name and flags: HttpOnly, SameSite=Lax, Path=/, and `__Host-` with Secure in production. */
export function knownDeviceCookieSettings(): { name: string; cookie: CookieOptions } {
  const production = env().NODE_ENV === "production";
  return {
    name: production ? "__Host-hearthloop.device" : "hearthloop.device",
    cookie: { httpOnly: true, sameSite: "lax", secure: production, path: "/" },
  };
}

let key: Buffer | undefined;
function mac(payload: string): Buffer {
  key ??= createHmac("sha256", env().SESSION_SECRET).update("hearthloop known device").digest();
  return createHmac("sha256", key).update(payload).digest();
}

/** The e-mail's fingerprint as sign-in throttling keys it (trimmed, lower case). */
export function accountFingerprint(email: string): string {
  return fingerprint(email.trim().toLowerCase().slice(0, 254));
}

/** Sets (or renews) the known-device cookie of this browser for the account with this e-mail. */
export function rememberDevice(res: Response, email: string, now = Date.now()): void {
  const payload = `${accountFingerprint(email)}.${now.toString(36)}.${randomBytes(16).toString("base64url")}`;
  const value = `${payload}.${mac(payload).toString("base64url")}`;
  const { name, cookie } = knownDeviceCookieSettings();
  res.cookie(name, value, { ...cookie, maxAge: KNOWN_DEVICE_MAX_AGE_MS });
}

/**
 * The id of this browser's known-device cookie when it is genuine, not too old and made for
 * the account `fingerprintOfEmail`; otherwise undefined. Needs `req.cookies` (cookie-parser).
 */
export function knownDeviceId(req: Request, fingerprintOfEmail: string, now = Date.now()): string | undefined {
  const value = (req.cookies as Record<string, unknown> | undefined)?.[knownDeviceCookieSettings().name];
  if (typeof value !== "string" || value.length > 200) return undefined;
  const parts = value.split(".");
  if (parts.length !== 4) return undefined;
  const [account, issued, nonce, signature] = parts as [string, string, string, string];
  const expected = mac(`${account}.${issued}.${nonce}`);
  const given = Buffer.from(signature, "base64url");
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return undefined;
  const issuedMs = parseInt(issued, 36);
  if (!Number.isFinite(issuedMs) || issuedMs > now + 60_000 || now - issuedMs > KNOWN_DEVICE_MAX_AGE_MS)
    return undefined;
  return account === fingerprintOfEmail ? fingerprint(nonce) : undefined;
}
