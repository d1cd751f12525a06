import { useMutation } from "@tanstack/react-query";
import { FeedBudgetResponseSchema, type FeedBudgetRequest } from "@shared/schemas/calc";
import { api } from "@/lib/api-client";
import { planningKeys } from "./keys";

/** POST /api/calc/feed-budget — public, stateless; the answer is parsed with the shared response schema. */
export function calculateFeedBudget(body: FeedBudgetRequest, signal?: AbortSignal) {
  return api("/api/calc/feed-budget", { method: "POST", body, schema: FeedBudgetResponseSchema, signal });
}

export function useFeedBudgetCalculation() {
  return useMutation({
    mutationKey: planningKeys.calc("feed-budget"),
    mutationFn: (body: FeedBudgetRequest) => calculateFeedBudget(body),
  });
}
