export const dropOffKeys = {
  all: ["drop-offs"] as const,
  mine: () => [...dropOffKeys.all, "mine"] as const,
  impact: () => [...dropOffKeys.all, "impact"] as const,
};

/** Today's room at every digester (GET /api/digesters); under the digesters' prefix so their changes refresh it too. */
export const digestersTodayKey = ["digesters", "today"] as const;
