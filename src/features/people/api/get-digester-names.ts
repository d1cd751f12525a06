import { queryOptions, useQuery } from "@tanstack/react-query";
import { PublicDigesterListSchema } from "@shared/schemas/digester";
import { api } from "@/lib/api-client";
import { peopleKeys } from "./keys";

/** Digester ids and names, for choosing which digesters a steward looks after. */
export async function getDigesterNames(signal?: AbortSignal): Promise<Array<{ id: number; name: string }>> {
  const digesters = await api("/api/public/digesters", { schema: PublicDigesterListSchema, signal });
  return digesters.map((d) => ({ id: d.id, name: d.name }));
}

export const digesterNamesQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.digesterNames(),
    queryFn: ({ signal }) => getDigesterNames(signal),
    staleTime: 5 * 60_000,
  });

export function useDigesterNames() {
  return useQuery(digesterNamesQueryOptions());
}
