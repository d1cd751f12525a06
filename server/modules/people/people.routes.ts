import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole } from "../../middleware/require-role";
import { handleWithSession, sessionHeaders } from "../../middleware/session";
import { AcceptInvitationSchema, TokenParamsSchema } from "../../../shared/schemas/auth";
import {
  DigesterIdParamsSchema,
  InvitePersonSchema,
  PersonIdParamsSchema,
  SetStewardsSchema,
  UpdatePersonSchema,
} from "../../../shared/schemas/people";
import { linkUseLimit } from "../auth/request-limits";
import * as service from "./people.service";

/** People management (coordinators) and invitation acceptance (anyone holding a valid link). */
export function peopleRouter() {
  const router = Router();
  const coordinator = requireRole("coordinator");

  router.get(
    "/people",
    coordinator,
    handle({}, async () => ({ body: await service.listPeople() })),
  );

  router.post(
    "/people/invitations",
    coordinator,
    handle({ body: InvitePersonSchema }, async ({ body, caller }) => ({
      status: 201,
      body: await service.invite(caller!, body),
    })),
  );

  router.patch(
    "/people/:id",
    coordinator,
    handle(
      { params: PersonIdParamsSchema, body: UpdatePersonSchema },
      async ({ params, body, caller, requestId, ip }) => ({
        body: await service.updatePerson(caller!, params.id, body, { requestId, ip }),
      }),
    ),
  );

  router.put(
    "/digesters/:id/stewards",
    coordinator,
    handle({ params: DigesterIdParamsSchema, body: SetStewardsSchema }, async ({ params, body }) => ({
      body: await service.setStewards(params.id, body),
    })),
  );

  router.get(
    "/invitations/:token",
    handle({ params: TokenParamsSchema }, async ({ params }) => ({ body: await service.invitationInfo(params.token) })),
  );

  // Accepting signs the person in straight away, in a new session.
  router.post(
    "/invitations/:token/accept",
    linkUseLimit(),
    handleWithSession(
      { params: TokenParamsSchema, body: AcceptInvitationSchema },
      async ({ params, body, requestId, ip, session }) => {
        const caller = await service.acceptInvitation(params.token, body, { requestId, ip });
        await session.signIn(caller);
        return { body: caller, headers: sessionHeaders(session.info()) };
      },
    ),
  );

  return router;
}
