import { useMutation, useQueryClient } from "@tanstack/react-query";
import { ReadingSchema, type CreateReading } from "@shared/schemas/readings";
import { api } from "@/lib/api-client";
import { stewardKeys } from "./keys";

/** `POST /api/digesters/:id/readings`. */
export function createReading({ digesterId, body }: { digesterId: number; body: CreateReading }) {
  return api(`/api/digesters/${digesterId}/readings`, { method: "POST", body, schema: ReadingSchema });
}

export function useCreateReading(onChanged?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createReading,
    onSuccess: async () => {
      onChanged?.();
      await queryClient.invalidateQueries({ queryKey: stewardKeys.all });
    },
  });
}
