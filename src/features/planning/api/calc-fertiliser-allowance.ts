import { useMutation } from "@tanstack/react-query";
import { FertiliserAllowanceResponseSchema, type FertiliserAllowanceRequest } from "@shared/schemas/calc";
import { api } from "@/lib/api-client";
import { planningKeys } from "./keys";

/** POST /api/calc/fertiliser-allowance — public, stateless; the answer is parsed with the shared response schema. */
export function calculateFertiliserAllowance(body: FertiliserAllowanceRequest, signal?: AbortSignal) {
  return api("/api/calc/fertiliser-allowance", {
    method: "POST",
    body,
    schema: FertiliserAllowanceResponseSchema,
    signal,
  });
}

export function useFertiliserAllowanceCalculation() {
  return useMutation({
    mutationKey: planningKeys.calc("fertiliser-allowance"),
    mutationFn: (body: FertiliserAllowanceRequest) => calculateFertiliserAllowance(body),
  });
}
