import argon2 from "argon2";
import { badRequest } from "./app-error";
import { isCommonPassword } from "./common-passwords";

// OWASP Password Storage Cheat Sheet minimum for argon2id: m = 19 MiB, t = 2, p = 1.
const options = { type: argon2.argon2id, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, options);
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

let dummyHash: Promise<string> | undefined;
/** A hash to verify against when the account does not exist, so both answers take similar time. */
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword("not-a-real-password-for-timing");
  return dummyHash;
}

/** Refuses passwords on the common-password list with a field error (length is the schema's job). */
export function assertAcceptablePassword(password: string, field: string): void {
  if (isCommonPassword(password)) {
    throw badRequest("Please choose a less common password.", {
      [field]: "This password is on the list of most common passwords, which attackers try first. Choose another.",
    });
  }
}
