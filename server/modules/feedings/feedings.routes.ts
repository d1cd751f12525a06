import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole, requireStewardOf } from "../../middleware/require-role";
import { csvDownload } from "../../lib/csv";
import { DigesterIdParamsSchema } from "../../../shared/schemas/people";
import { CreateFeedingSchema, FeedingRangeQuerySchema } from "../../../shared/schemas/feedings";
import * as service from "./feedings.service";
import { feedingsCsv } from "./feedings.export";

/** Feedings: the digester's stewards (and coordinators) record and read them. */
export function feedingsRouter() {
  const router = Router();
  const stewards = requireRole("steward", "coordinator");

  router.post(
    "/digesters/:id/feedings",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, body: CreateFeedingSchema }, async ({ params, body, caller }) => ({
      status: 201,
      body: await service.createFeeding(caller!, params.id, body),
    })),
  );

  router.get(
    "/digesters/:id/feedings",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, query: FeedingRangeQuerySchema }, async ({ params, query, caller }) => ({
      body: await service.listFeedings(caller!, params.id, query),
    })),
  );

  router.get(
    "/digesters/:id/feedings.csv",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, query: FeedingRangeQuerySchema }, async ({ params, query, caller }) => {
      const rows = await service.listFeedings(caller!, params.id, query);
      return csvDownload(`digester-${params.id}-feedings.csv`, feedingsCsv(rows));
    }),
  );

  return router;
}
