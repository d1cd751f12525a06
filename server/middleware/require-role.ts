/**
 * Authorisation: role guards for routes, and object-level checks for services. Every refusal is
 * a 403 AppError, which the security log writes down (server/lib/security-log.ts).
 */
import type { RequestHandler } from "express";
import type { Role } from "../../shared/schemas/auth";
import { forbidden } from "../lib/app-error";
import type { Caller } from "./handle";
import { unauthenticated } from "./require-auth";

export function hasRole(caller: Caller | undefined, ...roles: Role[]): boolean {
  return !!caller && roles.some((role) => caller.roles.includes(role));
}

/** 401 when signed out; 403 unless the person holds at least one of `roles`. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    const caller = req.user as Caller | undefined;
    if (!caller) return next(unauthenticated());
    if (!hasRole(caller, ...roles)) return next(forbidden(`This needs the ${roles.join(" or ")} role.`));
    next();
  };
}

/** True when the caller looks after this digester (coordinators count unless `coordinatorToo` is false). */
export function canManageDigester(caller: Caller | undefined, digesterId: number, coordinatorToo = true): boolean {
  if (!caller) return false;
  if (coordinatorToo && caller.roles.includes("coordinator")) return true;
  return caller.roles.includes("steward") && caller.stewardOf.includes(digesterId);
}

/** Object-level check for services: throws 403 unless the caller stewards `digesterId` (or coordinates). */
export function assertStewardOf(
  caller: Caller | undefined,
  digesterId: number,
  options: { coordinatorToo?: boolean } = {},
): void {
  if (!caller) throw unauthenticated();
  if (!canManageDigester(caller, digesterId, options.coordinatorToo ?? true)) {
    throw forbidden("You can change only the digesters you look after.");
  }
}

/** Object-level check for services: throws 403 unless `householdId` is the caller's own (or they coordinate). */
export function assertOwnHousehold(
  caller: Caller | undefined,
  householdId: number,
  options: { coordinatorToo?: boolean } = {},
): void {
  if (!caller) throw unauthenticated();
  if ((options.coordinatorToo ?? true) && caller.roles.includes("coordinator")) return;
  if (caller.householdId === null || caller.householdId !== householdId) {
    throw forbidden("You can see and change only your own household's records.");
  }
}

/** Object-level check for services: throws 403 unless the record belongs to the caller (or they coordinate). */
export function assertOwnRecord(
  caller: Caller | undefined,
  ownerPersonId: number | null,
  options: { coordinatorToo?: boolean } = {},
): void {
  if (!caller) throw unauthenticated();
  if ((options.coordinatorToo ?? true) && caller.roles.includes("coordinator")) return;
  if (ownerPersonId !== caller.id) throw forbidden("You can see and change only your own records.");
}

/** Route guard: the `:param` (default `id`) must be a digester the caller looks after. */
export function requireStewardOf(param = "id", options: { coordinatorToo?: boolean } = {}): RequestHandler {
  return (req, _res, next) => {
    const caller = req.user as Caller | undefined;
    if (!caller) return next(unauthenticated());
    const raw = (req.params as Record<string, string | undefined>)[param];
    const id = Number(raw);
    // A malformed id is left for the route's zod schema to answer with 400.
    if (!Number.isInteger(id)) return next();
    try {
      assertStewardOf(caller, id, options);
      next();
    } catch (err) {
      next(err);
    }
  };
}
