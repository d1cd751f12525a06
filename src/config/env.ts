/** The client's configuration: only VITE_* values, read once. */
const tileUrl = (import.meta.env.VITE_TILE_URL as string | undefined) ?? "";

export const clientEnv = {
  /** Raster tile URL template; empty = the offline basemap shipped in public/basemap. */
  tileUrl: tileUrl.trim(),
  tileAttribution: ((import.meta.env.VITE_TILE_ATTRIBUTION as string | undefined) ?? "").trim(),
} as const;
