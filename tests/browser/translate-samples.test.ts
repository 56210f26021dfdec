import type { Server } from "node:http";
import type { BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { clientIsBuilt, launchBrowser, listen, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The translate page's "Posterior samples" and "Several events" panels in Chromium: a visitor
 * translates the example posterior and the example (invented) events for EdGB.
 */
describe("browser: posterior samples and several events", () => {
  let tdb: TestDatabase;
  let server: Server;
  let baseUrl: string;
  let browser: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    ({ server, url: baseUrl } = await listen(buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" })));
    browser = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await new Promise((r) => server?.close(r));
    await tdb?.drop();
  });

  it("when a visitor translates the example posterior and events for EdGB, then the bound, its histogram and the combined row appear", { timeout: 90_000 }, async () => {
    const page = await browser.newPage();
    const requests = recordRequests(page);
    const errors: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") errors.push(m.text());
    });
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${baseUrl}/translate`, { waitUntil: "networkidle" });

    const samples = page.locator("section", { has: page.getByRole("heading", { name: "Posterior samples" }) });
    await samples.getByTestId("samples-theory").selectOption("edgb");
    await samples.getByRole("button", { name: "Translate the samples" }).click();
    await expect(samples.getByTestId("samples-bound").textContent({ timeout: 20_000 })).resolves.toMatch(/√α\s*≤\s*[\d.]+\s*km/);
    await samples.getByTestId("samples-histogram").locator("svg").waitFor({ timeout: 20_000 });
    await expect(samples.getByTestId("samples-cautions").textContent()).resolves.toMatch(/not flat/);

    const events = page.locator("section", { has: page.getByRole("heading", { name: "Several events" }) });
    await events.getByTestId("events-theory").selectOption("edgb");
    await events.getByLabel("Event 2 bound").fill("1e-5");
    await events.getByRole("button", { name: "Translate and combine" }).click();
    await expect(events.getByTestId("events-combined").textContent({ timeout: 20_000 })).resolves.toMatch(/Combined \(3 events\)\s*≤/);
    await expect(events.getByTestId("events-table").textContent()).resolves.toMatch(/tightest/);

    await samples.screenshot({ path: screenshotPath("translate-samples") });
    await events.screenshot({ path: screenshotPath("translate-events") });
    expect(offLoopback(requests)).toEqual([]);
    expect(errors).toEqual([]);
  });
});
