import { useMutation, useQueryClient } from "@tanstack/react-query";
import { SessionUserSchema, type LoginRequest } from "@shared/schemas/auth";
import { api, setCsrfToken } from "@/lib/api-client";
import { authKeys } from "./keys";

export function signIn(body: LoginRequest) {
  return api("/api/auth/login", { method: "POST", body, schema: SessionUserSchema });
}

/** Signs in; the new session has a new CSRF token, and every cached answer belonged to the visitor. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (user) => {
      // The new session has its own CSRF token; the next change fetches it.
      setCsrfToken(undefined);
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
