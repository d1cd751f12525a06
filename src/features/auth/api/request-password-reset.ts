import { useMutation } from "@tanstack/react-query";
import type { PasswordResetRequest } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

/** Always succeeds for a well-formed address: the answer never says whether an account exists. */
export function requestPasswordReset(body: PasswordResetRequest) {
  return api("/api/auth/password-reset", { method: "POST", body });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
