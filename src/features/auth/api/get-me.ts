import { queryOptions, useQuery } from "@tanstack/react-query";
import { SessionUserSchema, type SessionUser } from "@shared/schemas/auth";
import { api, ApiError } from "@/lib/api-client";
import { authKeys } from "./keys";

/** The signed-in person, or null for a visitor (the API's 401 is an answer here, not an error). */
export async function getMe(signal?: AbortSignal): Promise<SessionUser | null> {
  try {
    return await api("/api/auth/me", { schema: SessionUserSchema, signal });
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
