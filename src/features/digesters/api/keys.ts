export const digesterKeys = {
  all: ["digesters"] as const,
  public: () => [...digesterKeys.all, "public"] as const,
};
