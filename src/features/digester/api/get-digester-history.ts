import { queryOptions, useSuspenseQuery } from "@tanstack/react-query";
import { DigesterHistorySchema } from "@shared/schemas/digester";
import { api } from "@/lib/api-client";
import { digesterPageKeys } from "./keys";

export function getDigesterHistory(id: number, days: number, signal?: AbortSignal) {
  return api(`/api/digesters/${id}/history?days=${days}`, { schema: DigesterHistorySchema, signal });
}

export const digesterHistoryQueryOptions = (id: number, days = 60) =>
  queryOptions({
    queryKey: digesterPageKeys.history(id, days),
    queryFn: ({ signal }) => getDigesterHistory(id, days, signal),
  });

export function useDigesterHistory(id: number, days = 60) {
  return useSuspenseQuery(digesterHistoryQueryOptions(id, days));
}
