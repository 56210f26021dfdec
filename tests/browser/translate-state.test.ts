import type { BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The translate page's state on a phone (375 px): the inputs go into the address so the link
 * reproduces the result, an edited input marks the result out of date, a refused input withdraws it,
 * the summary restates the binary, the result is announced and focused, the verdict stays on screen,
 * and leaving the page and coming back keeps the result.
 */
describe("browser: a translation's state lives in its link", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let browser: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "100000" } });
    browser = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await stack?.close();
    await tdb?.drop();
  });

  it("when the worked example is translated and then edited, refused, shared and left, then the page says so each time", { timeout: 120_000 }, async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 375, height: 740 });
    await page.goto(`${stack.baseUrl}/translate`, { waitUntil: "networkidle" });
    await page.getByRole("button", { name: "Translate the bound" }).click();
    await page.getByTestId("result-edgb").waitFor();

    // The address carries every input; the summary restates them, binary included.
    const link = page.url();
    const q = JSON.parse(new URL(link).searchParams.get("q") ?? "null");
    expect(q).toMatchObject({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    const summary = (await page.getByTestId("request-summary").textContent()) ?? "";
    expect(summary).toMatch(/m₁ = 10 M☉, m₂ = 5 M☉/);
    expect(summary).toMatch(/black hole \+ black hole, source frame/);
    expect(summary).toMatch(/90% credibility/);
    expect(summary).toMatch(/\d+ entries, as of \d{1,2} [A-Z][a-z]{2} \d{4}/);
    // Announced, and focus moved to the results.
    await expect(page.evaluate(() => document.activeElement?.id)).resolves.toBe("results-title");
    await page.waitForFunction(() => /limits? translated/.test(document.querySelector('[data-testid="live-region"]')?.textContent ?? ""));
    // On a phone the verdict stays on screen beside the theory's name (sqrt(alpha) = 4.07 km fails EdGB's condition).
    const verdict = page.getByTestId("verdict-small-edgb");
    await verdict.scrollIntoViewIfNeeded();
    const box = await verdict.boundingBox();
    expect(box && box.x >= 0 && box.x + box.width <= 375).toBe(true);
    await expect(verdict.textContent()).resolves.toMatch(/outside validity/);
    await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(375);
    await page.screenshot({ path: screenshotPath("translate-state-375-result"), fullPage: false });

    // Editing an input marks the result out of date; putting it back clears the mark.
    await page.getByLabel("m₁ (M☉)").fill("12");
    await page.getByTestId("stale-note").waitFor();
    await expect(page.getByTestId("results").getAttribute("data-stale")).resolves.toBe("true");
    await page.getByTestId("stale-note").scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath("translate-state-375-stale"), fullPage: false });
    await page.getByLabel("m₁ (M☉)").fill("10");
    await expect(page.getByTestId("stale-note").count()).resolves.toBe(0);

    // A refused input withdraws the result instead of leaving it under the error.
    await page.getByLabel("m₁ (M☉)").fill("-10");
    await page.getByRole("button", { name: "Translate the bound" }).click();
    await page.getByText("m1 must be positive (solar masses)").waitFor();
    await expect(page.getByTestId("results").count()).resolves.toBe(0);

    // The link reproduces the result in a fresh tab, without pressing anything.
    const other = await browser.newPage();
    await other.goto(link, { waitUntil: "networkidle" });
    await other.getByTestId("result-edgb").waitFor();
    await expect(other.getByTestId("limit-edgb").textContent()).resolves.toMatch(/4\.07\s*km/);
    await expect(other.getByLabel("m₁ (M☉)").inputValue()).resolves.toBe("10");
    await other.close();

    // A link whose inputs are broken says which field, and shows no number.
    const broken = await browser.newPage();
    const bad = new URL(link);
    bad.searchParams.set("q", JSON.stringify({ ...q, binary: { ...q.binary, m1: -1 } }));
    await broken.goto(bad.toString(), { waitUntil: "networkidle" });
    await expect(broken.getByRole("alert").first().textContent()).resolves.toMatch(/binary\.m1/);
    await expect(broken.getByTestId("results").count()).resolves.toBe(0);
    await broken.close();

    // Leaving through the menu and coming back keeps the last result of this tab.
    await page.getByLabel("m₁ (M☉)").fill("10");
    await page.getByRole("button", { name: "Translate the bound" }).click();
    await page.getByTestId("result-edgb").waitFor();
    await page.getByRole("button", { name: "Menu" }).click();
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Catalogue" }).click();
    await page.waitForURL(/\/catalogue$/);
    await page.getByRole("button", { name: "Menu" }).click();
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Translate" }).click();
    await page.getByTestId("result-edgb").waitFor();
    expect(new URL(page.url()).searchParams.get("q")).not.toBeNull();
    await page.close();
  });
});
