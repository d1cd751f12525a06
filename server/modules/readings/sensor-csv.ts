/**
 * Reads a sensor-log CSV (columns documented in shared/schemas/readings.ts and the README) and
 * checks it row by row before anything is written. The first problem found ends the import with
 * a 4xx naming the line (the header is line 1) and the column: a file is imported whole or not
 * at all.
 *
 * Decisions: a UTF-8 byte-order mark is refused with a clear message rather than skipped,
 * because issue 5 lists it among the failures and a stray BOM otherwise shows up as an unknown
 * first column name; the message says how to save without one. Only commas separate columns and
 * only dots mark decimals, so a file saved with semicolons is named as such, not half-read.
 * Two rows for one moment are a repeat when their values agree (kept once, counted as skipped)
 * and a contradiction when they do not: the file is refused naming both lines, because choosing
 * either row would silently drop a reading the steward may need.
 */
import { parse } from "csv-parse/sync";
import { AppError } from "../../lib/app-error";
import {
  READING_CLOCK_SKEW_MS,
  READING_RANGES,
  SENSOR_CSV_COLUMNS,
  SENSOR_CSV_MAX_ROWS,
  type SensorCsvColumn,
} from "../../../shared/schemas/readings";
import type { SensorRows } from "../digesters";

export interface ParsedSensorLog {
  rows: SensorRows;
  /** Data rows read. */
  count: number;
  from: string | null;
  to: string | null;
}

interface Where {
  line: number;
  column?: number;
  columnName?: string;
}

function csvError(
  status: number,
  code: string,
  where: Where,
  problem: string,
  extra: Record<string, string> = {},
): AppError {
  const place = `Line ${where.line}${where.column ? `, column ${where.column}${where.columnName ? ` (${where.columnName})` : ""}` : ""}`;
  const message = `${place}: ${problem}`;
  const fields: Record<string, string> = { file: message, line: String(where.line) };
  if (where.column) fields.column = String(where.column);
  if (where.columnName) fields.columnName = where.columnName;
  return new AppError(status, code, message, { ...fields, ...extra });
}

