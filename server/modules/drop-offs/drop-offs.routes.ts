import { Router } from "express";
import { badRequest } from "../../lib/app-error";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import { requireRole } from "../../middleware/require-role";
import {
  CreateDropOffSchema,
  DropOffIdParamsSchema,
  DropOffListQuerySchema,
  IdempotencyKeySchema,
} from "../../../shared/schemas/drop-offs";
import * as service from "./drop-offs.service";

function idempotencyKey(value: string | string[] | undefined): string | undefined {
  if (value === undefined) return undefined;
  const parsed = IdempotencyKeySchema.safeParse(Array.isArray(value) ? value.join(",") : value);
  if (!parsed.success) {
    throw badRequest("Please check the Idempotency-Key header.", {
      "Idempotency-Key": parsed.error.issues[0]?.message ?? "Invalid key.",
    });
  }
  return parsed.data;
}

/** Residents log drop-offs for their own household, see them, and cancel ones still waiting. */
export function dropOffsRouter() {
  const router = Router();
  const resident = requireRole("resident");

  router.post(
    "/drop-offs",
    resident,
    handle({ body: CreateDropOffSchema }, async ({ body, caller, headers }) => {
      const result = await service.createDropOff(caller!, body, {
        idempotencyKey: idempotencyKey(headers["idempotency-key"]),
      });
      return {
        status: result.status,
        raw: result.bodyText,
        type: "application/json",
        headers: result.replayed ? { "Idempotent-Replayed": "true" } : undefined,
      };
    }),
  );

  router.get(
    "/drop-offs",
    requireAuth,
    handle({ query: DropOffListQuerySchema }, async ({ caller }) => ({ body: await service.listMine(caller!) })),
  );

  router.post(
    "/drop-offs/:id/cancel",
    resident,
    handle({ params: DropOffIdParamsSchema }, async ({ params, caller }) => ({
      body: await service.cancelMine(caller!, params.id),
    })),
  );

  return router;
}
