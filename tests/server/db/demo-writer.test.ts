import { QueryTypes, type Transaction } from "sequelize";
import { afterEach, describe, expect, it } from "vitest";
import { sequelize } from "../../../server/db/sequelize";
import { hashPassword } from "../../../server/lib/password";
import { DEMO_PASSWORD, DEMO_SIGN_IN_EMAILS } from "../../../server/db/seeders/demo";
import { buildDemoNeighbourhood } from "../../../server/db/seeders/demo/neighbourhood";
import { writeDemo } from "../../../server/db/seeders/demo/writer";

// The writer runs inside a transaction this test rolls back, so the demo never stays in the
// shared test database (its sign-in e-mails are unique there).
const TODAY = new Date(2026, 2, 14, 12, 0);
const TABLES = [
  "digesters",
  "households",
  "people",
  "drop_offs",
  "feedings",
  "readings",
  "collection_requests",
  "fertiliser_claims",
] as const;

let open: Transaction | undefined;
afterEach(async () => {
  await open?.rollback();
  open = undefined;
});

async function rows<T extends object>(query: string, transaction?: Transaction, bind: unknown[] = []) {
  return sequelize().query<T>(query, { bind, transaction, type: QueryTypes.SELECT });
}

async function maxIds(transaction?: Transaction): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const table of TABLES) {
    const [row] = await rows<{ n: number }>(`SELECT coalesce(max(id), 0)::int AS n FROM ${table}`, transaction);
    out[table] = row?.n ?? 0;
  }
  return out;
}

describe("the demo writer", () => {
  it("when the built demo is written, then every record is there with its links and the feedings take in the drop-offs' masses", async () => {
    const demo = buildDemoNeighbourhood(TODAY);
    const before = await maxIds();
    open = await sequelize().transaction();
    const t = open;
    await writeDemo(demo, TODAY, await hashPassword(DEMO_PASSWORD), t);

    const count = async (table: (typeof TABLES)[number]) =>
      (await rows<{ n: number }>(`SELECT count(*)::int AS n FROM ${table} WHERE id > $1`, t, [before[table]]))[0]?.n;
    expect(await count("digesters")).toBe(demo.digesters.length);
    expect(await count("households")).toBe(demo.households.length);
    expect(await count("people")).toBe(demo.people.length);
    expect(await count("drop_offs")).toBe(demo.dropOffs.length);
    expect(await count("readings")).toBe(demo.readings.length);
    expect(await count("collection_requests")).toBe(demo.collectionRequests.length);
    expect(await count("fertiliser_claims")).toBe(demo.fertiliserClaims.length);

    // Whoever brought a bucket lives in its household.
    const strangers = await rows(
      `SELECT d.id FROM drop_offs d JOIN people p ON p.id = d.person_id
        WHERE d.id > $1 AND p.household_id IS DISTINCT FROM d.household_id`,
      t,
      [before.drop_offs],
    );
    expect(strangers).toEqual([]);

    // Each fed drop-off is taken in by exactly one feeding of its digester and day; no other is.
    const links = await rows<{ status: string; n: number; same_day: boolean }>(
      `SELECT d.status, count(f.id)::int AS n, bool_and(f.digester_id = d.digester_id AND f.fed_on = d.for_date) AS same_day
         FROM drop_offs d LEFT JOIN feedings f ON f.drop_off_id = d.id
        WHERE d.id > $1 GROUP BY d.id, d.status`,
      t,
      [before.drop_offs],
    );
    for (const link of links) {
      expect(link.n).toBe(link.status === "fed" ? 1 : 0);
      if (link.n > 0) expect(link.same_day).toBe(true);
    }
    expect(links.filter((link) => link.status === "fed")).toHaveLength(
      demo.dropOffs.filter((d) => d.status === "fed").length,
    );

    // A day's feeding, split into one row per drop-off (plus any remainder), adds up to the demo's figures.
    const days = await rows<{ name: string; fed_on: string; n: number; fresh_kg: number; water_litres: number }>(
      `SELECT g.name, f.fed_on::text AS fed_on, count(*)::int AS n,
              sum(f.fresh_kg)::float8 AS fresh_kg, sum(f.water_litres)::float8 AS water_litres
         FROM feedings f JOIN digesters g ON g.id = f.digester_id
        WHERE g.id > $1 GROUP BY g.name, f.fed_on`,
      t,
      [before.digesters],
    );
    expect(days).toHaveLength(demo.feedings.length);
    const nameOf = new Map(demo.digesters.map((d) => [d.key, d.name]));
    const byDay = new Map(days.map((day) => [`${day.name}|${day.fed_on}`, day]));
    for (const feeding of demo.feedings) {
      const day = byDay.get(`${nameOf.get(feeding.digesterKey)}|${feeding.fedOn}`);
      const n = day?.n ?? NaN;
      // The demo keeps a day's kg to 0.1 (a remainder row is added only above 0.05 kg); each row
      // keeps kg to 0.001 and litres to 0.01, so each row may round off half of that.
      expect(Math.abs((day?.fresh_kg ?? NaN) - feeding.freshKg)).toBeLessThanOrEqual(0.05 + 0.0005 * n + 1e-9);
      expect(Math.abs((day?.water_litres ?? NaN) - feeding.waterLitres)).toBeLessThanOrEqual(0.005 * n + 1e-9);
    }

    // The demo steward looks after the digesters the demo gives them, and only those.
    const stewarded = await rows<{ name: string }>(
      `SELECT g.name FROM digester_stewards s JOIN people p ON p.id = s.person_id JOIN digesters g ON g.id = s.digester_id
        WHERE p.email = $1 AND g.id > $2 ORDER BY g.name`,
      t,
      [DEMO_SIGN_IN_EMAILS.steward, before.digesters],
    );
    const steward = demo.people.find((p) => p.email === DEMO_SIGN_IN_EMAILS.steward);
    expect(stewarded.map((s) => s.name)).toEqual(
      demo.digesters
        .filter((d) => steward && d.stewardKeys.includes(steward.key))
        .map((d) => d.name)
        .sort(),
    );

    await t.rollback();
    open = undefined;
    expect(await maxIds()).toEqual(before);
    const left = await rows(`SELECT id FROM people WHERE email = $1`, undefined, [DEMO_SIGN_IN_EMAILS.resident]);
    expect(left).toEqual([]);
  });
});
