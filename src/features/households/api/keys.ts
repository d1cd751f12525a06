export const householdKeys = {
  all: ["households"] as const,
  mine: () => [...householdKeys.all, "mine"] as const,
  list: () => [...householdKeys.all, "list"] as const,
  streets: () => [...householdKeys.all, "streets"] as const,
};
