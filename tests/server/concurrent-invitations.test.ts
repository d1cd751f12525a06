/**
 * Invitations of one new e-mail address sent at the same moment (issue 10, point 2): the
 * unique e-mail index lets one through; the others are a 409 in plain words, and exactly one
 * person, one invitation link and one e-mail are written.
 */
import { afterEach, describe, expect, it } from "vitest";
import pg from "pg";
import { createApp } from "../../server/app";
import { signedInClient, sql, uniqueEmail } from "../helpers/db";

const app = createApp({ requestLogging: false });

const addresses: string[] = [];
// These invitations are never delivered: leave no pending e-mails for other files' outbox runs.
afterEach(async () => {
  await sql(`DELETE FROM outbox_emails WHERE to_address = ANY($1) RETURNING id`, [addresses.splice(0)]);
});

const count = async (query: string, bind: unknown[]) => Number((await sql<{ n: string }>(query, bind))[0]!.n);

/** Polls until `check` holds (PostgreSQL needs a moment to show the waiting backends). */
async function until(check: () => Promise<boolean>, timeoutMs = 15_000) {
  const start = Date.now();
  while (!(await check())) {
    if (Date.now() - start > timeoutMs) throw new Error("timed out waiting");
    await new Promise((r) => setTimeout(r, 25));
  }
}

describe("concurrent invitations of one new address", () => {
  it("when eight invitations of one new address overlap in the database, then one is 201, seven are 409 in plain words, and one e-mail is queued", async () => {
    const coordinators = await Promise.all(
      Array.from({ length: 2 }, () => signedInClient(app, { roles: ["coordinator"] })),
    );
    const email = uniqueEmail("race");
    addresses.push(email);
    // Hold the outbox so the first invitation cannot commit until every other one is inside
    // its transaction, waiting on the first one's new person row: a burst that truly overlaps.
    const blocker = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await blocker.connect();
    try {
      const blockerPid = (await blocker.query<{ pid: number }>("SELECT pg_backend_pid() AS pid")).rows[0]!.pid;
      await blocker.query("BEGIN");
      await blocker.query("LOCK TABLE outbox_emails IN SHARE ROW EXCLUSIVE MODE");
      const answers = Array.from({ length: 8 }, (_, i) =>
        coordinators[i % 2]!.post("/api/people/invitations").send({
          email,
          name: "Rin Castellow",
          roles: ["resident"],
        }),
      );
      const pending = Promise.all(answers.map((r) => r.then((res) => res)));
      // Every request is waiting on a lock: the first on the outbox, the others on the first.
      // (Asked outside the blocker's transaction, which would see one frozen snapshot.)
      await until(async () => {
        const [row] = await sql<{ n: string }>(
          `SELECT count(*) AS n FROM pg_stat_activity
            WHERE datname = current_database() AND wait_event_type = 'Lock' AND pid <> $1`,
          [blockerPid],
        );
        return row!.n === "8";
      });
      await blocker.query("COMMIT");
      const results = await pending;

      const statuses = results.map((r) => r.status).sort();
      expect(statuses).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
      for (const refused of results.filter((r) => r.status === 409)) {
        expect(refused.body.error.code).toBe("conflict");
        expect(refused.body.error.message).toMatch(/already|moment ago/i);
        expect(refused.body.error.fields.email).toEqual(expect.any(String));
      }
    } finally {
      await blocker.end();
    }
    expect(await count(`SELECT count(*) AS n FROM people WHERE email = $1`, [email])).toBe(1);
    expect(await count(`SELECT count(*) AS n FROM invitations WHERE email = $1`, [email])).toBe(1);
    expect(await count(`SELECT count(*) AS n FROM outbox_emails WHERE to_address = $1`, [email])).toBe(1);
  });

  it("when twenty identical invitations of one new address are sent at once, then one is 201, nineteen are 409 and one e-mail is queued", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const email = uniqueEmail("burst");
    addresses.push(email);
    const results = await Promise.all(
      Array.from({ length: 20 }, () =>
        coordinator.post("/api/people/invitations").send({ email, name: "Odo Fenwright", roles: ["gardener"] }),
      ),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, ...Array<number>(19).fill(409)]);
    expect(await count(`SELECT count(*) AS n FROM people WHERE email = $1`, [email])).toBe(1);
    expect(await count(`SELECT count(*) AS n FROM invitations WHERE email = $1`, [email])).toBe(1);
    expect(await count(`SELECT count(*) AS n FROM outbox_emails WHERE to_address = $1`, [email])).toBe(1);
  });

  it("when a coordinator invites the same address again with other roles a moment later, then it is a new invitation (201) that replaces the first", async () => {
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const email = uniqueEmail("change");
    addresses.push(email);
    const first = await coordinator.post("/api/people/invitations").send({ email, roles: ["gardener"] });
    const again = await coordinator.post("/api/people/invitations").send({ email, roles: ["gardener"] });
    const changed = await coordinator.post("/api/people/invitations").send({ email, roles: ["steward"] });
    expect([first.status, again.status, changed.status]).toEqual([201, 409, 201]);
    const open = await sql<{ roles: string[] }>(
      `SELECT roles FROM invitations WHERE email = $1 AND used_at IS NULL AND expires_at > now()`,
      [email],
    );
    expect(open).toEqual([{ roles: ["steward"] }]);
    expect(await count(`SELECT count(*) AS n FROM outbox_emails WHERE to_address = $1`, [email])).toBe(2);
  });
});
