import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole } from "../../middleware/require-role";
import {
  ApplyRequestSchema,
  HouseholdIdParamsSchema,
  PinRequestSchema,
  ProposalRequestSchema,
} from "../../../shared/schemas/assignments";
import * as service from "./assignments.service";

/** The coordinator's assignment board (coordinators only). */
export function assignmentsRouter() {
  const router = Router();
  const coordinator = requireRole("coordinator");

  router.post(
    "/assignments/proposals",
    coordinator,
    handle({ body: ProposalRequestSchema }, async ({ body }) => ({ body: await service.propose(body) })),
  );

  router.post(
    "/assignments/apply",
    coordinator,
    handle({ body: ApplyRequestSchema }, async ({ body }) => ({ body: await service.apply(body) })),
  );

  router.put(
    "/households/:id/pin",
    coordinator,
    handle({ params: HouseholdIdParamsSchema, body: PinRequestSchema }, async ({ params, body }) => ({
      body: await service.setPin(params.id, body),
    })),
  );

  return router;
}
