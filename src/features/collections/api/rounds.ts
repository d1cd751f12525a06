import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { PlanResultSchema, RoundListSchema, RoundSheetSchema } from "@shared/schemas/collections";
import { api } from "@/lib/api-client";
import { collectionKeys } from "./keys";

export const roundsQueryOptions = (date: string | undefined) =>
  queryOptions({
    queryKey: collectionKeys.rounds(date),
    queryFn: ({ signal }) =>
      api(date ? `/api/collection-rounds?date=${date}` : "/api/collection-rounds", { signal, schema: RoundListSchema }),
  });

export function useRounds(date: string | undefined) {
  return useQuery(roundsQueryOptions(date));
}

export const roundSheetQueryOptions = (id: number) =>
  queryOptions({
    queryKey: collectionKeys.round(id),
    queryFn: ({ signal }) => api(`/api/collection-rounds/${id}`, { signal, schema: RoundSheetSchema }),
  });

export function useRoundSheet(id: number) {
  return useQuery(roundSheetQueryOptions(id));
}

export function usePlanRounds() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (forDate: string) =>
      api("/api/collection-rounds/plan", { method: "POST", body: { forDate }, schema: PlanResultSchema }),
    onSuccess: (_r, forDate) => queryClient.invalidateQueries({ queryKey: collectionKeys.rounds(forDate) }),
  });
}

export function useMarkCollected(roundId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (requestId: number) =>
      api(`/api/collection-rounds/${roundId}/stops/${requestId}/collected`, {
        method: "POST",
        body: {},
        schema: RoundSheetSchema,
      }),
    onSuccess: (sheet) => {
      queryClient.setQueryData(collectionKeys.round(roundId), sheet);
      return queryClient.invalidateQueries({ queryKey: [...collectionKeys.all, "rounds"] });
    },
  });
}
