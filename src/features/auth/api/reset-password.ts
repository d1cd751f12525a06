import { useMutation } from "@tanstack/react-query";
import type { PasswordResetComplete } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

export function resetPassword(token: string, body: PasswordResetComplete) {
  return api(`/api/auth/password-reset/${encodeURIComponent(token)}`, { method: "POST", body });
}

export function useResetPassword(token: string) {
  return useMutation({ mutationFn: (body: PasswordResetComplete) => resetPassword(token, body) });
}
