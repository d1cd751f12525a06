import { useMutation, useQueryClient } from "@tanstack/react-query";
import { type ApplyRequest, ApplyResultSchema } from "@shared/schemas/assignments";
import { api } from "@/lib/api-client";
import { coordinatorKeys } from "./keys";

export function applyProposal(body: ApplyRequest) {
  return api("/api/assignments/apply", { method: "POST", body, schema: ApplyResultSchema });
}

export function useApplyProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: applyProposal,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: coordinatorKeys.all }),
  });
}
