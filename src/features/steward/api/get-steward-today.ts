import { queryOptions, useQuery } from "@tanstack/react-query";
import { StewardTodaySchema } from "@shared/schemas/steward";
import { api } from "@/lib/api-client";
import { stewardKeys } from "./keys";

export function getStewardToday(signal?: AbortSignal) {
  return api("/api/steward/today", { schema: StewardTodaySchema, signal });
}

export const stewardTodayQueryOptions = () =>
  queryOptions({
    queryKey: stewardKeys.today(),
    queryFn: ({ signal }) => getStewardToday(signal),
  });

export function useStewardToday() {
  return useQuery(stewardTodayQueryOptions());
}
