import { useMutation, useQueryClient } from "@tanstack/react-query";
import { DigesterProfileSchema, type SetDigesterStatus } from "@shared/schemas/digester";
import { api } from "@/lib/api-client";
import { digesterPageKeys } from "./keys";

/** `PUT /api/digesters/:id/status`. */
export function setStatus({ id, body }: { id: number; body: SetDigesterStatus }) {
  return api(`/api/digesters/${id}/status`, { method: "PUT", body, schema: DigesterProfileSchema });
}

export function useSetStatus(id: number, onChanged?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setStatus,
    onSuccess: async () => {
      onChanged?.();
      await queryClient.invalidateQueries({ queryKey: digesterPageKeys.one(id) });
    },
  });
}
