import { Router } from "express";
import { handle } from "../../middleware/handle";
import { requireRole, requireStewardOf } from "../../middleware/require-role";
import { singleFileUpload } from "../../middleware/upload";
import { csvDownload } from "../../lib/csv";
import { DigesterIdParamsSchema } from "../../../shared/schemas/people";
import { CreateReadingSchema, ReadingRangeQuerySchema, SENSOR_CSV_MAX_BYTES } from "../../../shared/schemas/readings";
import * as service from "./readings.service";
import { readingsCsv } from "./readings.export";

/** Readings: stewards of the digester (and coordinators) log and read them; only its stewards upload sensor logs. */
export function readingsRouter() {
  const router = Router();
  const stewards = requireRole("steward", "coordinator");

  router.post(
    "/digesters/:id/readings",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, body: CreateReadingSchema }, async ({ params, body, caller }) => ({
      status: 201,
      body: await service.createReading(caller!, params.id, body),
    })),
  );

  router.get(
    "/digesters/:id/readings",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, query: ReadingRangeQuerySchema }, async ({ params, query, caller }) => ({
      body: await service.listReadings(caller!, params.id, query),
    })),
  );

  router.get(
    "/digesters/:id/readings.csv",
    stewards,
    requireStewardOf("id"),
    handle({ params: DigesterIdParamsSchema, query: ReadingRangeQuerySchema }, async ({ params, query, caller }) => {
      const rows = await service.listReadings(caller!, params.id, query);
      return csvDownload(`digester-${params.id}-readings.csv`, readingsCsv(rows));
    }),
  );

  // The guard runs before multer, so only the digester's own stewards can make the server read a file.
  router.post(
    "/digesters/:id/readings/import",
    requireRole("steward"),
    requireStewardOf("id", { coordinatorToo: false }),
    singleFileUpload({ field: "file", maxBytes: SENSOR_CSV_MAX_BYTES, maxLabel: "5 MB" }),
    handle({ params: DigesterIdParamsSchema }, async ({ params, caller, file }) => ({
      body: await service.importSensorLog(caller!, params.id, file),
    })),
  );

  return router;
}
