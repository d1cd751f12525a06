import { useMutation, useQueryClient } from "@tanstack/react-query";
import { PersonRowSchema, type UpdatePerson } from "@shared/schemas/people";
import { api } from "@/lib/api-client";
import { peopleKeys } from "./keys";

export function updatePerson(id: number, body: UpdatePerson) {
  return api(`/api/people/${id}`, { method: "PATCH", body, schema: PersonRowSchema });
}

export function useUpdatePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: number; body: UpdatePerson }) => updatePerson(id, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.list() }),
  });
}
