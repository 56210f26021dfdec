import type { Server } from "node:http";
import type { BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildTestApp } from "../helpers/app.ts";
import { clientIsBuilt, launchBrowser, listen, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

describe("browser: the home page", () => {
  let tdb: TestDatabase;
  let server: Server;
  let baseUrl: string;
  let browser: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    ({ server, url: baseUrl } = await listen(buildTestApp(tdb)));
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await new Promise((r) => server?.close(r));
    await tdb?.drop();
  });

  it("when opened, then the title says Dragoman, Source Serif 4 is loaded and nothing leaves 127.0.0.1", async () => {
    const page = await browser.newPage();
    const requests = recordRequests(page);
    const consoleErrors: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") consoleErrors.push(m.text());
    });
    await page.goto(baseUrl, { waitUntil: "networkidle" });
    expect(await page.title()).toContain("Dragoman");
    await expect(page.getByTestId("pitch").textContent()).resolves.toMatch(/translates it into a limit on every catalogued coupling/);
    await page.evaluate(() => document.fonts.ready);
    const serif = await page.evaluate(() => document.fonts.check('16px "Source Serif 4"'));
    const loadedFaces = await page.evaluate(() => [...document.fonts].filter((f) => f.status === "loaded").map((f) => f.family));
    expect(serif).toBe(true);
    expect(loadedFaces.some((f) => f.includes("Source Serif 4"))).toBe(true);
    await expect(page.getByTestId("server-status").textContent()).resolves.toMatch(/server ok, database up/);
    await page.screenshot({ path: screenshotPath("home"), fullPage: true });
    expect(offLoopback(requests)).toEqual([]);
    expect(requests.length).toBeGreaterThan(2);
    expect(consoleErrors).toEqual([]);
    await page.close();
  });
});
