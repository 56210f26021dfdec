import { readFileSync } from "node:fs";
import type { BrowserContext, Download, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The forecast journey in Chromium against the real app: a visitor runs the multi-band preset (LISA
 * years before merger plus aLIGO design), sees the bound plot, the table with the low-SNR caution
 * beside LISA, the translations into theories and the coupling plot, and downloads the plot as PNG;
 * the demo analyst saves the forecast to a sheet.
 */
describe("browser: forecasting a multi-band bound and translating it", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let visitor: BrowserContext;
  let analyst: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "1000" } });
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    visitor = await launchBrowser();
    analyst = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await visitor?.close();
    await analyst?.close();
    await stack?.close();
    await tdb?.drop();
  });

  function watch(page: Page) {
    const errors: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") errors.push(m.text());
    });
    page.on("pageerror", (e) => errors.push(e.message));
    return errors;
  }

  it("when a visitor runs the multi-band preset, then the plot, the table with its cautions and the translations appear", { timeout: 120_000 }, async () => {
    const page = await visitor.newPage();
    const requests = recordRequests(page);
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/`, { waitUntil: "networkidle" });
    await page.getByRole("link", { name: "Forecast" }).first().click();
    await page.getByTestId("forecast-form").waitFor();

    // A bad band is refused with the field named beside the detector.
    await page.getByTestId("forecast-detector-0").getByLabel("f_low [Hz]").fill("2");
    await page.getByTestId("forecast-run").click();
    await expect(page.getByTestId("forecast-error").textContent()).resolves.toMatch(/detectors\.0\.f_low/);
    await page.getByTestId("forecast-detector-0").getByLabel("f_low [Hz]").fill("");

    await page.getByTestId("forecast-run").click();
    await page.getByTestId("forecast-results").waitFor({ timeout: 60_000 });
    await page.getByTestId("forecast-bound-plot").locator("svg").first().waitFor();
    const table = page.getByTestId("forecast-table");
    // Three networks: aLIGO design, LISA, both; LISA alone is below SNR 10.
    await expect(table.locator("thead th").count()).resolves.toBe(4);
    await expect(table.locator("thead").textContent()).resolves.toMatch(/low SNR/);
    // The multi-band bound at b = -7 is of order 1e-10 (our own computation: 9.4e-11 at z = 0.09).
    const cell = await page.getByTestId("forecast-cell-2--7").locator("[data-value]").first().getAttribute("data-value");
    expect(Number(cell)).toBeGreaterThan(3e-11);
    expect(Number(cell)).toBeLessThan(3e-10);
    await expect(page.getByTestId("forecast-cell-0-4").textContent()).resolves.toMatch(/κ/);
    await expect(page.getByTestId("forecast-priors").textContent()).resolves.toMatch(/φc σ = 3\.142.*χs σ = 1/);

    const translations = page.getByTestId("forecast-translations");
    await expect(translations.textContent()).resolves.toMatch(/Einstein-dilaton-Gauss-Bonnet|EdGB/);
    await expect(translations.textContent()).resolves.toMatch(/valid|outside validity/);
    await page.getByTestId("forecast-coupling-plot").locator("svg").first().waitFor();

    const [download] = (await Promise.all([page.waitForEvent("download"), page.getByTestId("forecast-bound-plot-png").click()])) as [Download, void];
    expect(download.suggestedFilename()).toBe("forecast-beta-against-b.png");
    const png = readFileSync(await download.path());
    expect(png.subarray(1, 4).toString()).toBe("PNG");
    await page.screenshot({ path: screenshotPath("forecast-multiband"), fullPage: true });

    expect(offLoopback(requests)).toEqual([]);
    // The one 400 is the deliberately bad band above; nothing else may fail.
    expect(errors.filter((e) => !/status of 400/.test(e))).toEqual([]);
    expect(errors.filter((e) => /status of 400/.test(e))).toHaveLength(1);
  });

  it("when the analyst saves the forecast, then a sheet holds one record per network and b", { timeout: 120_000 }, async () => {
    const page = await analyst.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-analyst&return_to=${encodeURIComponent("/forecast")}`, { waitUntil: "networkidle" });
    await page.getByTestId("user-menu").waitFor();
    await page.getByTestId("forecast-form").getByLabel("b values").fill("-7, -3");
    await page.getByTestId("forecast-run").click();
    const save = page.getByTestId("save-forecast");
    await save.waitFor({ timeout: 60_000 });
    await expect(save.textContent()).resolves.toMatch(/6 bounds/);
    await save.getByLabel("Sheet name").fill("Multi-band forecast");
    await save.getByRole("button", { name: "Save as a new sheet" }).click();
    await save.getByRole("link", { name: "Multi-band forecast" }).waitFor({ timeout: 60_000 });
    const stored = await tdb.db("sheet_records").join("sheets", "sheets.id", "sheet_records.sheet_id").where("sheets.name", "Multi-band forecast").select("label", "notes");
    expect(stored).toHaveLength(6);
    expect(stored.every((r: { notes: string }) => r.notes.startsWith("A forecast, not a measurement."))).toBe(true);
    expect(errors).toEqual([]);
  });
});
