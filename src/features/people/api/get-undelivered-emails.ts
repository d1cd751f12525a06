import { queryOptions, useQuery } from "@tanstack/react-query";
import { OutboxEmailListSchema } from "@shared/schemas/people";
import { api } from "@/lib/api-client";
import { peopleKeys } from "./keys";

/** E-mail still waiting to be delivered, and e-mail given up on (coordinators only). */
export function getUndeliveredEmails(signal?: AbortSignal) {
  return api("/api/outbox-emails", { schema: OutboxEmailListSchema, signal });
}

export const undeliveredEmailsQueryOptions = () =>
  queryOptions({
    queryKey: peopleKeys.undeliveredEmails(),
    queryFn: ({ signal }) => getUndeliveredEmails(signal),
  });

export function useUndeliveredEmails() {
  return useQuery(undeliveredEmailsQueryOptions());
}
