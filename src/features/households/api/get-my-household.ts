import { queryOptions, useQuery } from "@tanstack/react-query";
import { MyHouseholdSchema } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { householdKeys } from "./keys";

export function getMyHousehold(signal?: AbortSignal) {
  return api("/api/households/mine", { schema: MyHouseholdSchema, signal });
}

export const myHouseholdQueryOptions = () =>
  queryOptions({
    queryKey: householdKeys.mine(),
    queryFn: ({ signal }) => getMyHousehold(signal),
  });

export function useMyHousehold() {
  return useQuery(myHouseholdQueryOptions());
}
