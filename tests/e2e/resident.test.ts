/**
 * Resident journeys in Chromium on a 360 × 740 phone viewport: the demo resident logs a bucket
 * with the keyboard only and sees the welcome and the history; a new resident registers their
 * household by picking a street; the signed-in map's list alternative and its popup (Escape
 * returns focus). axe-core on each page and state, with screenshots in test-results/.
 */
import { mkdirSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from "vitest";
import type { Page } from "playwright-core";
import { DEMO_PASSWORD, DEMO_SIGN_IN_EMAILS } from "../../server/db/seeders/demo";
import { axeViolations, startHarness, type BrowserHarness } from "../helpers/browser";
import { createPerson, sql, TEST_PASSWORD } from "../helpers/db";

const PHONE = { width: 360, height: 740 };

let h: BrowserHarness;

beforeAll(async () => {
  h = await startHarness();
  mkdirSync("test-results", { recursive: true });
});

afterAll(async () => {
  await h?.close();
});

/** Counts every key pressed, to report how long logging a bucket takes. */
class Keys {
  count = 0;
  constructor(private readonly page: Page) {}
  async press(key: string) {
    this.count += 1;
    await this.page.keyboard.press(key);
  }
  async type(text: string) {
    this.count += text.length;
    await this.page.keyboard.type(text);
  }
  /** The focused element's label or text. */
  focused() {
    return this.page.evaluate(() => {
      const el = document.activeElement as HTMLInputElement | null;
      return (el?.labels?.[0]?.textContent ?? el?.getAttribute("aria-label") ?? el?.textContent ?? "")
        .replace(/\s+/g, " ")
        .trim();
    });
  }
  /** Presses Tab until the focused element's label or text starts with `name`. */
  async tabTo(name: string, max = 60) {
    for (let i = 0; i < max; i++) {
      await this.press("Tab");
      if ((await this.focused()).startsWith(name)) return;
    }
    throw new Error(`Tab never reached "${name}"`);
  }
}

async function signIn(page: Page, email: string, password: string) {
  await page.goto(h.baseUrl + "/sign-in");
  await page.getByRole("heading", { level: 1, name: "Sign in" }).waitFor();
  const keys = new Keys(page);
  await keys.tabTo("E-mail address");
  await keys.type(email);
  await keys.tabTo("Password");
  await keys.type(password);
  await keys.press("Enter");
  await page.getByRole("button", { name: "Sign out" }).waitFor();
}

async function freshPhone(): Promise<Page> {
  await h.context.clearCookies();
  return h.newPage(PHONE);
}

/** True when the page does not scroll sideways (tables and the map scroll inside themselves). */
async function noHorizontalScroll(page: Page) {
  const wide = await page.evaluate(() => {
    if (document.documentElement.scrollWidth <= window.innerWidth + 1) return null;
    // Name the outermost element that sticks out, to make a failure easy to fix.
    const clipped = (el: HTMLElement) => {
      for (let a = el.parentElement; a; a = a.parentElement)
        if (getComputedStyle(a).overflowX !== "visible") return true;
      return false;
    };
    const culprit = [...document.querySelectorAll<HTMLElement>("body *")].find(
      (el) => el.getBoundingClientRect().right > window.innerWidth + 1 && !clipped(el),
    );
    return culprit ? `${culprit.tagName.toLowerCase()}.${culprit.className}` : "unknown";
  });
  if (wide) console.warn(`Sideways scroll caused by ${wide}`);
  return wide === null;
}

describe("the demo resident logs a bucket with the keyboard only", () => {
  it("when they log one bucket, then they see the welcome and find it in their history", async () => {
    const page = await freshPhone();
    await signIn(page, DEMO_SIGN_IN_EMAILS.resident, DEMO_PASSWORD);

    // From the page after sign-in: the "Log a drop-off" link in the navigation, behind "Menu" on a phone.
    const nav = new Keys(page);
    await nav.tabTo("Menu");
    await nav.press("Enter");
    await nav.tabTo("Log a drop-off");
    await nav.press("Enter");
    await page.getByRole("heading", { level: 1, name: "Log a drop-off" }).waitFor();
    await page.getByRole("radiogroup", { name: "Digester" }).waitFor();
    // The household's digester is chosen already; one 10-litre bucket of mixed scraps is the start.
    const chosen = await page
      .locator('input[name="digesterId"]:checked')
      .evaluate((el) => (el as HTMLInputElement).labels?.[0]?.textContent ?? "");
    expect(chosen).toContain("(your digester)");
    expect(await page.getByRole("textbox", { name: "Buckets", exact: true }).inputValue()).toBe("1");
    expect(await page.locator('input[name="mix"]:checked').inputValue()).toBe("mixed");
    // The welcome shows before submitting.
    await page.getByRole("status").filter({ hasText: /today/ }).first().waitFor();
    await page.screenshot({ path: "test-results/resident-log-form.png", fullPage: true });
    expect(await noHorizontalScroll(page)).toBe(true);
    expect(await axeViolations(page)).toEqual([]);

    // The keys a person presses from here: Tab to the refuse check, Space, Tab to the button, Enter.
    const keys = new Keys(page);
    await keys.tabTo("Nothing from this list is in it");
    await keys.press("Space");
    await keys.tabTo("Log drop-off");
    const answer = page.waitForResponse((r) => r.url().endsWith("/api/drop-offs") && r.request().method() === "POST");
    await keys.press("Enter");
    const created = (await (await answer).json()) as { id: number };
    // Whatever happens below, the demo digester does not keep this test's bucket.
    onTestFinished(() =>
      sql(`UPDATE drop_offs SET status = 'cancelled' WHERE id = $1 AND status = 'pending' RETURNING id`, [
        created.id,
      ]).then(() => undefined),
    );
    const heading = page.getByRole("heading", { level: 2, name: "Drop-off logged" });
    await heading.waitFor();
    console.info(
      `Logging a bucket: ${nav.count} keys to open the form from the navigation, ${keys.count} keys to log it.`,
    );
    expect(keys.count).toBeLessThanOrEqual(20);
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe("Drop-off logged");
    const verdict = page.getByRole("status").filter({ hasText: /Welcome today|No room for it today/ });
    await verdict.waitFor();
    expect(await verdict.textContent()).toMatch(/room/i);
    await page.screenshot({ path: "test-results/resident-logged.png", fullPage: true });
    expect(await axeViolations(page)).toEqual([]);

    // To the history with the keyboard: the newest row is the one just logged, waiting for the steward.
    await keys.tabTo("See your drop-offs");
    await keys.press("Enter");
    await page.getByRole("heading", { level: 1, name: "Your drop-offs" }).waitFor();
    const firstRow = page.getByRole("region", { name: "Your drop-offs" }).getByRole("row").nth(1);
    await firstRow.waitFor();
    expect(await firstRow.textContent()).toMatch(/1 × 10 L, about 5 kg/);
    expect(await firstRow.textContent()).toMatch(/Waiting for the steward/);
    await page.getByRole("term").filter({ hasText: "Scraps kept out of the bin" }).waitFor();
    expect(await noHorizontalScroll(page)).toBe(true);
    await page.screenshot({ path: "test-results/resident-history.png", fullPage: true });
    await page
      .locator("section[aria-labelledby='impact-heading']")
      .screenshot({ path: "test-results/resident-impact.png" });
    await firstRow.screenshot({ path: "test-results/resident-history-first-row.png" });
    expect(await axeViolations(page)).toEqual([]);

    // Cancel it again, so repeated runs do not fill the demo digester.
    await page
      .getByRole("button", { name: /^Cancel the drop-off/ })
      .first()
      .click();
    await page.getByRole("status").filter({ hasText: "is cancelled" }).waitFor();
    await page.close();
  });

  it("when the form is sent without the refuse check and with 0 buckets, then each problem shows under its field", async () => {
    const page = await freshPhone();
    await signIn(page, DEMO_SIGN_IN_EMAILS.resident, DEMO_PASSWORD);
    await page.goto(h.baseUrl + "/drop-offs/new");
    await page.getByRole("heading", { level: 1, name: "Log a drop-off" }).waitFor();
    await page.getByRole("textbox", { name: "Buckets", exact: true }).fill("0");
    await page.getByRole("button", { name: "Log drop-off" }).click();
    await page.getByRole("alert").filter({ hasText: "Please check 2 things" }).waitFor();
    expect(await page.getByRole("textbox", { name: "Buckets", exact: true }).getAttribute("aria-invalid")).toBe("true");
    expect(await page.getByLabel("Nothing from this list is in it").getAttribute("aria-invalid")).toBe("true");
    // Focus goes to the first field with a problem.
    expect(
      await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.labels?.[0]?.textContent),
    ).toBe("Buckets");
    await page.screenshot({ path: "test-results/resident-log-errors.png", fullPage: true });
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });
});

