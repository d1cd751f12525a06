/**
 * What today's state of a digester is computed from: the digesters, their recent readings and
 * their daily loads (feedings, accepted and pending drop-offs), in three statements for any
 * number of digesters. Every table here belongs to the digester's day.
 */
import { QueryTypes, type Transaction } from "sequelize";
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
  heating: "none" | "solar" | "electric" | "waste-heat";
  insulation: "none" | "partial" | "full";
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

const digesterColumns = `
  id, name, site_description AS "siteDescription", status, status_reason AS "statusReason", lat, lng,
  working_volume_m3::float8 AS "workingVolumeM3", drum_diameter_m::float8 AS "drumDiameterM",
  drum_mass_kg::float8 AS "drumMassKg", added_mass_kg::float8 AS "addedMassKg",
  burner_litres_per_hour::float8 AS "burnerLitresPerHour", heating, insulation,
  started_on::text AS "startedOn", gas_first_burned_on::text AS "gasFirstBurnedOn",
  olr_ref_kg_vs_per_m3_day::float8 AS "olrRefKgVsPerM3Day", olr_override_reason AS "olrOverrideReason",
  target_ts_percent::float8 AS "targetTsPercent", bucket_kg_per_litre::float8 AS "bucketKgPerLitre"`;

/** Digesters (all, or the given ids) by name, optionally locked FOR UPDATE inside a transaction. */
export function findDigesters(
  ids: number[] | null,
  options: { transaction?: Transaction; lock?: boolean } = {},
): Promise<DigesterRow[]> {
  // SQL kept for a hot read (GET /api/digesters and every budget) and the row lock: through the
  // Digester model GET /api/digesters ran at about four fifths of the rate in `npm run bench:api`.
  const where = ids ? "WHERE id = ANY($ids::int[])" : "";
  return sequelize().query<DigesterRow>(
    `SELECT ${digesterColumns} FROM digesters ${where} ORDER BY name, id ${options.lock ? "FOR UPDATE" : ""}`,
    { type: QueryTypes.SELECT, bind: ids ? { ids } : undefined, transaction: options.transaction },
  );
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
