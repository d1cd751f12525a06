import { queryOptions, useQuery } from "@tanstack/react-query";
import { HouseholdListSchema } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { householdKeys } from "./keys";

/** Coordinators get every household; everyone else their own (or none). */
export function getHouseholds(signal?: AbortSignal) {
  return api("/api/households", { schema: HouseholdListSchema, signal });
}

export const householdsQueryOptions = () =>
  queryOptions({
    queryKey: householdKeys.list(),
    queryFn: ({ signal }) => getHouseholds(signal),
  });

export function useHouseholds() {
  return useQuery(householdsQueryOptions());
}
