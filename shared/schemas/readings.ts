/**
 * Reading contracts: a steward's quick entry (temperature, pH, titration or the acids ratio,
 * gas-holder level or drum rise, minutes of gas used, a note), the list of readings, and the
 * sensor-log CSV upload. Request schemas are `.strict()`. Ranges follow the database checks
 * (0001-core.ts) and, for the sensor columns, issue 5 (−40…90 °C, pH 0…14, gas 0…100 %).
 */
import { z } from "zod";
import { IsoDateOrDateTimeSchema, IsoDateTimeSchema, noteText } from "./common";

export { IsoDateTimeSchema };

/** A finite number in [min, max]; every failure names the field and the allowed range. */
function numberIn(label: string, min: number, max: number, unit: string) {
  const message = `${label} must be a number from ${min} to ${max}${unit === "" ? "" : ` ${unit}`}.`;
  return z.number({ error: message }).min(min, { error: message }).max(max, { error: message });
}

/** Ranges of a reading, shared by the form, the API and the CSV import. */
export const READING_RANGES = {
  temperatureC: { min: -40, max: 90, unit: "°C" },
  ph: { min: 0, max: 14, unit: "" },
  vfaTaRatio: { min: 0, max: 5, unit: "" },
  titrationAMl: { min: 0, max: 200, unit: "mL" },
  titrationBMl: { min: 0, max: 200, unit: "mL" },
  gasLevelPercent: { min: 0, max: 100, unit: "%" },
  drumRiseM: { min: 0, max: 5, unit: "m" },
  gasUsedMinutes: { min: 0, max: 1440, unit: "minutes" },
} as const;

export const MAX_READING_NOTE_LENGTH = 500;

/** How far ahead of the server's clock a reading may be stamped (phone clocks drift). */
export const READING_CLOCK_SKEW_MS = 5 * 60_000;

/** The measurements a reading can hold; at least one must be given. */
export const READING_MEASUREMENTS = [
  "temperatureC",
  "ph",
  "vfaTaRatio",
  "titrationAMl",
  "gasLevelPercent",
  "drumRiseM",
  "gasUsedMinutes",
] as const;

const r = READING_RANGES;

/**
 * `POST /api/digesters/:id/readings`. With titration volumes A and B and no ratio, the server
 * computes the ratio by Nordmann's method (shared/domain `nordmannTitration`). `takenAt` may
 * not be in the future.
 */
export const CreateReadingSchema = z
  .object({
    takenAt: IsoDateTimeSchema,
    temperatureC: numberIn(
      "Digester temperature",
      r.temperatureC.min,
      r.temperatureC.max,
      r.temperatureC.unit,
    ).nullish(),
    ph: numberIn("pH", r.ph.min, r.ph.max, r.ph.unit).nullish(),
    vfaTaRatio: numberIn("Acids/alkalinity ratio", r.vfaTaRatio.min, r.vfaTaRatio.max, r.vfaTaRatio.unit).nullish(),
    titrationAMl: numberIn("Titration A", r.titrationAMl.min, r.titrationAMl.max, r.titrationAMl.unit).nullish(),
    titrationBMl: numberIn("Titration B", r.titrationBMl.min, r.titrationBMl.max, r.titrationBMl.unit).nullish(),
    gasLevelPercent: numberIn(
      "Gas-holder level",
      r.gasLevelPercent.min,
      r.gasLevelPercent.max,
      r.gasLevelPercent.unit,
    ).nullish(),
    drumRiseM: numberIn("Drum rise", r.drumRiseM.min, r.drumRiseM.max, r.drumRiseM.unit).nullish(),
    gasUsedMinutes: numberIn(
      "Minutes of gas used",
      r.gasUsedMinutes.min,
      r.gasUsedMinutes.max,
      r.gasUsedMinutes.unit,
    ).nullish(),
    note: noteText("The note must be text.")
      .trim()
      .max(MAX_READING_NOTE_LENGTH, `Use at most ${MAX_READING_NOTE_LENGTH} characters.`)
      .nullish()
      .transform((v) => (v ? v : undefined)),
  })
  .strict()
  .superRefine((v, ctx) => {
    const has = (k: keyof typeof v) => v[k] !== undefined && v[k] !== null;
    if (!READING_MEASUREMENTS.some((k) => has(k)) && !has("titrationBMl")) {
      ctx.addIssue({
        code: "custom",
        path: ["temperatureC"],
        message:
          "Give at least one measurement: temperature, pH, titration, gas level, drum rise or minutes of gas used.",
      });
    }
    if (has("titrationAMl") !== has("titrationBMl")) {
      ctx.addIssue({
        code: "custom",
        path: [has("titrationAMl") ? "titrationBMl" : "titrationAMl"],
        message: "Give both titration volumes: A (to pH 5.0) and B (from pH 5.0 to 4.4).",
      });
    } else if (has("titrationAMl") && !((v.titrationAMl ?? 0) > 0)) {
      ctx.addIssue({
        code: "custom",
        path: ["titrationAMl"],
        message: "Titration A must be above 0 mL: without alkalinity there is no ratio.",
      });
    }
  });
