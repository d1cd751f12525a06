/**
 * A small RFC 4180 CSV writer shared by the server's exports and the client's table export.
 *
 * Text cells that a spreadsheet would run as a formula — starting with `=`, `+`, `-`, `@`, a tab
 * or a carriage return — are neutralised with a leading apostrophe and quoted (OWASP, "CSV
 * Injection"). Numbers are written as numbers: a typed negative number such as −3.5 °C is data,
 * not a formula, and must stay readable as a number.
 */

/** A value one cell may hold. */
export type CsvValue = string | number | boolean | Date | null | undefined;

/** One column: its header and how to read the cell from a row. */
export interface CsvColumn<T> {
  readonly header: string;
  readonly value: (row: T) => CsvValue;
}

const FORMULA_START = /^[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]|^\s|\s$/;

/** The text with a leading apostrophe when it starts like a formula (`= + - @`, tab, CR). */
export function neutraliseCsvText(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** One cell, escaped: text neutralised and quoted when needed, numbers as numbers, empty for null. */
export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "true" : "false";
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? "" : value.toISOString();
  const safe = neutraliseCsvText(value);
  return safe !== value || NEEDS_QUOTES.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** A whole CSV document: the header line, then one line per row, CRLF line ends (RFC 4180). */
export function toCsv<T>(columns: readonly CsvColumn<T>[], rows: readonly T[]): string {
  const lines = [columns.map((c) => csvCell(c.header)).join(",")];
  for (const row of rows) lines.push(columns.map((c) => csvCell(c.value(row))).join(","));
  return lines.join("\r\n") + "\r\n";
}
