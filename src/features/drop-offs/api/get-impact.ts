import { queryOptions, useQuery } from "@tanstack/react-query";
import { HouseholdImpactSchema } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { dropOffKeys } from "./keys";

/** What the household's fed drop-offs became (GET /api/households/mine/impact). */
export function getImpact(signal?: AbortSignal) {
  return api("/api/households/mine/impact", { schema: HouseholdImpactSchema, signal });
}

export const impactQueryOptions = () =>
  queryOptions({
    queryKey: dropOffKeys.impact(),
    queryFn: ({ signal }) => getImpact(signal),
  });

export function useImpact() {
  return useQuery(impactQueryOptions());
}
