import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole, requireStewardOf } from "../../middleware/require-role";
import { DigesterIdParamsSchema } from "../../../shared/schemas/people";
import { DropOffIdParamsSchema } from "../../../shared/schemas/drop-offs";
import { AcceptDropOffSchema, FeedDropOffSchema, TurnAwayDropOffSchema } from "../../../shared/schemas/steward";
import * as service from "./steward.service";

/** The steward's day: stewards see and decide for their own digesters, coordinators for all (checked per drop-off in the service). */
export function stewardRouter() {
  const router = Router();
  const stewards = requireRole("steward", "coordinator");

  router.get(
    "/steward/today",
    stewards,
    handle({}, async ({ caller }) => ({ body: await service.today(caller!) })),
  );

  // The digester page's profile with the steward's view of its day (GET; changes are digester-profile.routes.ts).
  router.get(
    "/digesters/:id",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema }, async ({ params, caller }) => ({
      body: await service.digesterDetail(caller!, params.id),
    })),
  );

  router.post(
    "/drop-offs/:id/accept",
    stewards,
    handle({ params: DropOffIdParamsSchema, body: AcceptDropOffSchema }, async ({ params, body, caller }) => ({
      body: await service.acceptDropOff(caller!, params.id, body),
    })),
  );

  router.post(
    "/drop-offs/:id/feed",
    stewards,
    handle({ params: DropOffIdParamsSchema, body: FeedDropOffSchema }, async ({ params, body, caller }) => ({
      body: await service.feedDropOff(caller!, params.id, body),
    })),
  );

  router.post(
    "/drop-offs/:id/turn-away",
    stewards,
    handle({ params: DropOffIdParamsSchema, body: TurnAwayDropOffSchema }, async ({ params, body, caller }) => ({
      body: await service.turnAwayDropOff(caller!, params.id, body),
    })),
  );

  return router;
}
