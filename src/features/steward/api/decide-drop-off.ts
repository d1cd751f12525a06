import { useMutation, useQueryClient } from "@tanstack/react-query";
import {
  DropOffDecisionSchema,
  type AcceptDropOff,
  type FeedDropOff,
  type TurnAwayDropOff,
} from "@shared/schemas/steward";
import { api } from "@/lib/api-client";
import { stewardKeys } from "./keys";

export type DropOffDecisionRequest =
  | { kind: "accept"; dropOffId: number; body: AcceptDropOff }
  | { kind: "feed"; dropOffId: number; body: FeedDropOff }
  | { kind: "turn-away"; dropOffId: number; body: TurnAwayDropOff };

/** `POST /api/drop-offs/:id/accept | feed | turn-away`. */
export function decideDropOff(request: DropOffDecisionRequest) {
  return api(`/api/drop-offs/${request.dropOffId}/${request.kind}`, {
    method: "POST",
    body: request.body,
    schema: DropOffDecisionSchema,
  });
}

/** Accept, feed or turn away a drop-off; refreshes the steward's day (and whatever `onChanged` refreshes). */
export function useDecideDropOff(onChanged?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideDropOff,
    onSuccess: async () => {
      onChanged?.();
      await queryClient.invalidateQueries({ queryKey: stewardKeys.all });
    },
  });
}
