import { useMutation, useQueryClient } from "@tanstack/react-query";
import { DropOffSchema } from "@shared/schemas/drop-offs";
import { api } from "@/lib/api-client";
import { digestersTodayKey, dropOffKeys } from "./keys";

export function cancelDropOff(id: number) {
  return api(`/api/drop-offs/${id}/cancel`, { method: "POST", schema: DropOffSchema });
}

export function useCancelDropOff() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelDropOff,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: dropOffKeys.all });
      void queryClient.invalidateQueries({ queryKey: digestersTodayKey });
    },
  });
}
