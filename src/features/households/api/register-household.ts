import { useMutation, useQueryClient } from "@tanstack/react-query";
import { MyHouseholdSchema, type RegisterHousehold } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { householdKeys } from "./keys";

export function registerHousehold(body: RegisterHousehold) {
  return api("/api/households", { method: "POST", body, schema: MyHouseholdSchema });
}

/** Registers the caller's household. The caller's household id changes too, so the session user is refetched. */
export function useRegisterHousehold(options: { onRegistered?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: registerHousehold,
    onSuccess: (data) => {
      queryClient.setQueryData(householdKeys.mine(), data);
      void queryClient.invalidateQueries({ queryKey: householdKeys.all });
      options.onRegistered?.();
    },
  });
}
