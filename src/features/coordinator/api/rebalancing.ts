import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { RebalanceMovesResultSchema, RebalanceViewSchema } from "@shared/schemas/assignments";
import { api } from "@/lib/api-client";
import { coordinatorKeys } from "./keys";

export function getRebalancing(signal?: AbortSignal) {
  return api("/api/rebalancing", { signal, schema: RebalanceViewSchema });
}

export const rebalancingQueryOptions = () =>
  queryOptions({ queryKey: coordinatorKeys.rebalancing(), queryFn: ({ signal }) => getRebalancing(signal) });

export function useRebalancing() {
  return useQuery(rebalancingQueryOptions());
}

export function moveDropOffs(moves: { dropOffId: number; digesterId: number }[]) {
  return api("/api/rebalancing/moves", { method: "POST", body: { moves }, schema: RebalanceMovesResultSchema });
}

export function useMoveDropOffs() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: moveDropOffs,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: coordinatorKeys.rebalancing() }),
  });
}
