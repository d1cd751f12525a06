import { useMutation } from "@tanstack/react-query";
import { WeightsForPressureResponseSchema, type WeightsForPressureRequest } from "@shared/schemas/calc";
import { api } from "@/lib/api-client";
import { planningKeys } from "./keys";

/** POST /api/calc/weights-for-pressure — public, stateless; the answer is parsed with the shared response schema. */
export function calculateWeightsForPressure(body: WeightsForPressureRequest, signal?: AbortSignal) {
  return api("/api/calc/weights-for-pressure", {
    method: "POST",
    body,
    schema: WeightsForPressureResponseSchema,
    signal,
  });
}

export function useWeightsForPressureCalculation() {
  return useMutation({
    mutationKey: planningKeys.calc("weights-for-pressure"),
    mutationFn: (body: WeightsForPressureRequest) => calculateWeightsForPressure(body),
  });
}
