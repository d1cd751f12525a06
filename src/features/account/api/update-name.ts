import { useMutation } from "@tanstack/react-query";
import { SessionUserSchema, type SessionUser, type UpdateAccount } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

export function updateName(body: UpdateAccount) {
  return api("/api/account", { method: "PATCH", body, schema: SessionUserSchema });
}

export function useUpdateName(onUpdated: (user: SessionUser) => void) {
  return useMutation({ mutationFn: updateName, onSuccess: onUpdated });
}
