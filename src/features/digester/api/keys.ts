/** Query keys of the digester page; its mutations invalidate `digesterPageKeys.one(id)`. */
export const digesterPageKeys = {
  all: ["digester-page"] as const,
  one: (id: number) => [...digesterPageKeys.all, id] as const,
  detail: (id: number) => [...digesterPageKeys.one(id), "detail"] as const,
  history: (id: number, days: number) => [...digesterPageKeys.one(id), "history", days] as const,
  readings: (id: number) => [...digesterPageKeys.one(id), "readings"] as const,
  feedings: (id: number) => [...digesterPageKeys.one(id), "feedings"] as const,
};
