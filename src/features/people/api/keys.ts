export const peopleKeys = {
  all: ["people"] as const,
  list: () => [...peopleKeys.all, "list"] as const,
  digesterNames: () => [...peopleKeys.all, "digester-names"] as const,
  undeliveredEmails: () => [...peopleKeys.all, "undelivered-emails"] as const,
};
