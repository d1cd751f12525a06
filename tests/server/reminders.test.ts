import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { addDays, localDate } from "../../server/lib/clock";
import { sendCollectionReminders } from "../../server/modules/rounds/reminders.service";
import { sql } from "../helpers/db";
import { roundsScene } from "../helpers/rounds-fixtures";

const app = createApp({ requestLogging: false });
const tomorrow = () => addDays(localDate(new Date()), 1);

async function mailTo(address: string) {
  return sql<{ subject: string; text_body: string }>(
    `SELECT subject, text_body FROM outbox_emails WHERE to_address = $1 ORDER BY id`,
    [address],
  );
}

/** A planned round for `forDate` with three households, one of which then cancels. */
async function plannedRound(forDate: string) {
  const s = await roundsScene(app, forDate);
  const ids: number[] = [];
  for (const r of s.residents)
    ids.push((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).body.id);
  const plan = await s.coordinator.post("/api/collection-rounds/plan").send({ forDate });
  expect(plan.status).toBe(200);
  const round = plan.body.rounds.find((x: { volunteerId: number }) => x.volunteerId === s.volunteer.person.id);
  expect(round).toMatchObject({ stopCount: 3 });
  return { ...s, round, ids };
}

describe("day-before collection reminders", () => {
  it("e-mail tomorrow's volunteer (with the sheet's link) and each household still on the round, once", async () => {
    const { round, volunteer, residents, ids } = await plannedRound(tomorrow());
    // The third household cancels before the reminders go out: it gets none.
    await residents[2]!.client.post(`/api/collection-requests/${ids[2]}/cancel`).send({});

    const run = await sendCollectionReminders();
    expect(run.forDate).toBe(tomorrow());
    const toVolunteer = await mailTo(volunteer.person.email);
    expect(toVolunteer).toHaveLength(1);
    expect(toVolunteer[0]!.subject).toBe(`Your collection round tomorrow (${tomorrow()})`);
    expect(toVolunteer[0]!.text_body).toContain(`/rounds/${round.id}`);
    expect(toVolunteer[0]!.text_body).toContain("2 stops, 4 buckets in all");
    for (const r of residents.slice(0, 2)) {
      const mail = await mailTo(r.client.person.email);
      expect(mail.map((m) => m.subject)).toEqual([`Your food scraps are collected tomorrow (${tomorrow()})`]);
      expect(mail[0]!.text_body).toContain("2 buckets");
    }
    expect(await mailTo(residents[2]!.client.person.email)).toEqual([]);
    const [row] = await sql<{ reminded: boolean }>(
      `SELECT reminded_at IS NOT NULL AS reminded FROM collection_rounds WHERE id = $1`,
      [round.id],
    );
    expect(row!.reminded).toBe(true);

    // The next hour's run finds nothing new for this round.
    await sendCollectionReminders();
    expect(await mailTo(volunteer.person.email)).toHaveLength(1);
  });

  it("two processes running the job at once remind each round once", async () => {
    const { volunteer, residents } = await plannedRound(tomorrow());
    await Promise.all([sendCollectionReminders(), sendCollectionReminders(), sendCollectionReminders()]);
    expect(await mailTo(volunteer.person.email)).toHaveLength(1);
    for (const r of residents) expect(await mailTo(r.client.person.email)).toHaveLength(1);
  });

  it("a round the day after tomorrow is not reminded yet", async () => {
    const { volunteer, round } = await plannedRound(addDays(localDate(new Date()), 2));
    await sendCollectionReminders();
    expect(await mailTo(volunteer.person.email)).toEqual([]);
    const [row] = await sql<{ reminded: boolean }>(
      `SELECT reminded_at IS NOT NULL AS reminded FROM collection_rounds WHERE id = $1`,
      [round.id],
    );
    expect(row!.reminded).toBe(false);
  });
});
