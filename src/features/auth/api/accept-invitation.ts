import { useMutation, useQueryClient } from "@tanstack/react-query";
import { SessionUserSchema, type AcceptInvitation } from "@shared/schemas/auth";
import { api, setCsrfToken } from "@/lib/api-client";
import { authKeys } from "./keys";

export function acceptInvitation(token: string, body: AcceptInvitation) {
  return api(`/api/invitations/${encodeURIComponent(token)}/accept`, {
    method: "POST",
    body,
    schema: SessionUserSchema,
  });
}

/** Accepting signs the person in (a new session). */
export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptInvitation) => acceptInvitation(token, body),
    onSuccess: (user) => {
      // The new session has its own CSRF token; the next change fetches it.
      setCsrfToken(undefined);
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
