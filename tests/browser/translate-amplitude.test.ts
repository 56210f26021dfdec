import type { BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { amplitudeCatalogueSeed } from "../../seeds/amplitude-catalogue.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The translate page's amplitude bounds in Chromium: a bound on the ppE amplitude alpha at a = 3
 * (amplitude birefringence) on a laptop screen, and a distance ratio on a phone, each with its verdict
 * and cautions beside the number.
 */
describe("browser: amplitude bounds on the translate page", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let browser: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await tdb.db.transaction(async (trx) => {
      await catalogueSeed.run(trx);
      await amplitudeCatalogueSeed.run(trx);
    });
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "100000" } });
    browser = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await stack?.close();
    await tdb?.drop();
  });

  it("when |alpha| <= 0.05 at a = 3 is translated at 1366 px, then kappa is shown with its verdict and cautions", { timeout: 120_000 }, async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 1366, height: 900 });
    await page.goto(`${stack.baseUrl}/translate`, { waitUntil: "networkidle" });
    await page.getByTestId("bound-form").getByLabel("Deviation parameter").selectOption("ppe_alpha");
    await page.getByTestId("bound-form").getByLabel("Exponent a").fill("3");
    await page.getByTestId("bound-form").getByLabel("Upper bound on |α|").fill("0.05");
    await page.getByTestId("bound-form").getByLabel("m₁ (M☉)").fill("36");
    await page.getByTestId("bound-form").getByLabel("m₂ (M☉)").fill("29");
    await page.getByTestId("bound-form").getByLabel("Redshift z").fill("0.09");
    // The phase convention is not asked for: it does not touch the amplitude.
    await expect(page.getByTestId("bound-form").getByLabel("Phase sign convention of the analysis").count()).resolves.toBe(0);
    await page.getByTestId("bound-form").getByRole("button", { name: "Translate the bound" }).click();
    await page.getByTestId("result-amplitude-birefringence").waitFor();

    const q = JSON.parse(new URL(page.url()).searchParams.get("q") ?? "null");
    expect(q).toMatchObject({ bound: { parameter: "ppe_alpha", a: 3, upper: 0.05 } });
    await expect(page.getByTestId("results").textContent()).resolves.toMatch(/As translated: α ∈ \[-0\.05, 0\.05\] at a = 3/);
    // 0.05 pi Mc f_ref Gpc / D_2 at this binary (the formula checked in tests/api/convert-amplitude.test.ts), in the quoted unit.
    await expect(page.getByTestId("limit-amplitude-birefringence").textContent()).resolves.toMatch(/0\.00607\s*Gpc⁻¹/);
    await expect(page.getByTestId("validity-amplitude-birefringence").getAttribute("data-verdict")).resolves.toBe("valid");
    const row = (await page.getByTestId("result-amplitude-birefringence").textContent()) ?? "";
    expect(row).toMatch(/Leading amplitude correction/);
    expect(row).toMatch(/source to be confirmed|recalled from memory/);
    await expect(page.getByTestId("request-summary").textContent()).resolves.toMatch(/ppE amplitude α: a = 3/);
    // Phase-only theories are listed as not constrained by an amplitude bound.
    await expect(page.getByTestId("not-applicable-channel").textContent()).resolves.toMatch(/\d+ entries map the phase or the ringdown only/);
    await expect(page.getByTestId("not-applicable").textContent()).resolves.toMatch(/Dipole radiation: amplitude correction.*a = -2, not at a = 3/);
    // An amplitude translation is not offered for a sheet.
    await expect(page.getByText(/Sheets hold phase bounds/).count()).resolves.toBe(1);
    await page.getByTestId("results").screenshot({ path: screenshotPath("translate-amplitude-1366-alpha") });
  });

  it("when a distance ratio is translated on a 375 px phone, then c_M and Xi_0 - 1 get signed intervals with their verdicts", { timeout: 120_000 }, async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 375, height: 740 });
    await page.goto(`${stack.baseUrl}/translate`, { waitUntil: "networkidle" });
    await page.getByTestId("bound-form").getByLabel("Deviation parameter").selectOption("distance_ratio");
    // A ratio has no symmetric form: the form offers intervals only.
    await expect(page.getByTestId("bound-form").getByTestId("bound-shape").inputValue()).resolves.toBe("interval");
    await page.getByTestId("bound-form").getByLabel("Source redshift z").fill("0.3");
    await page.getByTestId("bound-form").getByLabel("Lower end lo of d_L^GW/d_L^EM").fill("0.8");
    await page.getByTestId("bound-form").getByLabel("Upper end hi of d_L^GW/d_L^EM").fill("1.3");
    await page.getByTestId("bound-form").getByLabel("Credibility").fill("0.683");
    await page.getByTestId("bound-form").getByRole("button", { name: "Translate the bound" }).click();
    await page.getByTestId("result-modified-friction-c_M").waitFor();
    await expect(page.getByTestId("signed-modified-friction-c_M").textContent()).resolves.toMatch(/c_M|∈/);
    await expect(page.getByTestId("verdict-small-modified-friction-c_M").textContent()).resolves.toMatch(/not assessed/);
    await expect(page.getByTestId("verdict-small-modified-friction-dXi0").textContent()).resolves.toMatch(/valid/);
    await expect(page.getByTestId("results").textContent()).resolves.toMatch(/amplitude term at a = 0/);
    await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(375);
    await page.getByTestId("result-modified-friction-c_M").scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath("translate-amplitude-375-ratio"), fullPage: false });

    // A ratio that leaves GR out is refused beside its field, and nothing is shown.
    await page.getByTestId("bound-form").getByLabel("Upper end hi of d_L^GW/d_L^EM").fill("0.9");
    await page.getByTestId("bound-form").getByRole("button", { name: "Translate the bound" }).click();
    await page.getByText(/lo < hi|GR itself/).first().waitFor();
    await expect(page.getByTestId("results").count()).resolves.toBe(0);
  });
});
