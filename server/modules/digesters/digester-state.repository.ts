/**
 * What today's state of a digester is computed from: the digesters, their recent readings and
 * their daily loads (feedings, accepted and pending drop-offs), in three statements for any
 * number of digesters. Every table here belongs to the digester's day.
 */
import { Op, QueryTypes, type Transaction } from "sequelize";
import { models } from "../../db/models";
import type { DigesterModel } from "../../db/models/digester.model";
import { sequelize } from "../../db/sequelize";

export interface DigesterRow {
  id: number;
  name: string;
  siteDescription: string;
  status: "active" | "resting" | "offline";
  statusReason: string | null;
  lat: number;
  lng: number;
  workingVolumeM3: number;
  drumDiameterM: number | null;
  drumMassKg: number | null;
  addedMassKg: number;
  burnerLitresPerHour: number;
  heating: string;
  insulation: string;
  startedOn: string;
  gasFirstBurnedOn: string | null;
  olrRefKgVsPerM3Day: number;
  olrOverrideReason: string | null;
  targetTsPercent: number;
  bucketKgPerLitre: number;
}

export interface RecentReadingRow {
  digesterId: number;
  takenAt: Date;
  temperatureC: number | null;
  ph: number | null;
  vfaTaRatio: number | null;
}

export interface DailyLoadRow {
  digesterId: number;
  day: string;
  /** committed = fed or accepted (room promised); pending = asked for, not yet accepted. */
  kind: "committed" | "pending";
  kgVs: number;
  freshKg: number;
}

function toDigesterRow(row: DigesterModel): DigesterRow {
  const d = row;
  return {
    id: d.id,
    name: d.name,
    siteDescription: d.siteDescription,
    status: d.status,
    statusReason: d.statusReason,
    lat: d.lat,
    lng: d.lng,
    workingVolumeM3: d.workingVolumeM3,
    drumDiameterM: d.drumDiameterM,
    drumMassKg: d.drumMassKg,
    addedMassKg: d.addedMassKg,
    burnerLitresPerHour: d.burnerLitresPerHour,
    heating: d.heating,
    insulation: d.insulation,
    startedOn: d.startedOn,
    gasFirstBurnedOn: d.gasFirstBurnedOn,
    olrRefKgVsPerM3Day: d.olrRefKgVsPerM3Day,
    olrOverrideReason: d.olrOverrideReason,
    targetTsPercent: d.targetTsPercent,
    bucketKgPerLitre: d.bucketKgPerLitre,
  };
}

/** Digesters (all, or the given ids) by name, optionally locked FOR UPDATE inside a transaction. */
export async function findDigesters(
  ids: number[] | null,
  options: { transaction?: Transaction; lock?: boolean } = {},
): Promise<DigesterRow[]> {
  const rows = await models().Digester.findAll({
    where: ids ? { id: { [Op.in]: ids } } : {},
    order: [
      ["name", "ASC"],
      ["id", "ASC"],
    ],
    lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined,
    transaction: options.transaction,
  });
  return rows.map(toDigesterRow);
}

/** Readings that bear on today's budget: the last 7 days (temperature, pH, VFA/TA). */
export function findRecentReadings(ids: number[], since: Date, transaction?: Transaction) {
  // SQL kept for a hot read (every budget: GET /api/digesters, the steward's day, each drop-off):
  // hundreds of rows a request, which the model would build into instances one by one.
  return sequelize().query<RecentReadingRow>(
    `SELECT digester_id AS "digesterId", taken_at AS "takenAt", temperature_c::float8 AS "temperatureC", ph::float8 AS ph,
            vfa_ta_ratio::float8 AS "vfaTaRatio"
       FROM readings
      WHERE digester_id = ANY($ids::int[]) AND taken_at >= $since
        AND (temperature_c IS NOT NULL OR ph IS NOT NULL OR vfa_ta_ratio IS NOT NULL)
      ORDER BY taken_at`,
    { type: QueryTypes.SELECT, bind: { ids, since }, transaction },
  );
}

/**
 * Daily load per digester from `fromDay` to `toDay`: what was fed plus drop-offs accepted
 * but not yet fed (they are promised room) as "committed", and drop-offs waiting as "pending".
 */
export function findDailyLoads(ids: number[], fromDay: string, toDay: string, transaction?: Transaction) {
  // SQL: an aggregate over a UNION of feedings and drop-offs.
  return sequelize().query<DailyLoadRow>(
    `SELECT digester_id AS "digesterId", day::text AS day, kind, sum(kg_vs)::float8 AS "kgVs", sum(fresh_kg)::float8 AS "freshKg" FROM (
        SELECT digester_id, fed_on AS day, 'committed' AS kind, kg_vs, fresh_kg FROM feedings
         WHERE digester_id = ANY($ids::int[]) AND fed_on BETWEEN $fromDay AND $toDay
        UNION ALL
        SELECT digester_id, for_date AS day, CASE status WHEN 'accepted' THEN 'committed' ELSE 'pending' END, kg_vs, fresh_kg
          FROM drop_offs
         WHERE digester_id = ANY($ids::int[]) AND for_date BETWEEN $fromDay AND $toDay AND status IN ('accepted', 'pending')
      ) loads
      GROUP BY digester_id, day, kind`,
    { type: QueryTypes.SELECT, bind: { ids, fromDay, toDay }, transaction },
  );
}
