export const collectionKeys = {
  all: ["collections"] as const,
  myRequests: () => [...collectionKeys.all, "requests", "mine"] as const,
  rounds: (date: string | undefined) => [...collectionKeys.all, "rounds", date ?? "upcoming"] as const,
  round: (id: number) => [...collectionKeys.all, "round", id] as const,
};
