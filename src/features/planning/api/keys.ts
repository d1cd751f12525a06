/** Keys of the planning calculators' mutations (they read nothing from the server, so no query keys). */
export const planningKeys = {
  all: ["planning"] as const,
  calc: (name: string) => [...planningKeys.all, "calc", name] as const,
};
