import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole } from "../../middleware/require-role";
import { undeliveredEmails } from "./outbox.service";

/** Coordinators see e-mail that has not arrived (pending retries and permanent failures). */
export function outboxRouter() {
  const router = Router();
  router.get(
    "/outbox-emails",
    requireRole("coordinator"),
    handle({}, async () => ({ body: await undeliveredEmails() })),
  );
  return router;
}
