/**
 * Sign-in journeys in Chromium: keyboard-only sign-in that returns to the page asked for, the
 * navigation each demo role sees, sign-out, an invited person setting a password from the link
 * read out of maildev's API, the session-expiry warning, and axe-core on each page and state.
 */
import { mkdirSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { DEMO_PASSWORD, DEMO_SIGN_IN_EMAILS } from "../../server/db/seeders/demo";
import { deliverDueEmails } from "../../server/modules/outbox/outbox.service";
import { axeViolations, startHarness, type BrowserHarness } from "../helpers/browser";
import { uniqueEmail } from "../helpers/db";
import { ensureMailDev, linkIn, waitForMails } from "../helpers/mail";

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

/** A new tab with nobody signed in (all tabs share the browser's cookies). */
async function freshPage(): Promise<Page> {
  await h.context.clearCookies();
  return h.newPage();
}

/** Presses Tab until the focused element has this accessible label or text; fails after 60 presses. */
async function tabTo(page: Page, name: string) {
  for (let i = 0; i < 60; i++) {
    await page.keyboard.press("Tab");
    const here = await page.evaluate(() => {
      const el = document.activeElement as HTMLInputElement | null;
      return (el?.labels?.[0]?.textContent ?? el?.getAttribute("aria-label") ?? el?.textContent ?? "")
        .replace(/\s+/g, " ")
        .trim();
    });
    if (here.startsWith(name)) return;
  }
  throw new Error(`Tab never reached "${name}"`);
}

async function signInWithKeyboard(page: Page, email: string, password: string) {
  await tabTo(page, "E-mail address");
  await page.keyboard.type(email);
  await tabTo(page, "Password");
  await page.keyboard.type(password);
  await page.keyboard.press("Enter");
}

async function mainNavLinks(page: Page): Promise<string[]> {
  return page.getByRole("navigation", { name: "Main" }).getByRole("link").allTextContents();
}

async function status(page: Page, url: string): Promise<number> {
  return page.evaluate(async (u) => (await fetch(u, { credentials: "same-origin" })).status, url);
}

describe("signing in and out", () => {
  it("when a visitor opens a signed-in page, then they sign in with the keyboard only and land back on it", async () => {
    const page = await freshPage();
    await page.goto(h.baseUrl + "/account");
    await page.waitForURL(/\/sign-in\?next=%2Faccount$/);
    await page.getByRole("heading", { level: 1, name: "Sign in" }).waitFor();
    expect(await axeViolations(page)).toEqual([]);

    // A wrong password first: the message is text, announced, and tied to both fields.
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.resident, "not-the-password");
    await page.getByRole("alert").getByText("Not signed in").waitFor();
    const describedBy = await page.getByLabel("Password").getAttribute("aria-describedby");
    expect(describedBy).toContain("sign-in-error");
    expect(await page.getByLabel("Password").getAttribute("aria-invalid")).toBe("true");
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/sign-in-error.png", fullPage: true });

    await page.getByLabel("Password").fill("");
    await page.getByLabel("Password").focus();
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press("Enter");
    await page.waitForURL(/\/account$/);
    await page.getByRole("heading", { level: 1, name: "Your account" }).waitFor();
    expect(await page.getByText(DEMO_SIGN_IN_EMAILS.resident).count()).toBeGreaterThan(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });

  it("when the sign-in link carries ?next=https://elsewhere, then after signing in the person stays on this site", async () => {
    const page = await freshPage();
    await page.goto(h.baseUrl + "/sign-in?next=https%3A%2F%2Fevil.example%2Fphish");
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.gardener, DEMO_PASSWORD);
    await page.waitForURL((url) => url.pathname === "/");
    expect(new URL(page.url()).origin).toBe(h.baseUrl);
    await page.close();
  });

  it.each([
    ["resident", false],
    ["steward", false],
    ["coordinator", true],
    ["gardener", false],
  ] as const)(
    "when the demo %s signs in, then the navigation shows their pages (People: %s) and nothing they may not open",
    async (role, seesPeople) => {
      const page = await freshPage();
      await page.goto(h.baseUrl + "/sign-in");
      await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS[role], DEMO_PASSWORD);
      await page.getByRole("button", { name: "Sign out" }).waitFor();
      const links = await mainNavLinks(page);
      expect(links).toContain("Your account");
      expect(links.includes("People")).toBe(seesPeople);
      expect(await status(page, "/api/people")).toBe(seesPeople ? 200 : 403);
      if (seesPeople) {
        await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "People" }).click();
        await page.getByRole("heading", { level: 1, name: "People" }).waitFor();
        await page.getByRole("region", { name: "People" }).waitFor();
        expect(await axeViolations(page)).toEqual([]);
        await page.screenshot({ path: "test-results/people.png", fullPage: true });
      } else {
        // Typing the address does not help: the page says it is not for them.
        await page.goto(h.baseUrl + "/people");
        await page.getByText(/coordinator role/).waitFor();
      }
      await page.close();
    },
  );

  it("when a signed-in person presses Sign out with the keyboard, then the session ends and they see the sign-in page", async () => {
    const page = await freshPage();
    await page.goto(h.baseUrl + "/sign-in");
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.steward, DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign out" }).waitFor();
    expect(await status(page, "/api/auth/me")).toBe(200);
    await tabTo(page, "Sign out");
    await page.keyboard.press("Enter");
    await page.getByRole("heading", { level: 1, name: "Sign in" }).waitFor();
    await page.getByText("You have signed out").waitFor();
    expect(await status(page, "/api/auth/me")).toBe(401);
    expect(await mainNavLinks(page)).not.toContain("Your account");
    await page.close();
  });
});

