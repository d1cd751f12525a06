import { queryOptions, useQuery } from "@tanstack/react-query";
import { PublicDigesterListSchema } from "@shared/schemas/digester";
import { api } from "@/lib/api-client";
import { digesterKeys } from "./keys";

export function getPublicDigesters(signal?: AbortSignal) {
  return api("/api/public/digesters", { schema: PublicDigesterListSchema, signal });
}

export const publicDigestersQueryOptions = () =>
  queryOptions({
    queryKey: digesterKeys.public(),
    queryFn: ({ signal }) => getPublicDigesters(signal),
  });

export function usePublicDigesters() {
  return useQuery(publicDigestersQueryOptions());
}
