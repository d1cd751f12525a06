import { queryOptions, useQuery } from "@tanstack/react-query";
import { DigesterSummaryListSchema } from "@shared/schemas/digester";
import { api } from "@/lib/api-client";
import { digestersTodayKey } from "./keys";

export function getDigestersToday(signal?: AbortSignal) {
  return api("/api/digesters", { schema: DigesterSummaryListSchema, signal });
}

export const digestersTodayQueryOptions = () =>
  queryOptions({
    queryKey: digestersTodayKey,
    queryFn: ({ signal }) => getDigestersToday(signal),
    // Room changes as neighbours log and stewards accept: keep it fresh on screen.
    staleTime: 15_000,
    refetchInterval: 60_000,
  });

export function useDigestersToday() {
  return useQuery(digestersTodayQueryOptions());
}
