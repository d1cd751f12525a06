import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole } from "../../middleware/require-role";
import { RebalanceMovesSchema } from "../../../shared/schemas/assignments";
import * as service from "./rebalancing.service";

/** Rebalancing today's and tomorrow's pending drop-offs (coordinators only). */
export function rebalancingRouter() {
  const router = Router();
  const coordinator = requireRole("coordinator");
  router.get(
    "/rebalancing",
    coordinator,
    handle({}, async () => ({ body: await service.rebalancingView() })),
  );
  router.post(
    "/rebalancing/moves",
    coordinator,
    handle({ body: RebalanceMovesSchema }, async ({ body }) => ({ body: await service.moveDropOffs(body.moves) })),
  );
  return router;
}
