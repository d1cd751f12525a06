import { queryOptions, useQuery } from "@tanstack/react-query";
import { ReadingListSchema } from "@shared/schemas/readings";
import { api } from "@/lib/api-client";
import { digesterPageKeys } from "./keys";

/** The last 60 days of readings, oldest first (the API's default range). */
export function getReadings(id: number, signal?: AbortSignal) {
  return api(`/api/digesters/${id}/readings`, { schema: ReadingListSchema, signal });
}

export const readingsQueryOptions = (id: number) =>
  queryOptions({ queryKey: digesterPageKeys.readings(id), queryFn: ({ signal }) => getReadings(id, signal) });

export function useReadings(id: number) {
  return useQuery(readingsQueryOptions(id));
}
