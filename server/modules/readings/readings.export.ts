import type { Reading } from "../../../shared/schemas/readings";
import { toCsv, type CsvColumn } from "../../lib/csv";

const columns: CsvColumn<Reading>[] = [
  { header: "taken_at", value: (r) => r.takenAt },
  { header: "temperature_c", value: (r) => r.temperatureC },
  { header: "ph", value: (r) => r.ph },
  { header: "vfa_ta_ratio", value: (r) => r.vfaTaRatio },
  { header: "titration_a_ml", value: (r) => r.titrationAMl },
  { header: "titration_b_ml", value: (r) => r.titrationBMl },
  { header: "gas_level_percent", value: (r) => r.gasLevelPercent },
  { header: "drum_rise_m", value: (r) => r.drumRiseM },
  { header: "gas_used_minutes", value: (r) => r.gasUsedMinutes },
  { header: "source", value: (r) => r.source },
  { header: "entered_by", value: (r) => r.enteredBy },
  { header: "note", value: (r) => r.note },
];

/** The readings as CSV (text cells neutralised against formulas). */
export function readingsCsv(rows: Reading[]): string {
  return toCsv(columns, rows);
}
