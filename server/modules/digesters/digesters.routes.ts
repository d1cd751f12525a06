import { Router } from "express";
import { handle } from "../../middleware/handle";
import * as service from "./digesters.service";

export const digestersRouter = Router();

/** Public: where the digesters are and whether they take scraps (no amounts, no people). */
digestersRouter.get(
  "/public/digesters",
  handle({}, async () => ({ body: await service.publicDigesters() })),
);
