import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import { requireRole } from "../../middleware/require-role";
import {
  IdParamsSchema,
  PlanRoundsSchema,
  RoundsQuerySchema,
  StopParamsSchema,
} from "../../../shared/schemas/collections";
import * as service from "./rounds.service";

/** Collection rounds: coordinators plan and see all; volunteers see and work their own. */
export function roundsRouter() {
  const router = Router();
  router.post(
    "/collection-rounds/plan",
    requireRole("coordinator"),
    handle({ body: PlanRoundsSchema }, async ({ body }) => ({ body: await service.planRounds(body.forDate) })),
  );
  router.get(
    "/collection-rounds",
    requireAuth,
    handle({ query: RoundsQuerySchema }, async ({ query, caller }) => ({
      body: await service.listRounds(caller!, query.date),
    })),
  );
  router.get(
    "/collection-rounds/:id/geojson",
    requireAuth,
    handle({ params: IdParamsSchema }, async ({ params, caller }) => ({
      raw: await service.roundGeoJson(caller!, params.id),
      type: "application/geo+json",
      headers: { "Content-Disposition": `attachment; filename="round-${params.id}.geojson"` },
    })),
  );
  router.get(
    "/collection-rounds/:id",
    requireAuth,
    handle({ params: IdParamsSchema }, async ({ params, caller }) => ({
      body: await service.roundSheet(caller!, params.id),
    })),
  );
  router.post(
    "/collection-rounds/:id/stops/:requestId/collected",
    requireAuth,
    handle({ params: StopParamsSchema }, async ({ params, caller }) => ({
      body: await service.markCollected(caller!, params.id, params.requestId),
    })),
  );
  return router;
}
