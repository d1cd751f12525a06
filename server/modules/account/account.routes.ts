import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import { handleWithSession } from "../../middleware/session";
import { ChangeEmailSchema, ChangePasswordSchema, UpdateAccountSchema } from "../../../shared/schemas/auth";
import * as service from "./account.service";

/** The signed-in person's own account: name, password, e-mail. */
export function accountRouter() {
  const router = Router();

  router.patch(
    "/account",
    requireAuth,
    handle({ body: UpdateAccountSchema }, async ({ body, caller }) => ({
      body: await service.updateName(caller!, body.name),
    })),
  );

  router.post(
    "/account/password",
    requireAuth,
    handleWithSession({ body: ChangePasswordSchema }, async ({ body, caller, session, requestId, ip }) => {
      await service.changePassword(caller!, body, session.id(), { requestId, ip });
      return { status: 204 };
    }),
  );

  router.post(
    "/account/email",
    requireAuth,
    handle({ body: ChangeEmailSchema }, async ({ body, caller, requestId, ip }) => ({
      body: await service.changeEmail(caller!, body, { requestId, ip }),
    })),
  );

  return router;
}
