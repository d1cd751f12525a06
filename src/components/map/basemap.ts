import { useEffect, useState } from "react";
import type { FeatureCollection } from "geojson";

/** The offline basemap shipped in public/basemap (streets, parks, water of the demo area). */
export const offlineBasemapUrl = "/basemap/larkmoor.geojson";

export function useOfflineBasemap(enabled: boolean) {
  const [data, setData] = useState<FeatureCollection | undefined>();
  useEffect(() => {
    if (!enabled) return;
    const controller = new AbortController();
    fetch(offlineBasemapUrl, { signal: controller.signal })
      .then((r) => (r.ok ? (r.json() as Promise<FeatureCollection>) : undefined))
      .then(setData)
      .catch(() => undefined);
    return () => controller.abort();
  }, [enabled]);
  return data;
}
