/**
 * The public calculators: stateless POST endpoints under /api/calc/ that change nothing, so they
 * need no sign-in, no session and no CSRF token (server/middleware/csrf.ts exempts the path).
 * Each is validate → one pure function of shared/domain → send. Limited per IP so that nobody
 * can keep the server busy with them.
 */
import { Router } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { z } from "zod";
import {
  calcFeedBudget,
  calcFertiliserAllowance,
  calcGasHolder,
  calcMethaneYield,
  calcSizing,
  calcTitration,
  calcWeightsForPressure,
} from "../../../shared/domain/calculators";
import {
  FeedBudgetRequestSchema,
  FertiliserAllowanceRequestSchema,
  GasHolderRequestSchema,
  MethaneYieldRequestSchema,
  SizingFromScrapsRequestSchema,
  SizingFromSlurryRequestSchema,
  SizingRequestSchema,
  type SizingRequest,
  TitrationRequestSchema,
  WeightsForPressureRequestSchema,
} from "../../../shared/schemas/calc";
import { AppError } from "../../lib/app-error";
import { handle } from "../../middleware/handle";

/** Calculations one address may ask for per minute (the contract asks for at least 120). */
export const CALC_REQUESTS_PER_MINUTE = 300;
export const CALC_WINDOW_MS = 60_000;

const slurryKeys = new Set(Object.keys(SizingFromSlurryRequestSchema.shape));
const scrapsKeys = new Set(Object.keys(SizingFromScrapsRequestSchema.shape));

/**
 * Sizing accepts two shapes. A plain union answers a half-filled body with one message for the
 * whole body; picking the shape from the keys sent lets the answer name the missing or bad field
 * instead. Bodies with keys of both shapes (or none) keep the union's "give either …" message.
 */
export const SizingBodySchema = z.unknown().transform((value, ctx): SizingRequest => {
  const keys = value !== null && typeof value === "object" && !Array.isArray(value) ? Object.keys(value) : [];
  const slurry = keys.some((key) => slurryKeys.has(key));
  const scraps = keys.some((key) => scrapsKeys.has(key));
  const schema =
    slurry && !scraps
      ? SizingFromSlurryRequestSchema
      : scraps && !slurry
        ? SizingFromScrapsRequestSchema
        : SizingRequestSchema;
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  for (const issue of result.error.issues) ctx.addIssue({ ...issue });
  return z.NEVER;
});

/** In memory, per app instance: the calculators keep no state, and a restart forgiving a burst is harmless. */
function calcRateLimit() {
  return rateLimit({
    windowMs: CALC_WINDOW_MS,
    limit: CALC_REQUESTS_PER_MINUTE,
    // IPv6 addresses are grouped per /56, so one host cannot dodge the limit by rotating addresses.
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ""),
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // The library has set Retry-After by now; the error handler keeps it and sends the app's error shape.
    handler: (_req, _res, next) =>
      next(
        new AppError(
          429,
          "rate_limited",
          `Too many calculations from this address: at most ${CALC_REQUESTS_PER_MINUTE} a minute. Wait a minute and try again.`,
        ),
      ),
  });
}

/** POST /calc/* — one router per app, so each app (and each test) gets its own rate-limit counts. */
export function calcRouter() {
  const calc = Router();
  calc.use(calcRateLimit());

  calc.post(
    "/feed-budget",
    handle({ body: FeedBudgetRequestSchema }, ({ body }) => ({ body: calcFeedBudget(body) })),
  );
  calc.post(
    "/gas-holder",
    handle({ body: GasHolderRequestSchema }, ({ body }) => ({ body: calcGasHolder(body) })),
  );
  calc.post(
    "/weights-for-pressure",
    handle({ body: WeightsForPressureRequestSchema }, ({ body }) => ({ body: calcWeightsForPressure(body) })),
  );
  calc.post(
    "/sizing",
    handle({ body: SizingBodySchema }, ({ body }) => ({ body: calcSizing(body) })),
  );
  calc.post(
    "/methane-yield",
    handle({ body: MethaneYieldRequestSchema }, ({ body }) => ({ body: calcMethaneYield(body) })),
  );
  calc.post(
    "/titration",
    handle({ body: TitrationRequestSchema }, ({ body }) => ({ body: calcTitration(body) })),
  );
  calc.post(
    "/fertiliser-allowance",
    handle({ body: FertiliserAllowanceRequestSchema }, ({ body }) => ({ body: calcFertiliserAllowance(body) })),
  );

  const router = Router();
  router.use("/calc", calc);
  return router;
}
