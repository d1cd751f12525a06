import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import * as service from "./digesters.service";

export const digestersRouter = Router();

/** Public: where the digesters are and whether they take scraps (no amounts, no people). */
digestersRouter.get(
  "/public/digesters",
  handle({}, async () => ({ body: await service.publicDigesters() })),
);

/** Signed in: every digester with today's feed budget and the binding limit. */
digestersRouter.get(
  "/digesters",
  requireAuth,
  handle({}, async () => ({ body: await service.listDigestersToday() })),
);
