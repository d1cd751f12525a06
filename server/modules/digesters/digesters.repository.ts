import { models } from "../../db/models";
import type { PublicDigester } from "../../../shared/schemas/digester";

export async function listPublicDigesters(): Promise<PublicDigester[]> {
  const rows = await models().Digester.findAll({
    attributes: ["id", "name", "status", "workingVolumeM3", "lat", "lng", "siteDescription"],
    order: [["name", "ASC"]],
    raw: true,
  });
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    status: r.status,
    workingVolumeM3: Number(r.workingVolumeM3),
    location: { lat: r.lat, lng: r.lng },
    siteDescription: r.siteDescription,
  }));
}
