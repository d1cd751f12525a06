import { queryOptions, useQuery } from "@tanstack/react-query";
import { FeedingListSchema } from "@shared/schemas/feedings";
import { api } from "@/lib/api-client";
import { digesterPageKeys } from "./keys";

/** The last 60 days of feedings, oldest first (the API's default range). */
export function getFeedings(id: number, signal?: AbortSignal) {
  return api(`/api/digesters/${id}/feedings`, { schema: FeedingListSchema, signal });
}

export const feedingsQueryOptions = (id: number) =>
  queryOptions({ queryKey: digesterPageKeys.feedings(id), queryFn: ({ signal }) => getFeedings(id, signal) });

export function useFeedings(id: number) {
  return useQuery(feedingsQueryOptions(id));
}
