import { useMutation } from "@tanstack/react-query";
import type { ChangePassword } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

/** Changes the password; the server ends every other session of the person. */
export function changePassword(body: ChangePassword) {
  return api("/api/account/password", { method: "POST", body });
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
