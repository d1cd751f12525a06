import { useMutation } from "@tanstack/react-query";
import type { Proposal, ProposalRequest } from "@shared/schemas/assignments";
import { api } from "@/lib/api-client";

/** Runs the scheduler; nothing changes on the server. */
export function propose(body: ProposalRequest) {
  return api<never>("/api/assignments/proposals", { method: "POST", body }) as Promise<Proposal>;
}

export function usePropose() {
  return useMutation({ mutationFn: propose });
}
