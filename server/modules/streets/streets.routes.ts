import { Router } from "express";
import { handle } from "../../middleware/handle";
import * as service from "./streets.service";

/** Public: street names from the basemap (no personal data), for placing a household by keyboard. */
export function streetsRouter() {
  const router = Router();
  router.get(
    "/streets",
    handle({}, async () => ({ body: await service.listStreets() })),
  );
  return router;
}
