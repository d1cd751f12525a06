import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { axeViolations, startHarness, type BrowserHarness } from "../helpers/browser";

let h: BrowserHarness;

beforeAll(async () => {
  h = await startHarness();
});

afterAll(async () => {
  await h?.close();
});

describe("browser smoke", () => {
  it("when a visitor opens the landing page, then it says what Hearthloop does, in the shipped font, with no axe violations", async () => {
    const page = await h.newPage();
    await page.goto(h.baseUrl + "/");
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toMatch(/food scraps/i);
    await page.evaluate(() => document.fonts.ready);
    const fontLoaded = await page.evaluate(() => document.fonts.check('18px "Atkinson Hyperlegible"'));
    expect(fontLoaded).toBe(true);
    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(family).toContain("Atkinson Hyperlegible");
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });

  it("when a visitor opens the map, then the offline basemap and the demo digesters show, with a list alternative and no axe violations", async () => {
    const page = await h.newPage();
    await page.goto(h.baseUrl + "/map");
    await page.getByRole("heading", { name: "Digester map" }).waitFor();
    // The offline basemap draws streets as SVG paths inside Leaflet's overlay pane.
    await page.locator(".leaflet-overlay-pane path").first().waitFor({ state: "attached", timeout: 15_000 });
    const streetPaths = await page.locator(".leaflet-overlay-pane path").count();
    expect(streetPaths).toBeGreaterThan(10);
    const markers = await page.locator(".hl-marker").count();
    expect(markers).toBe(4);
    const listItems = await page.getByRole("region", { name: /map of the neighbourhood/i }).count();
    expect(listItems).toBe(1);
    await expect(page.getByRole("heading", { name: "Digesters in the list" }).isVisible()).resolves.toBe(true);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/map.png", fullPage: true });
    await page.close();
  });

  it("when the keyboard user presses Tab first, then a skip link leads to the main content", async () => {
    const page = await h.newPage();
    await page.goto(h.baseUrl + "/");
    await page.getByRole("heading", { level: 1 }).waitFor();
    await page.keyboard.press("Tab");
    const focused = await page.evaluate(() => document.activeElement?.textContent);
    expect(focused).toBe("Skip to main content");
    await page.keyboard.press("Enter");
    expect(await page.evaluate(() => document.activeElement?.id)).toBe("main");
    await page.close();
  });
});