describe("invitations", () => {
  it("when a coordinator invites someone, then the person sets a password from the e-mailed link and is signed in", async () => {
    const email = uniqueEmail("e2e-invitee");
    const coordinator = await freshPage();
    await coordinator.goto(h.baseUrl + "/sign-in?next=%2Fpeople");
    await signInWithKeyboard(coordinator, DEMO_SIGN_IN_EMAILS.coordinator, DEMO_PASSWORD);
    await coordinator.getByRole("heading", { level: 1, name: "People" }).waitFor();
    await coordinator.getByRole("button", { name: "Invite someone" }).click();
    const dialog = coordinator.getByRole("dialog", { name: "Invite someone" });
    await dialog.waitFor();
    expect(await axeViolations(coordinator)).toEqual([]);
    await dialog.getByLabel("E-mail address").fill(email);
    await dialog.getByLabel("Name").fill("Wren Applegarth");
    await dialog.getByLabel("Gardener").check();
    await dialog.getByRole("button", { name: "Send invitation" }).click();
    await coordinator.getByText(`Invitation sent to ${email}`).waitFor();
    await coordinator.close();

    await deliverDueEmails();
    const [message] = await waitForMails(email);
    const link = linkIn(message!, "/invitation/");

    const invitee = await freshPage();
    await invitee.goto(h.baseUrl + link.pathname);
    await invitee.getByRole("heading", { level: 1, name: "Join Hearthloop" }).waitFor();
    await invitee.getByLabel("Choose a password").waitFor();
    expect(await invitee.getByLabel("E-mail address").inputValue()).toBe(email);
    expect(await axeViolations(invitee)).toEqual([]);
    await tabTo(invitee, "Choose a password");
    await invitee.keyboard.type("wren's own long passphrase");
    await invitee.keyboard.press("Enter");
    await invitee.waitForURL(/\/account$/);
    await invitee.getByText("Welcome, Wren Applegarth").waitFor();
    expect(await mainNavLinks(invitee)).not.toContain("People");
    expect(await axeViolations(invitee)).toEqual([]);

    // The link worked once.
    await invitee.goto(h.baseUrl + link.pathname);
    await invitee.getByText("This invitation cannot be used").waitFor();
    expect(await axeViolations(invitee)).toEqual([]);
    await invitee.close();
  });
});

describe("session expiry", () => {
  it("when the session is two minutes from its idle end, then a dialog offers to stay signed in and one key press does it", async () => {
    const page = await freshPage();
    await page.clock.install();
    await page.goto(h.baseUrl + "/sign-in");
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.gardener, DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign out" }).waitFor();
    await page.clock.fastForward("28:30");
    const dialog = page.getByRole("dialog", { name: "Your session is about to end" });
    await dialog.waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: "test-results/session-warning.png" });
    // The "Stay signed in" button has the focus when the dialog opens, so Enter is the one key press.
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe("Stay signed in");
    const stay = page.waitForResponse(
      (res) => res.url().endsWith("/api/auth/session") && res.request().method() === "POST",
    );
    await page.keyboard.press("Enter");
    expect((await stay).status()).toBe(200);
    await dialog.waitFor({ state: "hidden" });
    // About 29 more minutes now: another 26 pass without a warning.
    await page.clock.fastForward("26:00");
    await page.waitForTimeout(300);
    expect(await dialog.isVisible()).toBe(false);
    expect(await status(page, "/api/auth/me")).toBe(200);
    await page.close();
  });

  it("when nobody answers the warning, then at the end the person is signed out on the server too and sign-in will bring them back", async () => {
    const page = await freshPage();
    await page.clock.install();
    await page.goto(h.baseUrl + "/sign-in?next=%2Faccount");
    await signInWithKeyboard(page, DEMO_SIGN_IN_EMAILS.resident, DEMO_PASSWORD);
    await page.getByRole("heading", { level: 1, name: "Your account" }).waitFor();
    await page.clock.fastForward("29:30");
    await page.getByText("Your session ended").waitFor();
    expect(new URL(page.url()).pathname + new URL(page.url()).search).toBe("/sign-in?next=%2Faccount");
    expect(await status(page, "/api/auth/me")).toBe(401);
    expect(await axeViolations(page)).toEqual([]);
    await page.close();
  });
});
