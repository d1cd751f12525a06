import { useMutation, useQueryClient } from "@tanstack/react-query";
import { MemberAddedSchema, type AddMember } from "@shared/schemas/households";
import { api } from "@/lib/api-client";
import { householdKeys } from "./keys";

export function addMember(body: AddMember) {
  return api("/api/households/mine/members", { method: "POST", body, schema: MemberAddedSchema });
}

export function useAddMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addMember,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: householdKeys.mine() }),
  });
}
