import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * A ringdown translation saved to a sheet from the translate page's ringdown tab, as the demo analyst:
 * the sheet page shows it (remnant, limits, verdicts, sources) after a reload at 1366 and 375 px, and
 * "Re-translate against today's catalogue" previews it (nothing changed: every limit the same).
 */
async function noHorizontalOverflow(page: Page): Promise<void> {
  const [scroll, client] = await page.evaluate(() => [document.documentElement.scrollWidth, document.documentElement.clientWidth]);
  expect(scroll, "page wider than the viewport").toBeLessThanOrEqual(client);
}

describe("browser: a ringdown translation saved to a sheet", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let analyst: BrowserContext;
  const SHEET = "Ringdown sheet";

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "1000" } });
    await tdb.db.transaction(async (trx) => {
      await catalogueSeed.run(trx);
      await ringdownCatalogueSeed.run(trx);
    });
    analyst = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await analyst?.close();
    await stack?.close();
    await tdb?.drop();
  });

  it("when the analyst saves the ringdown tab's result, then the sheet shows it as computed and a re-translation reads the same", { timeout: 120_000 }, async () => {
    const page = await analyst.newPage();
    await page.setViewportSize({ width: 1366, height: 900 });
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-analyst&return_to=${encodeURIComponent("/translate")}`, { waitUntil: "networkidle" });
    const panel = page.getByTestId("ringdown-panel");
    await panel.getByTestId("run-ringdown").click();
    await panel.getByTestId("ringdown-result-johannsen").waitFor({ timeout: 30_000 });
    const save = panel.getByTestId("save-to-sheet");
    await save.getByLabel("Event or analysis label").fill("KV-RD ringdown (invented)");
    await save.getByLabel("New sheet's name").fill(SHEET);
    await save.getByTestId("save-record").click();
    await save.getByRole("status").filter({ hasText: `Saved to ${SHEET}` }).waitFor({ timeout: 30_000 });

    const row = await tdb.db("sheet_records").where({ kind: "ringdown" }).first<{ sheet_id: number; payload: { request: { bound: { upper: number } } } }>("sheet_id", "payload");
    // The tab's worked example: |df_220| <= 0.05 on a 67.5 M_sun (detector frame) remnant.
    expect(row?.payload.request.bound.upper).toBe(0.05);
    await page.goto(`${stack.baseUrl}/sheets/${row!.sheet_id}`, { waitUntil: "networkidle" });
    await page.reload({ waitUntil: "networkidle" });
    const card = page.locator('[data-kind="ringdown"]');
    await card.waitFor();
    const text = (await card.textContent()) ?? "";
    expect(text).toMatch(/ringdown bound/);
    expect(text).toMatch(/\|δf\/f\| ≤ 0\.05 for the \(2,2,0\) mode, 90% credibility/);
    expect(text).toMatch(/remnant 61\.93 M☉ \(source frame\), χ_f = 0\.68/);
    expect(text).toMatch(/Johannsen parameterized black-hole spacetime/);
    expect(text).toMatch(/sources: Cardoso et al\. 2009/);
    await noHorizontalOverflow(page);
    await card.screenshot({ path: screenshotPath("sheets-ringdown-record") });

    await card.getByTestId("retranslate-record").click();
    const review = page.getByTestId("retranslation-review");
    await review.waitFor({ timeout: 30_000 });
    await expect(review.getByRole("status").textContent()).resolves.toMatch(/Every limit and verdict reads the same/);
    await page.setViewportSize({ width: 375, height: 800 });
    await noHorizontalOverflow(page);
    await page.screenshot({ path: screenshotPath("sheets-ringdown-375"), fullPage: true });
    expect(errors).toEqual([]);
  });
});
