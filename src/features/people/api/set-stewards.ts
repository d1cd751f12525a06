import { useMutation, useQueryClient } from "@tanstack/react-query";
import { DigesterStewardsSchema } from "@shared/schemas/people";
import { api } from "@/lib/api-client";
import { peopleKeys } from "./keys";

/** Replaces the whole set of stewards of one digester. */
export function setStewards(digesterId: number, personIds: number[]) {
  return api(`/api/digesters/${digesterId}/stewards`, {
    method: "PUT",
    body: { personIds },
    schema: DigesterStewardsSchema,
  });
}

export function useSetStewards() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ digesterId, personIds }: { digesterId: number; personIds: number[] }) =>
      setStewards(digesterId, personIds),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.list() }),
  });
}
