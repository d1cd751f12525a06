import { queryOptions, useSuspenseQuery } from "@tanstack/react-query";
import { DigesterDetailSchema } from "@shared/schemas/steward";
import { api } from "@/lib/api-client";
import { digesterPageKeys } from "./keys";

export function getDigesterDetail(id: number, signal?: AbortSignal) {
  return api(`/api/digesters/${id}`, { schema: DigesterDetailSchema, signal });
}

export const digesterDetailQueryOptions = (id: number) =>
  queryOptions({ queryKey: digesterPageKeys.detail(id), queryFn: ({ signal }) => getDigesterDetail(id, signal) });

export function useDigesterDetail(id: number) {
  return useSuspenseQuery(digesterDetailQueryOptions(id));
}
