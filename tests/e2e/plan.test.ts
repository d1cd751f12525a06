/**
 * The public "Plan a digester" page in Chromium, used with the keyboard only: every calculator is
 * reached with Tab, filled by typing and sent with Enter; results, their sentences and the safety
 * cautions show; axe-core finds nothing. Expected figures are DOMAIN.md's check values.
 */
import { mkdirSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { axeViolations, startHarness, type BrowserHarness } from "../helpers/browser";

let h: BrowserHarness;

beforeAll(async () => {
  h = await startHarness();
  mkdirSync("test-results", { recursive: true });
});

afterAll(async () => {
  await h?.close();
});

/** What has the focus: its label (or text) and the name of its form. */
function focused(page: Page) {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLInputElement | null;
    return {
      label: (el?.labels?.[0]?.textContent ?? el?.textContent ?? "").trim(),
      form: el?.closest("form")?.getAttribute("aria-label") ?? null,
      tag: el?.tagName.toLowerCase() ?? "",
    };
  });
}

/** Presses Tab until a control whose label starts with `label` (inside the form named `form`) has the focus. */
async function tabTo(page: Page, label: string, form: string) {
  for (let presses = 0; presses < 120; presses += 1) {
    await page.keyboard.press("Tab");
    const here = await focused(page);
    if (here.label.startsWith(label) && here.form === form) return;
  }
  throw new Error(`Tab never reached "${label}" in "${form}"`);
}

/** Types into the focused field, replacing what was there. */
async function typeHere(page: Page, text: string) {
  await page.keyboard.press("ControlOrMeta+A");
  await page.keyboard.type(text);
}

async function fill(page: Page, form: string, entries: [label: string, text: string][]) {
  for (const [label, text] of entries) {
    await tabTo(page, label, form);
    await typeHere(page, text);
  }
  await page.keyboard.press("Enter");
}

describe("Plan a digester (public, keyboard only)", () => {
  it("when a visitor works through every calculator with Tab, typing and Enter, then each answer, its sentence and the cautions show, with no axe violations", async () => {
    const page = await h.newPage({ width: 1280, height: 900 });
    await page.goto(h.baseUrl + "/");
    // From the start page through the main navigation, by keyboard.
    for (let presses = 0; presses < 20; presses += 1) {
      await page.keyboard.press("Tab");
      if ((await focused(page)).label === "Plan a digester") break;
    }
    expect((await focused(page)).label).toBe("Plan a digester");
    await page.keyboard.press("Enter");
    await page.getByRole("heading", { level: 1, name: "Plan a digester" }).waitFor();
    await expect(page.getByText("Estimates, not a design").isVisible()).resolves.toBe(true);
    // The example season chart is drawn at once, with its table.
    await page.locator("#gas .recharts-line-curve").waitFor();
    expect(await page.getByRole("table", { name: "Expected gas by digester temperature" }).count()).toBe(1);

    // Sizing: 10 kg at 25 % TS, 30 °C → 1.45 m³, 31.25 L slurry, 46 days
    // (DOMAIN.md §2 dilution check [derived]; OLRref 1.5, Werner et al. 1989 [read]; see tests/server/calc.test.ts).
    await fill(page, "Digester size", [
      ["Scraps a day (kg)", "10"],
      ["Digester temperature in the cold season (°C)", "30"],
      ["Dry matter of the scraps", "25"],
    ]);
    await page.getByText(/plan a working volume of about 1\.45 m³/).waitFor();
    await expect(page.getByText(/which stays about 46 days inside/).isVisible()).resolves.toBe(true);

    // Season gas: a colder winter lowers the expected gas; the sentence follows.
    await fill(page, "Expected gas by season", [["Cold-season digester temperature (°C)", "10"]]);
    await page.getByText(/In the cold season \(10 °C\) the digester can take only/).waitFor();
    await expect(page.getByRole("heading", { name: "Safety with biogas" }).isVisible()).resolves.toBe(true);

    // Gas holder: 50 + 20 kg on Ø 1.00 m → 8.74 mbar, 89 mm WC; 0.20 m rise → 157 L, 27 min at 350 L/h
    // (DOMAIN.md §3 check [derived]; burner 350 L/h, Tilley et al. 2014 [read]).
    await fill(page, "Gas-holder pressure and stored gas", [
      ["Drum diameter (m)", "1"],
      ["Drum mass (kg)", "50"],
      ["Weights on the drum (kg)", "20"],
      ["How far the drum has risen (m)", "0,2"],
    ]);
    await page.getByText(/puts the gas at about 8\.7 mbar \(89 mm of water column\)/).waitFor();
    await expect(
      page.getByText(/The 157 L of gas under the risen drum give about 27 minutes/).isVisible(),
    ).resolves.toBe(true);
    const pressureCaution = page.getByRole("note", { name: "Safety with the gas holder" });
    await expect(pressureCaution.isVisible()).resolves.toBe(true);
    await expect(pressureCaution.textContent()).resolves.toMatch(/bottom out/);

    // Weights: 874 Pa under a 50 kg Ø 1.00 m drum → about 20 kg (inverse of the DOMAIN.md §3 check [derived]).
    await fill(page, "Weights for a steadier flame", [
      ["Drum diameter (m)", "1"],
      ["Drum mass (kg)", "50"],
      ["Pressure you want (Pa)", "874"],
    ]);
    await page.getByText(/Add about 20 kg, spread evenly on the drum/).waitFor();

    // Acid check: a mistyped A is named under its field and takes the focus; then A 8.97, B 0.84 → ratio 0.28
    // (DOMAIN.md §5 check [read: ManTech Method Abstract #127]).
    await fill(page, "Acid check", [
      ["Acid A (mL)", "eight"],
      ["Acid B (mL)", "0.84"],
    ]);
    await page.getByText(/A \(acid to pH 5\.0\) must be a number from 0\.1 to 100 mL/).waitFor();
    const afterError = await focused(page);
    expect(afterError.label).toMatch(/^Acid A \(mL\)/);
    expect(await page.evaluate(() => document.activeElement?.getAttribute("aria-invalid"))).toBe("true");
    await typeHere(page, "8.97");
    await page.keyboard.press("Enter");
    await page.getByText(/The acids-to-alkalinity ratio is 0\.28/).waitFor();
    await expect(page.getByText("Acids in hand").isVisible()).resolves.toBe(true);

    // Fertiliser: 10 m² at the prefilled 5 g N/L → 34 L a year (DOMAIN.md §4 check [derived]; 91/676/EEC [read]).
    await fill(page, "Fertiliser for a bed", [["Bed area (m²)", "10"]]);
    await page.getByText(/A 10 m² bed may take about 34 L of undiluted digestate a year/).waitFor();
    const digestateCaution = page.getByRole("note", { name: "Safety with digestate" });
    await expect(digestateCaution.textContent()).resolves.toMatch(/not sanitised/);

    // Feed budget with no temperature: nothing is fed until one is logged (DOMAIN.md §2 limit 2).
    await fill(page, "Feed budget try-out", [["Working volume (m³)", "2"]]);
    await page
      .getByText(/log a temperature/i)
      .first()
      .waitFor();

    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/plan.png", fullPage: true });
    await page.close();
  });

  it("when the page is 360 px wide, then nothing scrolls sideways and axe finds no violations", async () => {
    const page = await h.newPage({ width: 360, height: 800 });
    await page.goto(h.baseUrl + "/plan");
    await page.locator("#gas .recharts-line-curve").waitFor();
    await page.screenshot({ path: "test-results/plan-narrow.png", fullPage: true });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });
});
