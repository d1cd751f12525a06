/** Account answers are the signed-in person (the auth feature's /me); nothing is cached here. */
export const accountKeys = {
  all: ["account"] as const,
};
