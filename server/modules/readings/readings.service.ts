import { nordmannTitration } from "../../../shared/domain";
import {
  MAX_READINGS_PER_LIST,
  READING_CLOCK_SKEW_MS,
  READING_RANGES,
  type CreateReadingParsed,
  type Reading,
  type ReadingImportResult,
  type ReadingRangeQuery,
} from "../../../shared/schemas/readings";
import { sequelize } from "../../db/sequelize";
import { AppError, badRequest, notFound } from "../../lib/app-error";
import { addDays, localDate, startOfLocalDay } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { assertStewardOf } from "../../middleware/require-role";
import * as digesters from "../digesters";
import { parseSensorCsv } from "./sensor-csv";

const DEFAULT_RANGE_DAYS = 60;

async function assertDigesterExists(digesterId: number) {
  const [digester] = await digesters.findDigesters([digesterId]);
  if (!digester) throw notFound("This digester");
  return digester;
}

/**
 * Logs a reading. Titration volumes without a ratio give the ratio by Nordmann's method
 * (DOMAIN.md §5); a reading may not be stamped in the future.
 */
export async function createReading(
  caller: Caller,
  digesterId: number,
  input: CreateReadingParsed,
  now = new Date(),
): Promise<Reading> {
  assertStewardOf(caller, digesterId);
  await assertDigesterExists(digesterId);
  const takenAt = new Date(input.takenAt);
  if (takenAt.getTime() > now.getTime() + READING_CLOCK_SKEW_MS) {
    throw badRequest("The reading is stamped in the future.", {
      takenAt: "This time is in the future. Check the date and time.",
    });
  }
  if (takenAt.getTime() < Date.UTC(2000, 0, 1)) {
    throw badRequest("The reading is stamped before 2000.", { takenAt: "This time is before 2000. Check the date." });
  }
  let vfaTaRatio = input.vfaTaRatio ?? null;
  if (vfaTaRatio === null && input.titrationAMl != null && input.titrationBMl != null) {
    const ratio = nordmannTitration({ aMl: input.titrationAMl, bMl: input.titrationBMl }).ratio;
    if (ratio > READING_RANGES.vfaTaRatio.max) {
      throw badRequest("The titration gives an implausible ratio.", {
        titrationBMl: `A ${input.titrationAMl} mL and B ${input.titrationBMl} mL give a ratio of ${ratio.toFixed(2)}, above ${READING_RANGES.vfaTaRatio.max}: check both volumes.`,
      });
    }
    vfaTaRatio = Math.round(ratio * 1000) / 1000;
  }
  return digesters.insertReading({
    digesterId,
    takenAt,
    temperatureC: input.temperatureC ?? null,
    ph: input.ph ?? null,
    vfaTaRatio,
    titrationAMl: input.titrationAMl ?? null,
    titrationBMl: input.titrationBMl ?? null,
    gasLevelPercent: input.gasLevelPercent ?? null,
    drumRiseM: input.drumRiseM ?? null,
    gasUsedMinutes: input.gasUsedMinutes ?? null,
    note: input.note ?? null,
    personId: caller.id,
  });
}

/** The instants a range query covers: days count whole in the neighbourhood's time zone; default the last 60 days. */
export function readingRange(query: ReadingRangeQuery, now = new Date()): { from: Date; to: Date } {
  const asInstant = (value: string, endOfDay: boolean) =>
    value.length === 10
      ? new Date(startOfLocalDay(endOfDay ? addDays(value, 1) : value).getTime() - (endOfDay ? 1 : 0))
      : new Date(value);
  const to = query.to ? asInstant(query.to, true) : now;
  const from = query.from
    ? asInstant(query.from, false)
    : startOfLocalDay(addDays(localDate(now), -DEFAULT_RANGE_DAYS));
  if (from.getTime() > to.getTime()) {
    throw badRequest("The range ends before it starts.", { from: "Choose a start before the end." });
  }
  return { from, to };
}

/** Readings of a digester in a range, oldest first. */
export async function listReadings(
  caller: Caller,
  digesterId: number,
  query: ReadingRangeQuery,
  now = new Date(),
): Promise<Reading[]> {
  assertStewardOf(caller, digesterId);
  await assertDigesterExists(digesterId);
  const { from, to } = readingRange(query, now);
  const rows = await digesters.listReadings(digesterId, from, to, MAX_READINGS_PER_LIST + 1);
  if (rows.length > MAX_READINGS_PER_LIST) {
    throw new AppError(
      422,
      "range_too_large",
      `More than ${MAX_READINGS_PER_LIST.toLocaleString("en-GB")} readings in this range: choose a shorter one.`,
      { from: "Choose a shorter range." },
    );
  }
  return rows;
}

/**
 * Imports a sensor log: checked whole first (any problem → 4xx naming line and column, nothing
 * written), then written in one transaction, skipping timestamps an earlier upload already gave.
 */
export async function importSensorLog(
  caller: Caller,
  digesterId: number,
  file: { buffer: Buffer; originalname?: string; mimetype?: string } | undefined,
  now = new Date(),
): Promise<ReadingImportResult> {
  assertStewardOf(caller, digesterId, { coordinatorToo: false });
  await assertDigesterExists(digesterId);
  if (!file) {
    throw badRequest('Attach the sensor log as a CSV file in the form field "file".', {
      file: "Choose a CSV file to upload.",
    });
  }
  const parsed = parseSensorCsv(file.buffer, now);
  const imported = await sequelize().transaction((t) =>
    digesters.insertSensorRows(t, digesterId, caller.id, parsed.rows),
  );
  return {
    imported,
    skippedDuplicates: parsed.count - imported,
    rows: parsed.count,
    from: parsed.from,
    to: parsed.to,
  };
}
