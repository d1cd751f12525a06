import type { Feeding } from "../../../shared/schemas/feedings";
import { toCsv, type CsvColumn } from "../../lib/csv";

const columns: CsvColumn<Feeding>[] = [
  { header: "fed_on", value: (f) => f.fedOn },
  { header: "fed_at", value: (f) => f.fedAt },
  { header: "fresh_kg", value: (f) => f.freshKg },
  { header: "kg_vs", value: (f) => f.kgVs },
  { header: "water_litres", value: (f) => f.waterLitres },
  { header: "mix", value: (f) => f.mix },
  { header: "drop_off_id", value: (f) => f.dropOffId },
  { header: "household", value: (f) => f.householdName },
  { header: "override_reason", value: (f) => f.overrideReason },
  { header: "entered_by", value: (f) => f.enteredBy },
  { header: "note", value: (f) => f.note },
];

/** The feedings as CSV (text cells neutralised against formulas). */
export function feedingsCsv(rows: Feeding[]): string {
  return toCsv(columns, rows);
}
