/**
 * The coordinator's board in Chromium (demo neighbourhood): run a proposal, pin a household,
 * apply it, and the moved resident's e-mail arrives in maildev; the map has a table beside it;
 * collection rounds are planned and a round sheet opened. axe-core on each page and state.
 */
import { mkdirSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { DEMO_PASSWORD, DEMO_SIGN_IN_EMAILS } from "../../server/db/seeders/demo";
import { deliverDueEmails } from "../../server/modules/outbox/outbox.service";
import { axeViolations, startHarness, type BrowserHarness } from "../helpers/browser";
import { sql } from "../helpers/db";
import { ensureMailDev, mailsTo, waitForMails } from "../helpers/mail";

let h: BrowserHarness;
let mail: { stop: () => Promise<void> };

beforeAll(async () => {
  mail = await ensureMailDev();
  h = await startHarness();
  mkdirSync("test-results", { recursive: true });
});

afterAll(async () => {
  await h?.close();
  await mail?.stop();
});

async function signIn(page: Page, email: string, next: string) {
  await h.context.clearCookies();
  await page.goto(`${h.baseUrl}/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
}

describe("the coordinator's assignment board", () => {
  it("runs a proposal, pins a household, applies it, and the moved resident is e-mailed", async () => {
    // The demo resident's household is put on the farthest digester, so the best plan moves it back.
    const [home] = await sql<{ id: number; name: string; lat: number; lng: number }>(
      `SELECT h.id, h.name, h.lat, h.lng FROM people p JOIN households h ON h.id = p.household_id WHERE p.email = $1`,
      [DEMO_SIGN_IN_EMAILS.resident],
    );
    const [far] = await sql<{ id: number }>(
      `SELECT id FROM digesters WHERE status = 'active' ORDER BY (lat - $1) ^ 2 + ((lng - $2) * cos(radians($1))) ^ 2 DESC LIMIT 1`,
      [home!.lat, home!.lng],
    );
    await sql(`UPDATE households SET assigned_digester_id = $2, assignment_pinned = false WHERE id = $1`, [
      home!.id,
      far!.id,
    ]);
    const mailsBefore = (await mailsTo(DEMO_SIGN_IN_EMAILS.resident)).length;

    const page = await h.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signIn(page, DEMO_SIGN_IN_EMAILS.coordinator, "/coordinator");
    await page.getByRole("heading", { level: 1, name: "Assignments" }).waitFor();
    expect(
      await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Assignments" }).count(),
    ).toBe(1);
    expect(await axeViolations(page)).toEqual([]);

    // A walking limit that is not a distance is named under its field, and nothing runs.
    const walk = page.getByLabel("Longest walk allowed (metres, optional)");
    await walk.fill("far");
    await page.getByRole("button", { name: "Run a proposal" }).click();
    await page.getByText("Maximum walk must be a number of metres.").waitFor();
    expect(await walk.getAttribute("aria-invalid")).toBe("true");
    expect(await axeViolations(page)).toEqual([]);
    await walk.fill("");

    await page.getByRole("button", { name: "Run a proposal" }).click();
    const table = page.getByRole("region", { name: "Households and their proposed digesters" });
    await table.waitFor();
    // The map's text alternative: the same assignments as a table, and the region names it.
    await page.getByRole("region", { name: /Map of the proposal/ }).waitFor();
    const row = table.getByRole("row").filter({ hasText: home!.name });
    await row.waitFor();
    await expect(row.getByText("Moves").count()).resolves.toBe(1);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/coordinator-proposal.png", fullPage: true });

    // Pin it to the proposed digester: the proposal runs again with the pin.
    await row.getByRole("button", { name: new RegExp(`^Pin ${home!.name}`) }).click();
    await table
      .getByRole("row")
      .filter({ hasText: home!.name })
      .getByRole("button", { name: new RegExp(`^Unpin ${home!.name}`) })
      .waitFor();

    await page.getByRole("button", { name: /^Apply \d+ changes?$/ }).click();
    const dialog = page.getByRole("dialog", { name: "Apply this proposal?" });
    await dialog.waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await dialog.getByRole("button", { name: "Apply changes" }).click();
    await page.getByText(/^Applied \d+ changes?;/).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/coordinator-applied.png", fullPage: true });

    const [after] = await sql<{ assigned_digester_id: number; assignment_pinned: boolean }>(
      `SELECT assigned_digester_id, assignment_pinned FROM households WHERE id = $1`,
      [home!.id],
    );
    expect(after!.assigned_digester_id).not.toBe(far!.id);
    expect(after!.assignment_pinned).toBe(true);

    await deliverDueEmails();
    const mails = await waitForMails(DEMO_SIGN_IN_EMAILS.resident, mailsBefore + 1);
    const newest = mails[mails.length - 1]!;
    expect(newest.subject).toMatch(/^Your digester is now /);
    expect(newest.text).toContain("Why:");
    await page.close();
  });
});

describe("collection rounds", () => {
  it("the coordinator plans a day's rounds and opens a printable round sheet", async () => {
    const [day] = await sql<{ d: string }>(
      `SELECT to_char(for_date, 'YYYY-MM-DD') AS d FROM collection_requests WHERE for_date >= current_date AND status IN ('open', 'planned')
        ORDER BY for_date LIMIT 1`,
    );
    const page = await h.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signIn(page, DEMO_SIGN_IN_EMAILS.coordinator, "/rounds");
    await page.getByRole("heading", { level: 1, name: "Collection rounds" }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    // The demo seeds collection requests for the coming days (server/db/seeders/demo/collections.ts).
    expect(day).toBeDefined();
    await page.getByLabel("Day to plan").fill(day!.d);
    await page.getByRole("button", { name: "Plan rounds" }).click();
    await page.getByText(new RegExp(`^Planned \\d+ rounds? for ${day!.d}`)).waitFor();
    const rounds = page.getByRole("region", { name: "Collection rounds" });
    await rounds.waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/rounds-planned.png", fullPage: true });
    await rounds.getByRole("link").first().click();
    await page.getByRole("region", { name: "Stops in order, with addresses" }).waitFor();
    await page.getByRole("region", { name: /Map of the round/ }).waitFor();
    const href = await page.getByRole("link", { name: "Download the route (GeoJSON)" }).getAttribute("href");
    const geo = await page.evaluate(async (u) => {
      const res = await fetch(u!, { credentials: "same-origin" });
      return { type: res.headers.get("content-type"), body: (await res.json()) as { type: string } };
    }, href);
    expect(geo.type).toMatch(/^application\/geo\+json/);
    expect(geo.body.type).toBe("FeatureCollection");
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/round-sheet.png", fullPage: true });
    await page.emulateMedia({ media: "print" });
    expect(await page.getByRole("button", { name: "Print this sheet" }).isVisible()).toBe(false);
    await page.screenshot({ path: "test-results/round-sheet-print.png", fullPage: true });
    await page.close();
  });
});
