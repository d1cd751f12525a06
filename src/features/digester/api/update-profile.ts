import { useMutation, useQueryClient } from "@tanstack/react-query";
import { DigesterProfileSchema, type UpdateDigesterProfile } from "@shared/schemas/digester";
import { api } from "@/lib/api-client";
import { digesterPageKeys } from "./keys";

/** `PATCH /api/digesters/:id`. */
export function updateProfile({ id, body }: { id: number; body: UpdateDigesterProfile }) {
  return api(`/api/digesters/${id}`, { method: "PATCH", body, schema: DigesterProfileSchema });
}

export function useUpdateProfile(id: number, onChanged?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateProfile,
    onSuccess: async () => {
      onChanged?.();
      await queryClient.invalidateQueries({ queryKey: digesterPageKeys.one(id) });
    },
  });
}
