import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { Reading } from "../../../shared/schemas/readings";

// NUMERIC columns are cast to float8: the driver returns NUMERIC as strings.
const readingColumns = `
  r.id::int AS id, r.digester_id AS "digesterId", r.taken_at AS "takenAt",
  r.temperature_c::float8 AS "temperatureC", r.ph::float8 AS ph, r.vfa_ta_ratio::float8 AS "vfaTaRatio",
  r.titration_a_ml::float8 AS "titrationAMl", r.titration_b_ml::float8 AS "titrationBMl",
  r.gas_level_percent::float8 AS "gasLevelPercent", r.drum_rise_m::float8 AS "drumRiseM",
  r.gas_used_minutes::float8 AS "gasUsedMinutes", r.note, r.source, p.name AS "enteredBy"`;

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

/** The driver gives timestamptz as a Date; the contract carries ISO strings (UTC). */
function normalise(row: Reading): Reading {
  return { ...row, takenAt: new Date(row.takenAt).toISOString() };
}

export async function insertReading(input: NewReading): Promise<Reading> {
  const [row] = await sequelize().query<Reading>(
    `WITH r AS (
       INSERT INTO readings (digester_id, taken_at, temperature_c, ph, vfa_ta_ratio, titration_a_ml, titration_b_ml,
                             gas_level_percent, drum_rise_m, gas_used_minutes, note, source, person_id)
       VALUES ($digesterId, $takenAt, $temperatureC, $ph, $vfaTaRatio, $titrationAMl, $titrationBMl,
               $gasLevelPercent, $drumRiseM, $gasUsedMinutes, $note, 'manual', $personId)
       RETURNING *)
     SELECT ${readingColumns} FROM r LEFT JOIN people p ON p.id = r.person_id`,
    { type: QueryTypes.SELECT, bind: { ...input } },
  );
  return normalise(row!);
}

/** Readings of one digester taken in [from, to], oldest first; at most `limit` rows. */
export async function listReadings(digesterId: number, from: Date, to: Date, limit: number): Promise<Reading[]> {
  const rows = await sequelize().query<Reading>(
    `SELECT ${readingColumns} FROM readings r LEFT JOIN people p ON p.id = r.person_id
      WHERE r.digester_id = $digesterId AND r.taken_at BETWEEN $from AND $to
      ORDER BY r.taken_at, r.id
      LIMIT $limit`,
    { type: QueryTypes.SELECT, bind: { digesterId, from, to, limit } },
  );
  return rows.map(normalise);
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