export type CreateReading = z.input<typeof CreateReadingSchema>;
export type CreateReadingParsed = z.output<typeof CreateReadingSchema>;

/** `GET /api/digesters/:id/readings?from=&to=` (and the CSV export): ISO date-times or days; default the last 60 days. */
export const ReadingRangeQuerySchema = z
  .object({
    from: IsoDateOrDateTimeSchema.optional(),
    to: IsoDateOrDateTimeSchema.optional(),
  })
  .strict();
export type ReadingRangeQuery = z.output<typeof ReadingRangeQuerySchema>;

/** Most readings one list answer carries; a longer range gets a 422 asking for a shorter one. */
export const MAX_READINGS_PER_LIST = 20_000;

export const ReadingSourceSchema = z.enum(["manual", "upload"]);

/** One reading as stewards and coordinators see it. */
export const ReadingSchema = z.object({
  id: z.number().int(),
  digesterId: z.number().int(),
  takenAt: z.string(),
  temperatureC: z.number().nullable(),
  ph: z.number().nullable(),
  vfaTaRatio: z.number().nullable(),
  titrationAMl: z.number().nullable(),
  titrationBMl: z.number().nullable(),
  gasLevelPercent: z.number().nullable(),
  drumRiseM: z.number().nullable(),
  gasUsedMinutes: z.number().nullable(),
  note: z.string().nullable(),
  source: ReadingSourceSchema,
  /** Name of the person who logged or uploaded it (null if their account is gone). */
  enteredBy: z.string().nullable(),
});
export type Reading = z.infer<typeof ReadingSchema>;
export const ReadingListSchema = z.array(ReadingSchema);

/** Sensor-log upload limits (issue 5), enforced by the upload middleware and the import. */
export const SENSOR_CSV_MAX_BYTES = 5 * 1024 * 1024;
export const SENSOR_CSV_MAX_ROWS = 50_000;

/** The sensor-log CSV's columns: `timestamp` and `temperature_c` required, the others optional. */
export const SENSOR_CSV_COLUMNS = [
  {
    name: "timestamp",
    required: true,
    description: "ISO 8601 date-time with its offset, e.g. 2026-05-03T08:30:00+01:00 or 2026-05-03T07:30:00Z",
  },
  {
    name: "temperature_c",
    required: true,
    description: "digester temperature, °C, from −40 to 90 (a dot for decimals)",
  },
  { name: "ph", required: false, description: "pH from 0 to 14; may be empty on a row" },
  {
    name: "gas_level_percent",
    required: false,
    description: "gas-holder level, % from 0 to 100; may be empty on a row",
  },
] as const;
export type SensorCsvColumn = (typeof SENSOR_CSV_COLUMNS)[number]["name"];

/** `POST /api/digesters/:id/readings/import` → 200. */
export const ReadingImportResultSchema = z.object({
  /** Rows written. */
  imported: z.number().int(),
  /** Rows whose timestamp this digester already had from an upload (or that repeat a timestamp in the file). */
  skippedDuplicates: z.number().int(),
  /** Data rows read (imported + skippedDuplicates). */
  rows: z.number().int(),
  /** First and last timestamp in the file (ISO 8601); null without rows. */
  from: z.string().nullable(),
  to: z.string().nullable(),
});
export type ReadingImportResult = z.infer<typeof ReadingImportResultSchema>;
