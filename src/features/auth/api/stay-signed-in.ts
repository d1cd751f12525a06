import { useMutation } from "@tanstack/react-query";
import { SessionInfoSchema } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

/** "Stay signed in": a request that moves the idle timeout (the answer says how long is left). */
export function staySignedIn() {
  return api("/api/auth/session", { method: "POST", body: {}, schema: SessionInfoSchema });
}

export function useStaySignedIn() {
  return useMutation({ mutationFn: staySignedIn });
}
