/**
 * Seeds the invented Larkmoor demo neighbourhood into an empty database (demo mode only).
 * All-or-nothing: one transaction.
 *
 * The folder, by what each file holds:
 * - `neighbourhood.ts` puts the demo together ({@link buildDemoNeighbourhood}, pure);
 * - `place.ts` the map: centre, bounds, streets, parks, stream, blocks and the offline basemap,
 *   drawn with `geometry.ts`;
 * - `digesters.ts` the four digesters; `people.ts` the people and households; `keys.ts` the
 *   fixed keys that link them;
 * - `conditions.ts` the simulated weather and digester conditions (cold spell, acid episode);
 * - `scraps.ts` what goes in a bucket; `drop-offs.ts`, `feedings.ts` and `readings.ts` the
 *   history; `collections.ts` the collection requests; `fertiliser.ts` the gardener's claims;
 * - `clock.ts` the demo's days, `random.ts` its seeded streams, `numbers.ts` small helpers;
 * - `types.ts` the records the generator returns; `writer.ts` the steps that insert them, with
 *   `write-context.ts` what each step gets.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "../../sequelize";
import { hashPassword } from "../../../lib/password";
import { buildDemoNeighbourhood } from "./neighbourhood";
import { writeDemo } from "./writer";

export { DEMO_SIGN_IN_EMAILS } from "./people";

export const DEMO_PASSWORD = "hearthloop-demo";

/** Seeds when no person exists yet; returns whether it seeded. */
export async function seedDemoIfEmpty(today: Date): Promise<boolean> {
  const db = sequelize();
  const [row] = await db.query<{ n: number }>("SELECT count(*)::int AS n FROM people", { type: QueryTypes.SELECT });
  if ((row?.n ?? 0) > 0) return false;
  const demo = buildDemoNeighbourhood(today);
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (transaction) => {
    // Two concurrent first starts must not both seed.
    await db.query("LOCK TABLE people IN EXCLUSIVE MODE", { transaction });
    const [again] = await db.query<{ n: number }>("SELECT count(*)::int AS n FROM people", {
      type: QueryTypes.SELECT,
      transaction,
    });
    if ((again?.n ?? 0) > 0) return;
    await writeDemo(demo, today, passwordHash, transaction);
  });
  return true;
}
