import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ApplyRequest, ApplyResult } from "@shared/schemas/assignments";
import { api } from "@/lib/api-client";
import { coordinatorKeys } from "./keys";

export function applyProposal(body: ApplyRequest) {
  return api<never>("/api/assignments/apply", { method: "POST", body }) as Promise<ApplyResult>;
}

export function useApplyProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: applyProposal,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: coordinatorKeys.all }),
  });
}