describe("a new resident registers their household", () => {
  it("when they open the drop-off page without a household, then they register it by picking their street and can then log", async () => {
    const person = await createPerson({ roles: ["resident"], name: "Wren Applegarth" });
    const page = await freshPhone();
    await signIn(page, person.email, TEST_PASSWORD);
    await page.goto(h.baseUrl + "/drop-offs/new");
    await page.getByRole("heading", { level: 1, name: "Register your household" }).waitFor();
    await page.getByText("One step first").waitFor();

    // Sent empty first: the errors sit under their fields.
    await page.getByRole("button", { name: "Register household" }).click();
    await page.getByRole("alert").filter({ hasText: "Please check" }).waitFor();
    expect(await page.getByLabel("Household name").getAttribute("aria-invalid")).toBe("true");
    await page.getByText("Choose your street, tap the map or type both coordinates.").waitFor();
    await page.screenshot({ path: "test-results/household-register-errors.png", fullPage: true });
    expect(await axeViolations(page)).toEqual([]);

    // With the keyboard: the name, then a street from the list.
    await page.getByLabel("Household name").focus();
    const keys = new Keys(page);
    await keys.type("The Applegarths");
    await keys.tabTo("Your street");
    await keys.press("ArrowDown");
    await keys.press("ArrowDown");
    const street = await page.getByLabel("Your street").inputValue();
    expect(street).not.toBe("");
    expect(await page.getByLabel("Address").inputValue()).toBe(street);
    expect(Number(await page.getByLabel("Or type the latitude (°)").inputValue())).toBeGreaterThan(50);
    await keys.tabTo("Register household");
    await keys.press("Enter");
    await page.getByRole("heading", { level: 1, name: "Your household" }).waitFor();
    await page.getByText("Your household is registered").waitFor();
    await page.getByRole("heading", { name: "Your digester" }).waitFor();
    await page.screenshot({ path: "test-results/household.png", fullPage: true });
    expect(await axeViolations(page)).toEqual([]);

    // On a phone the main links fold behind "Menu"; it opens, and closes again after the choice.
    const menu = page.getByRole("button", { name: "Menu" });
    expect(await menu.getAttribute("aria-expanded")).toBe("false");
    expect(await page.getByRole("navigation", { name: "Main" }).isVisible()).toBe(false);
    await menu.click();
    expect(await menu.getAttribute("aria-expanded")).toBe("true");
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Log a drop-off" }).click();
    await page.getByRole("heading", { level: 1, name: "Log a drop-off" }).waitFor();
    expect(await menu.getAttribute("aria-expanded")).toBe("false");
    await page.close();
  });
});