/** 1-based line and column of a character offset in the text. */
function positionOf(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i += 1) {
    if (text.charCodeAt(i) === 10) {
      line += 1;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

/** 1-based line of a byte offset in the raw file. */
function lineOfByte(buffer: Buffer, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset; i += 1) {
    if (buffer[i] === 10) {
      line += 1;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

const TIMESTAMP = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})$/;
const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
/** Control characters no text file holds (tab, LF and CR aside). */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
const EARLIEST_MS = Date.UTC(2000, 0, 1);

const columnRange: Record<Exclude<SensorCsvColumn, "timestamp">, { min: number; max: number; label: string }> = {
  temperature_c: { ...READING_RANGES.temperatureC, label: "°C" },
  ph: { ...READING_RANGES.ph, label: "" },
  gas_level_percent: { ...READING_RANGES.gasLevelPercent, label: "%" },
};

const KNOWN = new Set<string>(SENSOR_CSV_COLUMNS.map((c) => c.name));
const REQUIRED = SENSOR_CSV_COLUMNS.filter((c) => c.required).map((c) => c.name);
const HEADER_HINT = `The first line must name the columns, separated by commas: ${SENSOR_CSV_COLUMNS.map((c) => (c.required ? c.name : `${c.name} (optional)`)).join(", ")}.`;

function describeDelimiter(line: string): string | null {
  if (line.includes(";")) return "semicolons (;)";
  if (line.includes("\t")) return "tabs";
  if (line.includes("|")) return "vertical bars (|)";
  return null;
}

function parseTimestamp(raw: string, where: Where, nowMs: number): number {
  if (raw === "") throw csvError(400, "csv_value", where, "the timestamp is empty.");
  const m = TIMESTAMP.exec(raw);
  if (!m) {
    const noOffset = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?$/.test(raw);
    throw csvError(
      400,
      "csv_timestamp",
      where,
      noOffset
        ? `"${raw}" has no time-zone offset. Add one, e.g. ${raw.replace(" ", "T")}+01:00 or ${raw.replace(" ", "T")}Z.`
        : `"${clip(raw)}" is not an ISO 8601 date-time with offset, e.g. 2026-05-03T08:30:00+01:00.`,
    );
  }
  const [, y, mo, d, h, mi, s] = m;
  const ms = Date.parse(raw);
  const calendarOk =
    Number(mo) >= 1 &&
    Number(mo) <= 12 &&
    Number(d) >= 1 &&
    Number(d) <= new Date(Date.UTC(Number(y), Number(mo), 0)).getUTCDate() &&
    Number(h) <= 23 &&
    Number(mi) <= 59 &&
    (s === undefined || Number(s) <= 59);
  if (!calendarOk || Number.isNaN(ms))
    throw csvError(400, "csv_timestamp", where, `"${clip(raw)}" is not a real date and time.`);
  if (ms > nowMs + READING_CLOCK_SKEW_MS) {
    throw csvError(
      400,
      "csv_future",
      where,
      `the timestamp ${raw} is in the future. Check the sensor's clock and time zone.`,
    );
  }
  if (ms < EARLIEST_MS)
    throw csvError(400, "csv_range", where, `the timestamp ${raw} is before 2000. Check the sensor's clock.`);
  return ms;
}

function parseNumber(raw: string, column: Exclude<SensorCsvColumn, "timestamp">, where: Where): number | null {
  if (raw === "") {
    if (column === "temperature_c")
      throw csvError(400, "csv_value", where, "the temperature is empty; every row needs one.");
    return null;
  }
  if (!NUMBER.test(raw)) {
    const decimalComma = /^[+-]?\d+,\d+$/.test(raw);
    throw csvError(
      400,
      "csv_value",
      where,
      decimalComma
        ? `"${raw}" uses a comma for decimals; write ${raw.replace(",", ".")}.`
        : `"${clip(raw)}" is not a number.`,
    );
  }
  const value = Number(raw);
  const range = columnRange[column];
  if (!Number.isFinite(value) || value < range.min || value > range.max) {
    throw csvError(
      400,
      "csv_range",
      where,
      `${raw} is outside ${range.min} to ${range.max}${range.label ? ` ${range.label}` : ""}.`,
    );
  }
  return value;
}

const VALUE_COLUMNS = ["temperature_c", "ph", "gas_level_percent"] as const;
const shown = (value: number | null) => (value === null ? "empty" : String(value));

const clip = (s: string) => (s.length > 40 ? `${s.slice(0, 40)}…` : s);

/** Checks a whole sensor log and returns its rows; throws an AppError (4xx) at the first problem. */
export function parseSensorCsv(buffer: Buffer, now: Date = new Date()): ParsedSensorLog {
  if (buffer.length === 0) throw csvError(400, "csv_empty", { line: 1 }, "the file is empty.");
  if (buffer[0] === 0xef && buffer[1] === 0xbb && buffer[2] === 0xbf) {
    throw csvError(
      400,
      "csv_bom",
      { line: 1, column: 1 },
      'the file starts with a byte-order mark (BOM). Save it as plain "CSV" (not "CSV UTF-8 with BOM"), or remove the mark in a text editor.',
    );
  }
  if ((buffer[0] === 0xff && buffer[1] === 0xfe) || (buffer[0] === 0xfe && buffer[1] === 0xff)) {
    throw csvError(
      415,
      "csv_binary",
      { line: 1, column: 1 },
      "the file is UTF-16 text, not a UTF-8 CSV. Save it as plain CSV (UTF-8).",
    );
  }
  const nul = buffer.indexOf(0);
  if (nul >= 0) {
    throw csvError(415, "csv_binary", lineOfByte(buffer, nul), "this is a binary file, not a CSV text file.");
  }
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(buffer);
  } catch {
    const loose = new TextDecoder("utf-8").decode(buffer);
    throw csvError(
      415,
      "csv_binary",
      positionOf(loose, Math.max(0, loose.indexOf("\uFFFD"))),
      "the file is not UTF-8 text (a binary file, or another encoding).",
    );
  }
  const control = CONTROL.exec(text);
  if (control)
    throw csvError(415, "csv_binary", positionOf(text, control.index), "this is a binary file, not a CSV text file.");
  if (text.trim() === "") throw csvError(400, "csv_empty", { line: 1 }, "the file has no header and no rows.");

  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  if (!firstLine.includes(",")) {
    const other = describeDelimiter(firstLine);
    if (other)
      throw csvError(
        400,
        "csv_delimiter",
        { line: 1, column: 1 },
        `the columns are separated by ${other}; use commas (,). ${HEADER_HINT}`,
      );
  }

  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      delimiter: ",",
      relax_column_count: true,
      skip_empty_lines: true,
      info: true,
    }) as unknown as typeof records;
  } catch (err) {
    const e = err as { code?: string; lines?: number; message?: string };
    const line = typeof e.lines === "number" ? e.lines : 1;
    const problem =
      e.code === "CSV_QUOTE_NOT_CLOSED"
        ? 'a quote (") is opened and never closed.'
        : "the line is not valid CSV (check the quotes).";
    throw csvError(400, "csv_malformed", { line }, problem);
  }

  const header = records[0]!;
  const names = header.record.map((n) => n.trim().toLowerCase());
  const headerLine = header.info.lines;
  if (
    names.length > 0 &&
    (TIMESTAMP.test(header.record[0]!.trim()) ||
      NUMBER.test(header.record[0]!.trim()) ||
      /^\d{4}-\d{2}-\d{2}/.test(header.record[0]!.trim()))
  ) {
    throw csvError(
      400,
      "csv_header_missing",
      { line: headerLine },
      `the header is missing: this line holds values. ${HEADER_HINT}`,
    );
  }
  const seen = new Map<string, number>();
  for (const [i, name] of names.entries()) {
    const where = { line: headerLine, column: i + 1 };
    if (name === "") throw csvError(400, "csv_header_unknown", where, `column ${i + 1} has no name. ${HEADER_HINT}`);
    if (seen.has(name)) {
      throw csvError(
        400,
        "csv_header_duplicate",
        { ...where, columnName: name },
        `the column "${name}" appears twice (columns ${seen.get(name)! + 1} and ${i + 1}).`,
      );
    }
    if (!KNOWN.has(name)) {
      throw csvError(
        400,
        "csv_header_unknown",
        { ...where, columnName: clip(name) },
        `"${clip(header.record[i]!.trim())}" is not a column Hearthloop reads. ${HEADER_HINT}`,
      );
    }
    seen.set(name, i);
  }
  for (const required of REQUIRED) {
    if (!seen.has(required)) {
      throw csvError(
        400,
        "csv_header_missing",
        { line: headerLine },
        `the header has no "${required}" column. ${HEADER_HINT}`,
      );
    }
  }
  const col = (name: SensorCsvColumn) => seen.get(name);
  const tsCol = col("timestamp")!;
  const tempCol = col("temperature_c")!;
  const phCol = col("ph");
  const gasCol = col("gas_level_percent");

  const nowMs = now.getTime();
  const rows: SensorRows = { takenAt: [], temperatureC: [], ph: [], gasLevelPercent: [] };
  // Each moment read so far (epoch ms): its line and values, to tell a repeat from a contradiction.
  const moments = new Map<number, { line: number; values: (number | null)[] }>();
  let read = 0;
  let minMs = Number.POSITIVE_INFINITY;
  let maxMs = Number.NEGATIVE_INFINITY;
  for (let r = 1; r < records.length; r += 1) {
    const { record, info } = records[r]!;
    const line = info.lines;
    const cells = record.map((c) => c.trim());
    if (cells.every((c) => c === "")) continue;
    if (cells.length === names.length && cells.every((c, i) => c.toLowerCase() === names[i])) {
      throw csvError(
        400,
        "csv_header_duplicate",
        { line },
        "this line repeats the header. Remove it (files joined together?).",
      );
    }
    if (read >= SENSOR_CSV_MAX_ROWS) {
      throw csvError(
        413,
        "too_many_rows",
        { line },
        `the file has more than ${SENSOR_CSV_MAX_ROWS.toLocaleString("en-GB")} rows. Split it into smaller files.`,
      );
    }
    if (cells.length !== names.length) {
      const other = describeDelimiter(record.join(","));
      throw csvError(
        400,
        other ? "csv_delimiter" : "csv_columns",
        { line, column: Math.min(cells.length, names.length) },
        other
          ? `the values are separated by ${other}; use commas (,).`
          : `this line has ${cells.length} value${cells.length === 1 ? "" : "s"}, the header names ${names.length} columns.`,
      );
    }
    const at = (i: number | undefined, name: SensorCsvColumn): Where => ({
      line,
      column: (i ?? 0) + 1,
      columnName: name,
    });
    const ms = parseTimestamp(cells[tsCol]!, at(tsCol, "timestamp"), nowMs);
    const temperature = parseNumber(cells[tempCol]!, "temperature_c", at(tempCol, "temperature_c"))!;
    const ph = phCol === undefined ? null : parseNumber(cells[phCol]!, "ph", at(phCol, "ph"));
    const gas =
      gasCol === undefined ? null : parseNumber(cells[gasCol]!, "gas_level_percent", at(gasCol, "gas_level_percent"));
    read += 1;
    const values = [temperature, ph, gas];
    const earlier = moments.get(ms);
    if (earlier) {
      const differences = VALUE_COLUMNS.flatMap((name, i) =>
        earlier.values[i] === values[i]
          ? []
          : [`${name} ${shown(earlier.values[i]!)} on line ${earlier.line}, ${shown(values[i]!)} here`],
      );
      if (differences.length > 0) {
        throw csvError(
          400,
          "csv_conflict",
          at(tsCol, "timestamp"),
          `the timestamp ${cells[tsCol]} is the same moment as line ${earlier.line}, with other values (${differences.join("; ")}). Keep the right one of the two lines.`,
          { otherLine: String(earlier.line) },
        );
      }
      // The same reading twice (files joined together?): kept once, counted as skipped.
      continue;
    }
    moments.set(ms, { line, values });
    rows.takenAt.push(new Date(ms).toISOString());
    rows.temperatureC.push(temperature);
    rows.ph.push(ph);
    rows.gasLevelPercent.push(gas);
    if (ms < minMs) minMs = ms;
    if (ms > maxMs) maxMs = ms;
  }
  if (rows.takenAt.length === 0)
    throw csvError(400, "csv_empty", { line: headerLine }, "the file has a header but no rows.");
  return {
    rows,
    count: read,
    from: new Date(minMs).toISOString(),
    to: new Date(maxMs).toISOString(),
  };
}
