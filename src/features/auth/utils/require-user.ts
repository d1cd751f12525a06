import { redirect } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import type { Role, SessionUser } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { meQueryOptions } from "../api/get-me";

/**
 * For route loaders: the signed-in person, or a redirect to sign-in that comes back to this
 * page afterwards. With `roles`, a person holding none of them gets a 403 page.
 */
export async function requireUser(queryClient: QueryClient, request: Request, roles?: Role[]): Promise<SessionUser> {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) {
    const url = new URL(request.url);
    throw redirect(paths.signIn(url.pathname + url.search));
  }
  if (roles && !roles.some((role) => user.roles.includes(role))) {
    throw new Response(null, {
      status: 403,
      statusText: `This page is for people with the ${roles.join(" or ")} role.`,
    });
  }
  return user;
}

/** True when the person holds at least one of the roles. */
export function hasRole(user: SessionUser | null | undefined, ...roles: Role[]): boolean {
  return !!user && roles.some((role) => user.roles.includes(role));
}
