import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import {
  CollectionRequestListSchema,
  CollectionRequestViewSchema,
  type CreateCollectionRequest,
} from "@shared/schemas/collections";
import { api } from "@/lib/api-client";
import { collectionKeys } from "./keys";

export const myCollectionRequestsQueryOptions = () =>
  queryOptions({
    queryKey: collectionKeys.myRequests(),
    queryFn: ({ signal }) => api("/api/collection-requests?mine=true", { signal, schema: CollectionRequestListSchema }),
  });

export function useMyCollectionRequests() {
  return useQuery(myCollectionRequestsQueryOptions());
}

export function useAskForCollection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateCollectionRequest) =>
      api("/api/collection-requests", { method: "POST", body, schema: CollectionRequestViewSchema }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectionKeys.myRequests() }),
  });
}

export function useCancelCollection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) =>
      api(`/api/collection-requests/${id}/cancel`, { method: "POST", body: {}, schema: CollectionRequestViewSchema }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectionKeys.myRequests() }),
  });
}
