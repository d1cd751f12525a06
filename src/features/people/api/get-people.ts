import { queryOptions, useQuery } from "@tanstack/react-query";
import { PeopleListSchema } from "@shared/schemas/people";
import { api } from "@/lib/api-client";
import { peopleKeys } from "./keys";

export function getPeople(signal?: AbortSignal) {
  return api("/api/people", { schema: PeopleListSchema, signal });
}

export const peopleQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.list(),
    queryFn: ({ signal }) => getPeople(signal),
  });

export function usePeople() {
  return useQuery(peopleQueryOptions());
}
