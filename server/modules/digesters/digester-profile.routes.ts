import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole, requireStewardOf } from "../../middleware/require-role";
import {
  DigesterHistoryQuerySchema,
  SetDigesterStatusSchema,
  UpdateDigesterProfileSchema,
} from "../../../shared/schemas/digester";
import { DigesterIdParamsSchema } from "../../../shared/schemas/people";
import * as service from "./digester-profile.service";

/** The digester page's API: its stewards and coordinators read and change it. */
export function digesterProfileRouter() {
  const router = Router();
  const stewards = requireRole("steward", "coordinator");

  router.patch(
    "/digesters/:id",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, body: UpdateDigesterProfileSchema }, async ({ params, body, caller }) => ({
      body: await service.updateProfile(caller!, params.id, body),
    })),
  );

  router.put(
    "/digesters/:id/status",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, body: SetDigesterStatusSchema }, async ({ params, body, caller }) => ({
      body: await service.setStatus(caller!, params.id, body),
    })),
  );

  router.get(
    "/digesters/:id/history",
    stewards,
    requireStewardOf("id"),
    handle(
      { params: DigesterIdParamsSchema, query: DigesterHistoryQuerySchema },
      async ({ params, query, caller }) => ({
        body: await service.digesterHistory(caller!, params.id, query.days),
      }),
    ),
  );

  return router;
}
