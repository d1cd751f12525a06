/**
 * Browser-test harness: the real app (built client + API) on an ephemeral loopback port,
 * backed by the e2e database seeded with the demo neighbourhood, and Debian's Chromium
 * driven by playwright-core. Nothing reaches the internet.
 */
import type { Server } from "node:http";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { AxeBuilder } from "@axe-core/playwright";
import { createApp } from "../../server/app";
import { migrateUp } from "../../server/db/migrator";
import { seedDemoIfEmpty } from "../../server/db/seeders/demo";
import { closeDatabase } from "../../server/db/sequelize";

export interface BrowserHarness {
  baseUrl: string;
  context: BrowserContext;
  newPage: (viewport?: { width: number; height: number }) => Promise<Page>;
  close: () => Promise<void>;
}

export async function startHarness(): Promise<BrowserHarness> {
  await migrateUp();
  await seedDemoIfEmpty(new Date());
  const app = createApp({ clientDist: path.resolve("dist"), requestLogging: false });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : 0;
  const userDataDir = mkdtempSync(path.join(tmpdir(), "hearthloop-chromium-"));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  const baseUrl = `http://127.0.0.1:${port}`;
  // Any request leaving loopback is a bug (fonts, tiles, scripts must all be ours).
  const external: string[] = [];
  await context.route(/^https?:\/\/(?!127\.0\.0\.1[:/])/, (route) => {
    external.push(route.request().url());
    return route.abort();
  });
  return {
    baseUrl,
    context,
    newPage: async (viewport) => {
      const page = await context.newPage();
      if (viewport) await page.setViewportSize(viewport);
      return page;
    },
    close: async () => {
      await context.close();
      rmSync(userDataDir, { recursive: true, force: true });
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await closeDatabase();
      if (external.length) throw new Error(`The app tried to reach outside loopback: ${external.join(", ")}`);
    },
  };
}

/** axe-core with the WCAG tags QUALITY.md names; returns the violations (expect none). */
export async function axeViolations(page: Page) {
  const results = await new AxeBuilder({ page })
    .withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"])
    .analyze();
  return results.violations.map((v) => ({
    id: v.id,
    help: v.help,
    nodes: v.nodes.map((n) => n.target.join(" ")).slice(0, 5),
  }));
}
