import { z } from "zod";

export const DigesterStatusSchema = z.enum(["active", "resting", "offline"]);
export type DigesterStatus = z.infer<typeof DigesterStatusSchema>;

export const LatLngSchema = z.object({
  lat: z.number().min(-90).max(90),
  lng: z.number().min(-180).max(180),
});

/** What anyone may see of a digester: where it is and whether it is taking scraps. */
export const PublicDigesterSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  status: DigesterStatusSchema,
  workingVolumeM3: z.number(),
  location: LatLngSchema,
  siteDescription: z.string(),
});
export type PublicDigester = z.infer<typeof PublicDigesterSchema>;
export const PublicDigesterListSchema = z.array(PublicDigesterSchema);
