import { useMutation, useQueryClient } from "@tanstack/react-query";
import { InvitationCreatedSchema, type InvitePerson } from "@shared/schemas/people";
import { api } from "@/lib/api-client";
import { peopleKeys } from "./keys";

export function invitePerson(body: InvitePerson) {
  return api("/api/people/invitations", { method: "POST", body, schema: InvitationCreatedSchema });
}

export function useInvitePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: invitePerson,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}
