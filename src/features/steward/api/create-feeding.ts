import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { CreateFeeding } from "@shared/schemas/feedings";
import { HandFeedingResultSchema } from "@shared/schemas/steward";
import { api } from "@/lib/api-client";
import { stewardKeys } from "./keys";

/** `POST /api/digesters/:id/feedings`: scraps added by hand. */
export function createFeeding({ digesterId, body }: { digesterId: number; body: CreateFeeding }) {
  return api(`/api/digesters/${digesterId}/feedings`, { method: "POST", body, schema: HandFeedingResultSchema });
}

export function useCreateFeeding(onChanged?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createFeeding,
    onSuccess: async () => {
      onChanged?.();
      await queryClient.invalidateQueries({ queryKey: stewardKeys.all });
    },
  });
}
