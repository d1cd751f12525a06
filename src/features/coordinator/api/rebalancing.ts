import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { RebalanceView } from "@shared/schemas/assignments";
import { api } from "@/lib/api-client";
import { coordinatorKeys } from "./keys";

export function getRebalancing(signal?: AbortSignal) {
  return api<never>("/api/rebalancing", { signal }) as Promise<RebalanceView>;
}

export const rebalancingQueryOptions = () =>
  queryOptions({ queryKey: coordinatorKeys.rebalancing(), queryFn: ({ signal }) => getRebalancing(signal) });

export function useRebalancing() {
  return useQuery(rebalancingQueryOptions());
}

export function moveDropOffs(moves: { dropOffId: number; digesterId: number }[]) {
  return api<never>("/api/rebalancing/moves", { method: "POST", body: { moves } }) as Promise<{ moved: number; emailsQueued: number }>;
}

export function useMoveDropOffs() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: moveDropOffs,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: coordinatorKeys.rebalancing() }),
  });
}
