/**
 * `digesters` and `digester_stewards`, owned by the digester's day: a digester's profile and
 * status, and who looks after it. Plain reads and writes through the models; the stewards are
 * read through the Digester ↔ Person many-to-many.
 */
import { type Transaction } from "sequelize";
import type { PublicDigester, UpdateDigesterProfileParsed } from "../../../shared/schemas/digester";
import { models } from "../../db/models";

export async function listPublicDigesters(): Promise<PublicDigester[]> {
  const rows = await models().Digester.findAll({
    attributes: ["id", "name", "status", "workingVolumeM3", "lat", "lng", "siteDescription"],
    order: [["name", "ASC"]],
  });
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    status: r.status,
    workingVolumeM3: r.workingVolumeM3,
    location: { lat: r.lat, lng: r.lng },
    siteDescription: r.siteDescription,
  }));
}

export interface DigesterPoint {
  id: number;
  name: string;
  siteDescription: string;
  lat: number;
  lng: number;
  status: "active" | "resting" | "offline";
}

/** Every digester's name, place and status (a neighbourhood has a handful), or one of them. */
export async function digesterPoints(
  options: { id?: number; transaction?: Transaction } = {},
): Promise<DigesterPoint[]> {
  const rows = await models().Digester.findAll({
    attributes: ["id", "name", "siteDescription", "lat", "lng", "status"],
    where: options.id === undefined ? {} : { id: options.id },
    order: [["id", "ASC"]],
    transaction: options.transaction,
  });
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    siteDescription: r.siteDescription,
    lat: r.lat,
    lng: r.lng,
    status: r.status,
  }));
}

/** Locks a digester's row until the transaction ends; false when there is none. */
export async function lockDigester(transaction: Transaction, id: number): Promise<boolean> {
  const row = await models().Digester.findByPk(id, { attributes: ["id"], lock: transaction.LOCK.UPDATE, transaction });
  return row !== null;
}

/** Writes the given profile fields (only those present). */
export async function updateProfile(
  transaction: Transaction,
  digesterId: number,
  fields: UpdateDigesterProfileParsed,
): Promise<void> {
  const present = Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined));
  if (Object.keys(present).length === 0) return;
  await models().Digester.update(present, { where: { id: digesterId }, transaction });
}

export async function setStatus(
  transaction: Transaction,
  digesterId: number,
  status: "active" | "resting" | "offline",
  reason: string | null,
): Promise<void> {
  await models().Digester.update({ status, statusReason: reason }, { where: { id: digesterId }, transaction });
}

/**
 * People who look after a digester, by name (names only: other people's e-mail addresses stay
 * private); only active accounts unless `everyone`.
 */
export async function findStewards(
  digesterId: number,
  options: { transaction?: Transaction; everyone?: boolean } = {},
): Promise<{ id: number; name: string }[]> {
  const rows = await models().Person.findAll({
    attributes: ["id", "name"],
    where: options.everyone ? {} : { status: "active" },
    include: [
      { association: "stewardedDigesters", attributes: [], where: { id: digesterId }, through: { attributes: [] } },
    ],
    order: [
      ["name", "ASC"],
      ["id", "ASC"],
    ],
    transaction: options.transaction,
  });
  return rows.map((p) => ({ id: p.id, name: p.name }));
}

/** Makes exactly these people the digester's stewards. */
export async function replaceStewards(
  transaction: Transaction,
  digesterId: number,
  personIds: number[],
): Promise<void> {
  await models().DigesterSteward.destroy({ where: { digesterId }, transaction });
  if (personIds.length === 0) return;
  await models().DigesterSteward.bulkCreate(
    personIds.map((personId) => ({ digesterId, personId })),
    { transaction },
  );
}

/** Ends every steward duty of a person (the steward role was taken away). */
export async function removeStewardships(transaction: Transaction, personId: number): Promise<void> {
  await models().DigesterSteward.destroy({ where: { personId }, transaction });
}
