import { z } from "zod";

export const HealthSchema = z.object({
  status: z.enum(["ok", "degraded", "down"]),
  database: z.enum(["up", "down"]),
  mail: z.enum(["up", "down"]),
  checkedAt: z.string(),
});
export type Health = z.infer<typeof HealthSchema>;
