import { useMutation } from "@tanstack/react-query";
import { TitrationResponseSchema, type TitrationRequest } from "@shared/schemas/calc";
import { api } from "@/lib/api-client";
import { planningKeys } from "./keys";

/** POST /api/calc/titration — public, stateless; the answer is parsed with the shared response schema. */
export function calculateTitration(body: TitrationRequest, signal?: AbortSignal) {
  return api("/api/calc/titration", { method: "POST", body, schema: TitrationResponseSchema, signal });
}

export function useTitrationCalculation() {
  return useMutation({
    mutationKey: planningKeys.calc("titration"),
    mutationFn: (body: TitrationRequest) => calculateTitration(body),
  });
}
