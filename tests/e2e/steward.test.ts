/**
 * The steward's day in Chromium: the demo steward signs in with the keyboard, opens today's
 * page, logs a reading (first sending the empty form to see its errors), accepts and feeds a
 * waiting drop-off, then on the digester page uploads a sensor log over a throttled link and
 * watches the progress bar, reads the summary, and gets a bad file's line and column. axe-core
 * on each page and state; screenshots in test-results/.
 */
import { mkdirSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { DEMO_PASSWORD, DEMO_SIGN_IN_EMAILS } from "../../server/db/seeders/demo";
import { AxeBuilder } from "@axe-core/playwright";
import { axeViolations, startHarness, type BrowserHarness } from "../helpers/browser";
import { sql } from "../helpers/db";
import { createDropOff } from "../helpers/steward-fixtures";

let h: BrowserHarness;

beforeAll(async () => {
  h = await startHarness();
  mkdirSync("test-results", { recursive: true });
});

afterAll(async () => {
  await h?.close();
});

async function signInWithKeyboard(page: Page, email: string, password: string) {
  await page.goto(h.baseUrl + "/sign-in");
  await page.getByRole("heading", { level: 1, name: "Sign in" }).waitFor();
  await page.getByLabel("E-mail address").focus();
  await page.keyboard.type(email);
  await page.keyboard.press("Tab");
  await page.keyboard.type(password);
  await page.keyboard.press("Enter");
  await page.getByRole("button", { name: "Sign out" }).waitFor();
}

/** axe-core on one part of the page (the same WCAG tags as axeViolations), for states that change only that part. */
async function axeViolationsIn(page: Page, selector: string) {
  const results = await new AxeBuilder({ page })
    .include(selector)
    .withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"])
    .analyze();
  return results.violations.map((v) => ({
    id: v.id,
    help: v.help,
    nodes: v.nodes.map((n) => n.target.join(" ")).slice(0, 5),
  }));
}

/** The demo steward's first digester and a household that brings scraps there. */
async function stewardsDigester() {
  const [digester] = await sql<{ id: number; name: string }>(
    `SELECT d.id, d.name FROM digesters d JOIN digester_stewards s ON s.digester_id = d.id JOIN people p ON p.id = s.person_id
      WHERE p.email = $1 AND d.status = 'active' ORDER BY d.id LIMIT 1`,
    [DEMO_SIGN_IN_EMAILS.steward],
  );
  // Prefer a household assigned to it; other tests may move assignments around in the shared e2e database.
  const [household] = await sql<{ id: number; name: string }>(
    `SELECT id, name FROM households ORDER BY (assigned_digester_id = $1) IS TRUE DESC, id LIMIT 1`,
    [digester!.id],
  );
  return { digester: digester!, household: household! };
}

/** A sensor log of `rows` minutes ending a few minutes ago (new timestamps on every run). */
function sensorLog(rows: number): string {
  const end = Math.floor(Date.now() / 60_000) * 60_000 - 5 * 60_000;
  const lines = ["timestamp,temperature_c,ph,gas_level_percent"];
  for (let i = rows - 1; i >= 0; i -= 1) {
    const t = new Date(end - i * 60_000).toISOString().replace(".000Z", "Z");
    lines.push(
      `${t},${(33 + Math.sin(i / 50)).toFixed(2)},${i % 60 === 0 ? "7.05" : ""},${(40 + (i % 30)).toFixed(1)}`,
    );
  }
  return lines.join("\n") + "\n";
}

describe("the steward's day", () => {
  it("when the demo steward logs a reading and accepts and feeds a waiting bucket, then the budget and records follow", async () => {
    const { digester, household } = await stewardsDigester();
    const note = `E2E bucket ${Date.now().toString(36)}`;
    const drop = await createDropOff({
      householdId: household.id,
      digesterId: digester.id,
      bucketCount: 1,
      bucketLitres: 10,
    });
    await sql(`UPDATE drop_offs SET note = $2 WHERE id = $1 RETURNING id`, [drop.id, note]);

    await h.context.clearCookies();
    const page = await h.newPage({ width: 1280, height: 900 });
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.steward, DEMO_PASSWORD);
    await page.getByRole("link", { name: "Digesters today" }).click();
    await page.getByRole("heading", { level: 1, name: "Today at your digesters" }).waitFor();
    const card = page.getByRole("region", { name: digester.name, exact: true });
    await card.getByRole("heading", { name: "Feed budget today" }).waitFor();
    expect(await card.getByText(/What limits today:/).count()).toBe(1);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/steward-today.png", fullPage: true });

    // Log a reading: the empty form first, to see its errors.
    await card.getByRole("button", { name: `Log a reading for ${digester.name}` }).click();
    const dialog = page.getByRole("dialog", { name: `Log a reading: ${digester.name}` });
    await dialog.getByRole("button", { name: "Save reading" }).click();
    await dialog.getByText("Give at least one measurement").waitFor();
    expect(await dialog.getByLabel("Digester temperature (°C)").getAttribute("aria-invalid")).toBe("true");
    expect(
      await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.labels?.[0]?.textContent),
    ).toContain("Digester temperature");
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/steward-reading-errors.png" });
    await dialog.getByLabel("Digester temperature (°C)").fill("34.5");
    await dialog.getByLabel("pH").fill("7.1");
    await dialog.getByLabel("Note").fill("E2E reading");
    await dialog.getByRole("button", { name: "Save reading" }).click();
    await card.getByText(/^Reading of .* saved\.$/).waitFor();
    expect(await dialog.isVisible()).toBe(false);
    await card.getByText("34.5 °C").waitFor();

    // Accept and feed the waiting bucket.
    const item = card.getByRole("listitem").filter({ hasText: note });
    await item.getByRole("button", { name: `Accept and feed the drop-off from ${household.name}` }).click();
    const feed = page.getByRole("dialog", { name: `Accept and feed: ${household.name}` });
    expect(await feed.getByLabel("Dilution water (litres)").inputValue()).toBe("11.3");
    if (await feed.getByLabel(/Why feed beyond/).count())
      await feed.getByLabel(/Why feed beyond/).fill("E2E: demo digester over its budget");
    await feed.getByRole("button", { name: "Accept and feed" }).click();
    await card
      .getByRole("status")
      .filter({ hasText: `Accepted and fed: ${household.name}` })
      .waitFor();
    await item.waitFor({ state: "detached" });
    const [row] = await sql<{ status: string; feedings: string }>(
      `SELECT d.status, (SELECT count(*) FROM feedings f WHERE f.drop_off_id = d.id) AS feedings FROM drop_offs d WHERE d.id = $1`,
      [drop.id],
    );
    expect(row).toEqual({ status: "fed", feedings: "1" });
    await card
      .getByRole("region", { name: `Fed today at ${digester.name}` })
      .getByText(household.name)
      .first()
      .waitFor();
    await page.screenshot({ path: "test-results/steward-today-after.png", fullPage: true });
    await page.close();
  });

  it("when the steward uploads a sensor log on the digester page, then a progress bar runs and a summary follows; a bad file names its line", async () => {
    const { digester } = await stewardsDigester();
    await h.context.clearCookies();
    const page = await h.newPage({ width: 1280, height: 900 });
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.steward, DEMO_PASSWORD);
    await page.goto(`${h.baseUrl}/digesters/${digester.id}`);
    await page.getByRole("heading", { level: 1, name: digester.name }).waitFor();
    await page.getByRole("heading", { name: "Last 60 days" }).waitFor();
    await page.getByRole("region", { name: "Readings of the last 60 days" }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/digester-page.png" });
    for (const section of ["today", "history", "gas", "records", "upload", "settings"]) {
      await page.locator(`#${section}`).screenshot({ path: `test-results/digester-${section}.png` });
    }

    const rows = 3_000;
    const csv = sensorLog(rows);
    // A slow uplink (64 KB/s) so the progress bar has time to move.
    const cdp = await page.context().newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.emulateNetworkConditions", {
      offline: false,
      latency: 20,
      downloadThroughput: -1,
      uploadThroughput: 64 * 1024,
    });
    const upload = page.getByRole("form", { name: `Upload a sensor log for ${digester.name}` });
    await upload
      .getByLabel("Sensor log (CSV)")
      .setInputFiles({ name: "sensor-log.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    const seen: number[] = [];
    const watch = setInterval(() => {
      void page
        .locator("progress")
        .evaluate((el: HTMLProgressElement) => (el.max > 0 ? el.value / el.max : 0))
        .then((share) => seen.push(share))
        .catch(() => undefined);
    }, 100);
    await upload.getByRole("button", { name: "Upload and import" }).click();
    await page.getByLabel("Uploading").waitFor({ timeout: 10_000 });
    await page.screenshot({ path: "test-results/digester-upload-progress.png" });
    const summary = page.getByRole("status").filter({ hasText: /^Imported [\d,]+ readings/ });
    await summary.waitFor({ timeout: 30_000 });
    clearInterval(watch);
    await cdp.send("Network.emulateNetworkConditions", {
      offline: false,
      latency: 0,
      downloadThroughput: -1,
      uploadThroughput: -1,
    });
    expect(
      seen.some((share) => share > 0 && share < 1),
      `progress seen: ${seen.map((s) => s.toFixed(2)).join(" ")}`,
    ).toBe(true);
    expect(await summary.textContent()).toContain(`${rows.toLocaleString("en-GB")} rows read`);
    expect(await page.locator("progress").evaluate((el: HTMLProgressElement) => el.value === el.max)).toBe(true);
    expect(await axeViolationsIn(page, "#upload")).toEqual([]);
    await summary.scrollIntoViewIfNeeded();
    await page.screenshot({ path: "test-results/digester-upload-result.png" });

    // A file with semicolons: nothing imported, and the line and column named under the field.
    await upload.getByLabel("Sensor log (CSV)").setInputFiles({
      name: "semicolons.csv",
      mimeType: "text/csv",
      buffer: Buffer.from("timestamp;temperature_c\n2026-01-01T00:00:00Z;21,5\n"),
    });
    await upload.getByRole("button", { name: "Upload and import" }).click();
    const problem = page.getByRole("alert").filter({ hasText: "Nothing was imported" });
    await problem.waitFor();
    expect(await problem.textContent()).toMatch(/Line 1, column 1: the columns are separated by semicolons/);
    const field = upload.getByLabel("Sensor log (CSV)");
    expect(await field.getAttribute("aria-invalid")).toBe("true");
    // The problem is tied to the field, so a screen reader reads it with the file input.
    const describedBy = (await field.getAttribute("aria-describedby"))!.split(" ");
    const errorText = await page.evaluate(
      (ids) => ids.map((i) => document.getElementById(i)?.textContent ?? "").join(" "),
      describedBy,
    );
    expect(errorText).toContain("Line 1, column 1");
    expect(await axeViolationsIn(page, "#upload")).toEqual([]);
    await page.screenshot({ path: "test-results/digester-upload-error.png" });
    await page.close();
  }, 180_000);

  it("when the steward opens today on a phone (360 × 740), then nothing scrolls sideways and the actions are reachable", async () => {
    const { digester } = await stewardsDigester();
    await h.context.clearCookies();
    const page = await h.newPage({ width: 360, height: 740 });
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.steward, DEMO_PASSWORD);
    await page.goto(`${h.baseUrl}/steward`);
    const card = page.getByRole("region", { name: digester.name, exact: true });
    await card.getByRole("heading", { name: "Feed budget today" }).waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(1);
    const button = card.getByRole("button", { name: `Log a reading for ${digester.name}` });
    const box = (await button.boundingBox())!;
    expect(box.height).toBeGreaterThanOrEqual(44);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/steward-today-phone.png", fullPage: true });
    await page.close();
  });
});
