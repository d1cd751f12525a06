import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import { requireRole } from "../../middleware/require-role";
import { AddMemberSchema, RegisterHouseholdSchema, UpdateHouseholdSchema } from "../../../shared/schemas/households";
import * as service from "./households.service";

/**
 * Households: residents register and change their own and invite members; everyone signed in
 * sees their own; coordinators see all (GET /households). The household always comes from the
 * session, so no route takes a household id from a resident.
 */
export function householdsRouter() {
  const router = Router();
  const resident = requireRole("resident");

  router.get(
    "/households",
    requireAuth,
    handle({}, async ({ caller }) => ({ body: await service.listHouseholds(caller!) })),
  );

  router.post(
    "/households",
    resident,
    handle({ body: RegisterHouseholdSchema }, async ({ body, caller }) => ({
      status: 201,
      body: await service.register(caller!, body),
    })),
  );

  router.get(
    "/households/mine",
    requireAuth,
    handle({}, async ({ caller }) => ({ body: await service.getMine(caller!) })),
  );

  router.patch(
    "/households/mine",
    resident,
    handle({ body: UpdateHouseholdSchema }, async ({ body, caller }) => ({
      body: await service.updateMine(caller!, body),
    })),
  );

  router.post(
    "/households/mine/members",
    resident,
    handle({ body: AddMemberSchema }, async ({ body, caller }) => ({
      status: 201,
      body: await service.addMember(caller!, body),
    })),
  );

  router.get(
    "/households/mine/impact",
    requireAuth,
    handle({}, async ({ caller }) => ({ body: await service.householdImpact(caller!) })),
  );

  return router;
}
