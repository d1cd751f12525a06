import { useMutation } from "@tanstack/react-query";
import { SessionUserSchema, type ChangeEmail, type SessionUser } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

export function changeEmail(body: ChangeEmail) {
  return api("/api/account/email", { method: "POST", body, schema: SessionUserSchema });
}

export function useChangeEmail(onUpdated: (user: SessionUser) => void) {
  return useMutation({ mutationFn: changeEmail, onSuccess: onUpdated });
}
