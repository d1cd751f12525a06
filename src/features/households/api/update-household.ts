import { useMutation, useQueryClient } from "@tanstack/react-query";
import { MyHouseholdSchema, type UpdateHousehold } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { householdKeys } from "./keys";

export function updateHousehold(body: UpdateHousehold) {
  return api("/api/households/mine", { method: "PATCH", body, schema: MyHouseholdSchema });
}

export function useUpdateHousehold() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateHousehold,
    onSuccess: (data) => {
      queryClient.setQueryData(householdKeys.mine(), data);
      void queryClient.invalidateQueries({ queryKey: householdKeys.list() });
    },
  });
}
