import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { authKeys } from "./keys";

/** Resolves when the reset link can still be used; rejects with 404 (unknown) or 410 (used, expired). */
export async function checkResetLink(token: string, signal?: AbortSignal): Promise<true> {
  await api(`/api/auth/password-reset/${encodeURIComponent(token)}`, { signal });
  return true;
}

export const resetLinkQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.resetLink(token),
    queryFn: ({ signal }) => checkResetLink(token, signal),
    retry: false,
    staleTime: Infinity,
  });

export function useResetLink(token: string) {
  return useQuery(resetLinkQueryOptions(token));
}
