/**
 * `readings`, owned by the digester's day (they feed its budget): a steward's or a sensor's
 * measurements. Plain reads and writes through the Reading model; SQL where a per-kind latest
 * value (LATERAL top-1) or an ON CONFLICT upsert needs it.
 */
import { Op, QueryTypes, type Transaction } from "sequelize";
import { models } from "../../db/models";
import type { ReadingModel } from "../../db/models/reading.model";
import { sequelize } from "../../db/sequelize";
import type { Reading } from "../../../shared/schemas/readings";

export interface NewReading {
  digesterId: number;
  takenAt: Date;
  temperatureC: number | null;
  ph: number | null;
  vfaTaRatio: number | null;
  titrationAMl: number | null;
  titrationBMl: number | null;
  gasLevelPercent: number | null;
  drumRiseM: number | null;
  gasUsedMinutes: number | null;
  note: string | null;
  personId: number;
}

/** The contract's reading: who entered it by name, the time as an ISO string (UTC). */
function toReading(row: ReadingModel): Reading {
  const r = row;
  return {
    id: r.id,
    digesterId: r.digesterId,
    takenAt: new Date(r.takenAt).toISOString(),
    temperatureC: r.temperatureC,
    ph: r.ph,
    vfaTaRatio: r.vfaTaRatio,
    titrationAMl: r.titrationAMl,
    titrationBMl: r.titrationBMl,
    gasLevelPercent: r.gasLevelPercent,
    drumRiseM: r.drumRiseM,
    gasUsedMinutes: r.gasUsedMinutes,
    note: r.note,
    source: r.source,
    enteredBy: r.person?.name ?? null,
  };
}

const enteredBy = { association: "person", attributes: ["name"] };

export async function insertReading(input: NewReading): Promise<Reading> {
  return sequelize().transaction(async (transaction) => {
    const { id } = await models().Reading.create({ ...input, source: "manual" }, { transaction });
    return toReading((await models().Reading.findByPk(id, { include: [enteredBy], transaction }))!);
  });
}

/** Readings of one digester taken in [from, to], oldest first; at most `limit` rows. */
export async function listReadings(digesterId: number, from: Date, to: Date, limit: number): Promise<Reading[]> {
  const rows = await models().Reading.findAll({
    where: { digesterId, takenAt: { [Op.between]: [from, to] } },
    include: [enteredBy],
    order: [
      ["takenAt", "ASC"],
      ["id", "ASC"],
    ],
    limit,
  });
  return rows.map(toReading);
}

export interface LatestReadingRow {
  digesterId: number;
  temperatureC: number | null;
  temperatureAt: Date | null;
  ph: number | null;
  phAt: Date | null;
  vfaTaRatio: number | null;
  vfaTaAt: Date | null;
  gasLevelPercent: number | null;
  gasLevelAt: Date | null;
  lastAt: Date | null;
}

/** The latest value of each kind of reading per digester, however old (one query for all). */
export function findLatestReadings(ids: number[], transaction?: Transaction) {
  // SQL: the latest value of each kind per digester, one LATERAL top-1 per kind in one statement.
  return sequelize().query<LatestReadingRow>(
    `SELECT d.id AS "digesterId",
            t.temperature_c::float8 AS "temperatureC", t.taken_at AS "temperatureAt",
            ph.ph::float8 AS ph, ph.taken_at AS "phAt",
            v.vfa_ta_ratio::float8 AS "vfaTaRatio", v.taken_at AS "vfaTaAt",
            g.gas_level_percent::float8 AS "gasLevelPercent", g.taken_at AS "gasLevelAt",
            l.taken_at AS "lastAt"
       FROM unnest($ids::int[]) AS d(id)
       LEFT JOIN LATERAL (SELECT temperature_c, taken_at FROM readings WHERE digester_id = d.id AND temperature_c IS NOT NULL ORDER BY taken_at DESC LIMIT 1) t ON true
       LEFT JOIN LATERAL (SELECT ph, taken_at FROM readings WHERE digester_id = d.id AND ph IS NOT NULL ORDER BY taken_at DESC LIMIT 1) ph ON true
       LEFT JOIN LATERAL (SELECT vfa_ta_ratio, taken_at FROM readings WHERE digester_id = d.id AND vfa_ta_ratio IS NOT NULL ORDER BY taken_at DESC LIMIT 1) v ON true
       LEFT JOIN LATERAL (SELECT gas_level_percent, taken_at FROM readings WHERE digester_id = d.id AND gas_level_percent IS NOT NULL ORDER BY taken_at DESC LIMIT 1) g ON true
       LEFT JOIN LATERAL (SELECT taken_at FROM readings WHERE digester_id = d.id ORDER BY taken_at DESC LIMIT 1) l ON true`,
    { type: QueryTypes.SELECT, bind: { ids }, transaction },
  );
}

export interface SensorRows {
  takenAt: string[];
  temperatureC: number[];
  ph: (number | null)[];
  gasLevelPercent: (number | null)[];
}

/**
 * Writes uploaded sensor rows in one statement; rows whose (digester, timestamp) an earlier
 * upload already holds — or that repeat a timestamp within the file — are skipped by the
 * unique index `readings_upload_unique`. Returns how many were written.
 */
export async function insertSensorRows(
  t: Transaction,
  digesterId: number,
  personId: number,
  rows: SensorRows,
): Promise<number> {
  // SQL: one INSERT … SELECT from unnest with ON CONFLICT DO NOTHING on the partial unique index.
  const [result] = await sequelize().query<{ inserted: number }>(
    `WITH ins AS (
       INSERT INTO readings (digester_id, taken_at, temperature_c, ph, gas_level_percent, source, person_id)
       SELECT $digesterId, u.taken_at, u.temperature_c, u.ph, u.gas_level_percent, 'upload', $personId
         FROM unnest($takenAt::timestamptz[], $temperatureC::numeric[], $ph::numeric[], $gasLevelPercent::numeric[])
              AS u(taken_at, temperature_c, ph, gas_level_percent)
       ON CONFLICT (digester_id, taken_at) WHERE source = 'upload' DO NOTHING
       RETURNING 1)
     SELECT count(*)::int AS inserted FROM ins`,
    { type: QueryTypes.SELECT, bind: { digesterId, personId, ...rows }, transaction: t },
  );
  return result?.inserted ?? 0;
}

export interface DailyReadingRow {
  day: string;
  temperatureMinC: number | null;
  temperatureMeanC: number | null;
  temperatureMaxC: number | null;
  ph: number | null;
  gasUsedMinutes: number | null;
}

/** Readings summarised per calendar day in the neighbourhood's time zone. */
export function findDailyReadings(digesterId: number, from: Date, timeZone: string) {
  // SQL: an aggregate per local calendar day (min, mean, max, the day's last pH, a sum).
  return sequelize().query<DailyReadingRow>(
    `SELECT (taken_at AT TIME ZONE $timeZone)::date::text AS day,
            min(temperature_c)::float8 AS "temperatureMinC", avg(temperature_c)::float8 AS "temperatureMeanC",
            max(temperature_c)::float8 AS "temperatureMaxC",
            ((array_agg(ph ORDER BY taken_at DESC) FILTER (WHERE ph IS NOT NULL))[1])::float8 AS ph,
            sum(gas_used_minutes)::float8 AS "gasUsedMinutes"
       FROM readings
      WHERE digester_id = $digesterId AND taken_at >= $from
      GROUP BY 1
      ORDER BY 1`,
    { type: QueryTypes.SELECT, bind: { digesterId, from, timeZone } },
  );
}
