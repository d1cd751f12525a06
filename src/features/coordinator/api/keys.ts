export const coordinatorKeys = {
  all: ["coordinator"] as const,
  rebalancing: () => [...coordinatorKeys.all, "rebalancing"] as const,
};
