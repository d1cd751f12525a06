import { queryOptions, useQuery } from "@tanstack/react-query";
import { StreetListSchema } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { householdKeys } from "./keys";

export function getStreets(signal?: AbortSignal) {
  return api("/api/streets", { schema: StreetListSchema, signal });
}

export const streetsQueryOptions = () =>
  queryOptions({
    queryKey: householdKeys.streets(),
    queryFn: ({ signal }) => getStreets(signal),
    // The streets come from the basemap file: they do not change while the app runs.
    staleTime: Infinity,
  });

export function useStreets() {
  return useQuery(streetsQueryOptions());
}
