import { queryOptions, useQuery } from "@tanstack/react-query";
import { DropOffListSchema } from "@shared/schemas/drop-offs";
import { api } from "@/lib/api-client";
import { dropOffKeys } from "./keys";

export function getMyDropOffs(signal?: AbortSignal) {
  return api("/api/drop-offs?mine=true", { schema: DropOffListSchema, signal });
}

export const myDropOffsQueryOptions = () =>
  queryOptions({
    queryKey: dropOffKeys.mine(),
    queryFn: ({ signal }) => getMyDropOffs(signal),
  });

export function useMyDropOffs() {
  return useQuery(myDropOffsQueryOptions());
}
