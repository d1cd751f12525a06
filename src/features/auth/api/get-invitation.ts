import { queryOptions, useQuery } from "@tanstack/react-query";
import { InvitationInfoSchema } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";
import { authKeys } from "./keys";

export function getInvitation(token: string, signal?: AbortSignal) {
  return api(`/api/invitations/${encodeURIComponent(token)}`, { schema: InvitationInfoSchema, signal });
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: ({ signal }) => getInvitation(token, signal),
    retry: false,
    staleTime: Infinity,
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