describe("the signed-in map", () => {
  it("when the resident uses the list beside the map, then it has each digester's room in words, and the popup closes with Escape back to the button", async () => {
    const page = await freshPhone();
    await signIn(page, DEMO_SIGN_IN_EMAILS.resident, DEMO_PASSWORD);
    await page.goto(h.baseUrl + "/map");
    await page.getByRole("heading", { level: 2, name: "Digesters today" }).waitFor();
    await page.locator(".leaflet-overlay-pane path").first().waitFor({ state: "attached", timeout: 15_000 });
    const items = page.getByRole("heading", { level: 3 });
    expect(await items.count()).toBe(4);
    expect(await page.getByRole("link", { name: /^Log a drop-off here/ }).count()).toBeGreaterThan(0);
    // The resident's own home is on the map; no other household is.
    expect(await page.locator(".hl-marker--home").count()).toBe(1);
    expect(await page.locator(".hl-marker--household").count()).toBe(0);
    expect(await axeViolations(page)).toEqual([]);

    const show = page.getByRole("button", { name: /^Show on map/ }).first();
    await show.focus();
    await page.keyboard.press("Enter");
    const popup = page.locator(".leaflet-popup");
    await popup.waitFor();
    await page.waitForFunction(() => document.activeElement?.closest(".leaflet-popup") !== null);
    await page.screenshot({ path: "test-results/resident-map-popup.png", fullPage: true });
    expect(await axeViolations(page)).toEqual([]);
    await page.keyboard.press("Escape");
    await popup.waitFor({ state: "detached" });
    await page.waitForFunction(() => document.activeElement?.textContent?.startsWith("Show on map") === true);
    await page.close();
  });

  it("when the coordinator opens the map, then every household is on it and in the table", async () => {
    const page = await h.newPage({ width: 1280, height: 900 });
    await h.context.clearCookies();
    await signIn(page, DEMO_SIGN_IN_EMAILS.coordinator, DEMO_PASSWORD);
    await page.goto(h.baseUrl + "/map");
    const table = page.getByRole("region", { name: "Households on the map" });
    await table.waitFor();
    const rows = (await table.getByRole("row").count()) - 1;
    expect(rows).toBeGreaterThan(10);
    expect(await page.locator(".hl-marker--household").count()).toBeGreaterThan(10);
    await page.screenshot({ path: "test-results/coordinator-map.png" });
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });
});
