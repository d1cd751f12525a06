import { useMutation } from "@tanstack/react-query";
import { SizingFromScrapsResponseSchema, type SizingFromScrapsRequest } from "@shared/schemas/calc";
import { api } from "@/lib/api-client";
import { planningKeys } from "./keys";

/**
 * POST /api/calc/sizing with the daily-scraps shape (the one a neighbourhood knows); its answer
 * always has the four figures, so it is parsed with that shape's schema.
 */
export function calculateSizingFromScraps(body: SizingFromScrapsRequest, signal?: AbortSignal) {
  return api("/api/calc/sizing", { method: "POST", body, schema: SizingFromScrapsResponseSchema, signal });
}

export function useSizingFromScrapsCalculation() {
  return useMutation({
    mutationKey: planningKeys.calc("sizing"),
    mutationFn: (body: SizingFromScrapsRequest) => calculateSizingFromScraps(body),
  });
}
