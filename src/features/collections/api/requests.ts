import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { CollectionRequestView, CreateCollectionRequest } from "@shared/schemas/collections";
import { api } from "@/lib/api-client";
import { collectionKeys } from "./keys";

export const myCollectionRequestsQueryOptions = () =>
  queryOptions({
    queryKey: collectionKeys.myRequests(),
    queryFn: ({ signal }) => api<never>("/api/collection-requests?mine=true", { signal }) as Promise<{ requests: CollectionRequestView[] }>,
  });

export function useMyCollectionRequests() {
  return useQuery(myCollectionRequestsQueryOptions());
}

export function useAskForCollection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateCollectionRequest) =>
      api<never>("/api/collection-requests", { method: "POST", body }) as Promise<CollectionRequestView>,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectionKeys.myRequests() }),
  });
}

export function useCancelCollection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api<never>(`/api/collection-requests/${id}/cancel`, { method: "POST", body: {} }) as Promise<CollectionRequestView>,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectionKeys.myRequests() }),
  });
}
