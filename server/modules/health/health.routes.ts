import { Router } from "express";
import { handle } from "../../middleware/handle";
import { checkHealth } from "./health.service";

export const healthRouter = Router();

healthRouter.get(
  "/health",
  handle({}, async () => {
    const { ok, health } = await checkHealth();
    return { status: ok ? 200 : 503, body: health };
  }),
);
