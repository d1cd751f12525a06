import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import { requireRole } from "../../middleware/require-role";
import {
  CollectionRequestsQuerySchema,
  CreateCollectionRequestSchema,
  IdParamsSchema,
} from "../../../shared/schemas/collections";
import * as service from "./collections.service";

/** Collection requests: residents for their own household; coordinators see all. */
export function collectionsRouter() {
  const router = Router();
  router.post(
    "/collection-requests",
    requireRole("resident"),
    handle({ body: CreateCollectionRequestSchema }, async ({ body, caller }) => ({
      status: 201,
      body: await service.createRequest(caller!, body),
    })),
  );
  router.get(
    "/collection-requests",
    requireAuth,
    handle({ query: CollectionRequestsQuerySchema }, async ({ query, caller }) => ({
      body: await service.listRequests(caller!, query),
    })),
  );
  router.post(
    "/collection-requests/:id/cancel",
    requireRole("resident", "coordinator"),
    handle({ params: IdParamsSchema }, async ({ params, caller }) => ({
      body: await service.cancelRequest(caller!, params.id),
    })),
  );
  return router;
}
