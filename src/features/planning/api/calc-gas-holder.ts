import { useMutation } from "@tanstack/react-query";
import { GasHolderResponseSchema, type GasHolderRequest } from "@shared/schemas/calc";
import { api } from "@/lib/api-client";
import { planningKeys } from "./keys";

/** POST /api/calc/gas-holder — public, stateless; the answer is parsed with the shared response schema. */
export function calculateGasHolder(body: GasHolderRequest, signal?: AbortSignal) {
  return api("/api/calc/gas-holder", { method: "POST", body, schema: GasHolderResponseSchema, signal });
}

export function useGasHolderCalculation() {
  return useMutation({
    mutationKey: planningKeys.calc("gas-holder"),
    mutationFn: (body: GasHolderRequest) => calculateGasHolder(body),
  });
}
