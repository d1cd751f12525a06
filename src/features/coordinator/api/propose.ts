import { useMutation } from "@tanstack/react-query";
import { type ProposalRequest, ProposalSchema } from "@shared/schemas/assignments";
import { api } from "@/lib/api-client";

/** Runs the scheduler; nothing changes on the server. */
export function propose(body: ProposalRequest) {
  return api("/api/assignments/proposals", { method: "POST", body, schema: ProposalSchema });
}

export function usePropose() {
  return useMutation({ mutationFn: propose });
}
