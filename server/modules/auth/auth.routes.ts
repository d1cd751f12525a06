import { Router } from "express";
import { z } from "zod";
import { handle } from "../../middleware/handle";
import { requireAuth } from "../../middleware/require-auth";
import { handleWithSession, sessionHeaders } from "../../middleware/session";
import { logSecurityEvent } from "../../lib/security-log";
import {
  LoginRequestSchema,
  PasswordResetCompleteSchema,
  PasswordResetRequestSchema,
  TokenParamsSchema,
} from "../../../shared/schemas/auth";
import * as service from "./auth.service";
import { linkUseLimit, resetRequestLimit } from "./request-limits";
import { signInThrottle } from "./sign-in-throttle";

const NoBody = z.object({}).strict();

/** Sign-in, sign-out, the session, CSRF token and password reset. A factory: each app gets its own throttle. */
export function authRouter() {
  const router = Router();

  router.get(
    "/auth/csrf",
    handleWithSession({}, ({ session }) => ({ body: { token: session.csrfToken() } })),
  );

  router.post(
    "/auth/login",
    signInThrottle(),
    handleWithSession({ body: LoginRequestSchema }, async ({ session }) => {
      const caller = await session.authenticate();
      if (!caller) throw service.invalidCredentials();
      await session.signIn(caller);
      return { body: caller, headers: sessionHeaders(session.info()) };
    }),
  );

  router.get(
    "/auth/me",
    requireAuth,
    handle({}, ({ caller }) => ({ body: caller })),
  );

  router.post(
    "/auth/logout",
    handleWithSession({ body: NoBody }, async ({ session, caller, requestId, ip }) => {
      if (caller) logSecurityEvent("signed_out", { requestId, ip, userId: caller.id });
      await session.signOut();
      return { status: 204 };
    }),
  );

  router.get(
    "/auth/session",
    requireAuth,
    handleWithSession({}, ({ session }) => ({ body: session.info() })),
  );

  // "Stay signed in": any request moves the idle timeout; this one exists to be that request.
  router.post(
    "/auth/session",
    requireAuth,
    handleWithSession({ body: NoBody }, ({ session }) => {
      session.keepAlive();
      return { body: session.info() };
    }),
  );

  router.post(
    "/auth/password-reset",
    resetRequestLimit(),
    handle({ body: PasswordResetRequestSchema }, async ({ body, requestId, ip }) => {
      await service.requestPasswordReset(body.email, { requestId, ip });
      return {
        status: 202,
        body: { message: "If an account uses this address, we have sent it a link to choose a new password." },
      };
    }),
  );

  router.get(
    "/auth/password-reset/:token",
    handle({ params: TokenParamsSchema }, async ({ params }) => {
      await service.checkResetLink(params.token);
      return { status: 204 };
    }),
  );

  // The browser that sets the new password becomes a known device: the owner can sign in from
  // it even while a stranger's guesses keep the account closed to new browsers.
  router.post(
    "/auth/password-reset/:token",
    linkUseLimit(),
    handleWithSession(
      { params: TokenParamsSchema, body: PasswordResetCompleteSchema },
      async ({ params, body, requestId, ip, session }) => {
        const { email } = await service.completePasswordReset(params.token, body.password, { requestId, ip });
        session.rememberDevice(email);
        return { status: 204 };
      },
    ),
  );

  return router;
}
