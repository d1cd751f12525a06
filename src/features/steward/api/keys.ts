/** Query keys of the steward's day; every steward mutation invalidates `stewardKeys.all`. */
export const stewardKeys = {
  all: ["steward"] as const,
  today: () => [...stewardKeys.all, "today"] as const,
};
