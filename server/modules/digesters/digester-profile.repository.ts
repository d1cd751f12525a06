import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../../db/sequelize";
import type { UpdateDigesterProfileParsed } from "../../../shared/schemas/digester";

/** Profile fields → columns (the only columns a PATCH can touch). */
const COLUMNS: Record<keyof UpdateDigesterProfileParsed, string> = {
  name: "name",
  siteDescription: "site_description",
  workingVolumeM3: "working_volume_m3",
  drumDiameterM: "drum_diameter_m",
  drumMassKg: "drum_mass_kg",
  addedMassKg: "added_mass_kg",
  burnerLitresPerHour: "burner_litres_per_hour",
  heating: "heating",
  insulation: "insulation",
  startedOn: "started_on",
  gasFirstBurnedOn: "gas_first_burned_on",
  olrRefKgVsPerM3Day: "olr_ref_kg_vs_per_m3_day",
  olrOverrideReason: "olr_override_reason",
  targetTsPercent: "target_ts_percent",
  bucketKgPerLitre: "bucket_kg_per_litre",
};

/** People who look after a digester (names only: other people's e-mail addresses stay private). */
export function findStewards(digesterId: number, transaction?: Transaction) {
  return sequelize().query<{ id: number; name: string }>(
    `SELECT p.id, p.name FROM digester_stewards s JOIN people p ON p.id = s.person_id
      WHERE s.digester_id = $digesterId AND p.status = 'active' ORDER BY p.name, p.id`,
    { type: QueryTypes.SELECT, bind: { digesterId }, transaction },
  );
}

/** Writes the given profile fields (only those present). */
export async function updateProfile(
  t: Transaction,
  digesterId: number,
  fields: UpdateDigesterProfileParsed,
): Promise<void> {
  const sets: string[] = [];
  const bind: Record<string, unknown> = { digesterId };
  for (const [key, column] of Object.entries(COLUMNS) as [keyof UpdateDigesterProfileParsed, string][]) {
    if (fields[key] === undefined) continue;
    sets.push(`${column} = $${key}`);
    bind[key] = fields[key];
  }
  if (sets.length === 0) return;
  await sequelize().query(`UPDATE digesters SET ${sets.join(", ")}, updated_at = now() WHERE id = $digesterId`, {
    type: QueryTypes.UPDATE,
    bind,
    transaction: t,
  });
}

export async function setStatus(
  t: Transaction,
  digesterId: number,
  status: string,
  reason: string | null,
): Promise<void> {
  await sequelize().query(
    `UPDATE digesters SET status = $status, status_reason = $reason, updated_at = now() WHERE id = $digesterId`,
    {
      type: QueryTypes.UPDATE,
      bind: { digesterId, status, reason },
      transaction: t,
    },
  );
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

/** The caps stewards' accepts recorded in the ledger, per day. */
export function findLedgerCaps(digesterId: number, fromDay: string, toDay: string) {
  return sequelize().query<{ day: string; capKgVs: number | null }>(
    `SELECT day::text AS day, cap_kg_vs::float8 AS "capKgVs" FROM digester_days
      WHERE digester_id = $digesterId AND day BETWEEN $fromDay AND $toDay AND cap_kg_vs IS NOT NULL`,
    { type: QueryTypes.SELECT, bind: { digesterId, fromDay, toDay } },
  );
}
