import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api, resetSessionState } from "@/lib/api-client";
import { authKeys } from "./keys";

export function signOut() {
  return api("/api/auth/logout", { method: "POST" });
}

/** Signs out and forgets everything cached for the person. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      resetSessionState();
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}
