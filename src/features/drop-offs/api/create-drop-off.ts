import { useMutation, useQueryClient } from "@tanstack/react-query";
import { CreatedDropOffSchema, type CreateDropOff } from "@shared/schemas/drop-offs";
import { api, ApiError } from "@/lib/api-client";
import { digestersTodayKey, dropOffKeys } from "./keys";

export type CreateDropOffInput = { body: CreateDropOff; idempotencyKey: string };

/** Logs a drop-off; the key makes a retry after a lost answer safe (the server replays its first answer). */
export function createDropOff({ body, idempotencyKey }: CreateDropOffInput) {
  return api("/api/drop-offs", {
    method: "POST",
    body,
    schema: CreatedDropOffSchema,
    headers: { "Idempotency-Key": idempotencyKey },
  });
}

export function useCreateDropOff() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDropOff,
    // Only a lost connection is retried: with the same key the server cannot count it twice.
    retry: (count, error) => error instanceof ApiError && error.status === 0 && count < 2,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: dropOffKeys.all });
      void queryClient.invalidateQueries({ queryKey: digestersTodayKey });
    },
  });
}

/** A new random key (a UUID where the browser offers one). */
export function newIdempotencyKey(): string {
  if (typeof crypto !== "undefined" && typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return Array.from(bytes, (b) => b.toString(16).padStart(2, "0")).join("");
}
