import { Router } from "express";
import { healthRouter } from "./modules/health/health.routes";
import { digestersRouter } from "./modules/digesters/digesters.routes";

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use(healthRouter);
  router.use(digestersRouter);
  return router;
}
