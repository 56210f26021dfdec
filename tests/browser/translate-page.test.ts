import { readFileSync, writeFileSync } from "node:fs";
import type { BrowserContext, Download, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readBibtexFile } from "../helpers/bibtex.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, expectPng, launchBrowser, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The translate journey in Chromium against the real app: a visitor translates the page's worked
 * example (a -1PN bound on a 10 + 5 solar-mass binary), reads the table with its validity verdicts and
 * cautions, sees both plots and downloads one as SVG, switches a convention and runs a table over b;
 * then the demo analyst saves the translation to a new sheet, downloads its LaTeX table and BibTeX,
 * and shares it with a reader who is not signed in.
 */
describe("browser: translating a bound, plotting it and saving it to a sheet", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let visitor: BrowserContext;
  let analyst: BrowserContext;
  let reader: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "1000" } });
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    visitor = await launchBrowser();
    analyst = await launchBrowser();
    reader = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await visitor?.close();
    await analyst?.close();
    await reader?.close();
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

  async function downloadedBytes(page: Page, click: () => Promise<void>): Promise<{ name: string; bytes: Buffer }> {
    const [download] = (await Promise.all([page.waitForEvent("download"), click()])) as [Download, void];
    return { name: download.suggestedFilename(), bytes: readFileSync(await download.path()) };
  }

  /** A PNG file (signature, then the IHDR chunk's width) at twice the plot's width. */
  async function downloaded(page: Page, click: () => Promise<void>): Promise<{ name: string; text: string }> {
    const [download] = (await Promise.all([page.waitForEvent("download"), click()])) as [Download, void];
    const file = await download.path();
    return { name: download.suggestedFilename(), text: readFileSync(file, "utf8") };
  }

  it("when a visitor translates the worked example, then the table, cautions, both plots and the table over b appear", { timeout: 90_000 }, async () => {
    const page = await visitor.newPage();
    const requests = recordRequests(page);
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/translate`, { waitUntil: "networkidle" });
    await expect(page.getByLabel("Exponent b").inputValue()).resolves.toBe("-7");
    await expect(page.getByLabel("H₀ (km/s/Mpc)").inputValue()).resolves.toBe("67.66");

    // A field error from the shared schema lands on its field.
    await page.getByLabel("m₁ (M☉)").fill("-10");
    await page.getByRole("button", { name: "Translate the bound" }).click();
    await expect(page.getByText("m1 must be positive (solar masses)").isVisible()).resolves.toBe(true);
    await page.getByLabel("m₁ (M☉)").fill("10");
    await page.getByRole("button", { name: "Translate the bound" }).click();

    const row = page.getByTestId("result-edgb");
    await row.waitFor();
    // Independent value: sqrt(alpha) = 4.07 km for this binary (tests/api/convert-post.test.ts derives it from the published EdGB beta).
    await expect(page.getByTestId("limit-edgb").textContent()).resolves.toMatch(/4\.07\s*km/);
    await expect(page.getByTestId("validity-edgb").textContent()).resolves.toMatch(/outside validity.*body 2/);
    // Outside validity, the limit is not compared with published bounds (it is not a limit).
    await expect(page.getByTestId("comparison-edgb").textContent()).resolves.toMatch(/^not compared with Yagi 2012/);
    await expect(page.getByTestId("cautions-edgb").textContent()).resolves.toMatch(/one-signed.*β < 0/i);
    await expect(page.getByTestId("not-applicable").textContent()).resolves.toMatch(/Dynamical Chern-Simons.*b = -1/);
    await row.locator(".katex").first().waitFor();

    const betaPlot = page.getByTestId("beta-plot");
    await betaPlot.locator("svg").first().waitFor();
    await expect(betaPlot.locator("svg circle").count()).resolves.toBe(1);
    // Theories by name, each marked with its verdict (a mark and words in the legend, not colour alone).
    await expect(betaPlot.locator("svg").first().textContent()).resolves.toContain("✕ EdGB");
    await expect(page.getByTestId("beta-plot-legend").textContent()).resolves.toMatch(/✕\s*outside validity/);
    // EdGB's limit is outside validity here, so it is not plotted against published bounds.
    await expect(page.getByTestId("coupling-plot-edgb").count()).resolves.toBe(0);
    const svg = await downloaded(page, () => page.getByTestId("beta-plot-svg").click());
    expect(svg.name).toBe("beta-against-b.svg");
    expect(svg.text).toMatch(/^<\?xml/);
    expect(svg.text).toContain('xmlns="http://www.w3.org/2000/svg"');
    expect(svg.text).toMatch(/<circle/);
    // The downloaded file keeps the title, the verdict marks and their legend, and names theories as people do.
    expect(svg.text).toContain("<title>Bound on |β| against the ppE exponent b, with the catalogued theories</title>");
    expect(svg.text).toMatch(/data-role="figure-title"[^>]*>Bound on \|β\| against the ppE exponent b/);
    expect(svg.text).toContain("✕ EdGB");
    expect(svg.text).toMatch(/data-role="figure-legend"[^>]*><tspan fill="#8f3a2c"[^>]*>✕<\/tspan><tspan[^>]*>outside validity: a validity condition of the mapping fails at this limit/);
    expect(svg.text).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>–<\/tspan><tspan[^>]*>not constrained by this bound: enters at another b, or does not apply to this binary/);
    for (const slug of [">edgb<", ">dcs<", "brans-dicke", "massive-graviton", "sqrt_alpha"]) expect(svg.text).not.toContain(slug);
    const png = await downloadedBytes(page, () => page.getByTestId("beta-plot-png").click());
    expect(png.name).toBe("beta-against-b.png");
    expectPng(png.bytes, 760 * 2);
    // Kept beside the screenshots, to look at what a reader of the downloaded file sees.
    writeFileSync(screenshotPath("translate-beta-plot-download"), png.bytes);

    // Convention JB: sqrt(alpha) grows by (16 pi)^(1/4) = 2.663 (EdGB normalisation conventions), 4.072 km -> 10.84 km.
    await page.getByLabel(/Convention for Einstein-dilaton/).selectOption("JB");
    await expect.poll(() => page.getByTestId("limit-edgb").textContent()).toMatch(/10\.8\s*km/);

    await page.getByTestId("run-table").click();
    await page.getByTestId("table-results").waitFor();
    await expect(page.getByTestId("table-row-0").first().textContent()).resolves.toMatch(/dipole/);
    await expect.poll(() => betaPlot.locator("svg circle").count()).toBe(4);
    await page.evaluate(() => document.fonts.ready);
    await page.screenshot({ path: screenshotPath("translate-visitor"), fullPage: true });
    expect(offLoopback(requests)).toEqual([]);
    expect(errors).toEqual([]);
    await page.close();
  });

  it("when a valid limit meets a published bound, then the coupling plot names √α, marks the verdict, and its SVG and PNG keep title, labels and legend", { timeout: 90_000 }, async () => {
    const page = await visitor.newPage();
    const errors = watch(page);
    // 60 + 20 solar masses and |β| ≤ 1e-7 at b = -7: EdGB's √α well inside the small-coupling region, so it is compared with Lyu, Jiang & Yagi 2022.
    const q = JSON.stringify({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-7, credibility: 0.9 }, binary: { m1: 60, m2: 20, frame: "source" }, theories: ["edgb"] });
    await page.goto(`${stack.baseUrl}/translate?q=${encodeURIComponent(q)}`, { waitUntil: "networkidle" });
    const plot = page.getByTestId("coupling-plot-edgb");
    await plot.locator("svg").first().waitFor();
    const drawn = (await plot.locator("svg").first().textContent()) ?? "";
    expect(drawn).toContain("√α (km) →");
    expect(drawn).toContain("✓ this translation");
    expect(drawn).toContain("◆ Lyu et al. 2022");
    const svg = await downloaded(page, () => page.getByTestId("coupling-plot-edgb-svg").click());
    expect(svg.name).toBe("edgb-sqrt_alpha-limits.svg");
    expect(svg.text).toMatch(/<title>Einstein-dilaton-Gauss-Bonnet[^<]*: upper limits on √α[^<]*<\/title>/);
    expect(svg.text).toContain("√α (km) →");
    expect(svg.text).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>✓<\/tspan><tspan[^>]*>this translation: every validity condition holds at the limit/);
    expect(svg.text).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>◆<\/tspan><tspan[^>]*>published bound on the same quantity/);
    expect(svg.text).not.toContain("sqrt_alpha");
    const png = await downloadedBytes(page, () => page.getByTestId("coupling-plot-edgb-png").click());
    expect(png.name).toBe("edgb-sqrt_alpha-limits.png");
    expectPng(png.bytes, 560 * 2);
    writeFileSync(screenshotPath("translate-coupling-plot-download"), png.bytes);
    await page.screenshot({ path: screenshotPath("translate-coupling-plot"), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });

  it("when the analyst saves the translation to a new sheet, then its LaTeX table and BibTeX download, and a share link opens it read-only", { timeout: 90_000 }, async () => {
    const page = await analyst.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-analyst&return_to=${encodeURIComponent("/translate")}`, { waitUntil: "networkidle" });
    await page.getByTestId("user-menu").waitFor();
    await page.getByRole("button", { name: "Translate the bound" }).click();
    await page.getByTestId("result-edgb").waitFor();

    const save = page.getByTestId("save-to-sheet");
    await save.getByLabel("Event or analysis label").fill("HW-250101a");
    await save.getByLabel("Detector network").fill("Harrier-Wren (demo)");
    await save.getByLabel("Analysis method").fill("ppE, one deviation (demo)");
    await save.getByLabel("Data link").fill("https://data.harrier-wren.example/HW-250101a");
    await save.getByLabel("New sheet's name").fill("Harrier-Wren test sheet");
    await save.getByTestId("save-record").click();
    await save.getByRole("link", { name: "Harrier-Wren test sheet" }).click();

    await page.getByTestId("sheet-page").waitFor();
    await page.getByTestId("record-HW-250101a").waitFor();
    const stored = await tdb.db("sheets as s").join("sheet_records as r", "r.sheet_id", "s.id").where("s.name", "Harrier-Wren test sheet").first("r.label", "r.detector_network");
    expect(stored).toEqual({ label: "HW-250101a", detector_network: "Harrier-Wren (demo)" });

    const tex = await downloaded(page, () => page.getByTestId("export-latex").click());
    expect(tex.name).toBe("harrier-wren-test-sheet.tex");
    expect(tex.text).toContain("\\toprule");
    expect(tex.text).toContain("\\midrule");
    expect(tex.text).toContain("\\bottomrule");
    // sqrt(alpha) = 4.07 km, written to two figures in the EdGB row (symbol with its unit, then the limit).
    expect(tex.text).toMatch(/EdGB & \$\\sqrt\{\\alpha\}\$ \[\$\\mathrm\{km\}\$\] & \$\\le 4\.1\$/);
    expect(tex.text).toMatch(/90\\% credibility/);
    const bib = await downloaded(page, () => page.getByTestId("export-bibtex").click());
    expect(bib.name).toBe("harrier-wren-test-sheet.bib");
    expect(readBibtexFile(bib.text).map((e) => e.key)).toContain("lyu-jiang-yagi-2022");

    await page.getByTestId("share-create").click();
    const link = await page.getByTestId("share-link").inputValue();
    expect(link).toMatch(new RegExp(`^${stack.baseUrl}/shared/[A-Za-z0-9_-]{43}$`));
    await page.screenshot({ path: screenshotPath("translate-sheet-owner"), fullPage: true });
    expect(errors).toEqual([]);

    const anon = await reader.newPage();
    const readerErrors = watch(anon);
    await anon.goto(link, { waitUntil: "networkidle" });
    await anon.getByTestId("shared-sheet").waitFor();
    await expect(anon.getByTestId("record-HW-250101a").textContent()).resolves.toMatch(/Einstein-dilaton-Gauss-Bonnet/);
    await expect(anon.getByRole("button", { name: /Remove record|Delete this sheet/ }).count()).resolves.toBe(0);
    await anon.screenshot({ path: screenshotPath("translate-sheet-shared"), fullPage: true });
    expect(readerErrors).toEqual([]);
    await anon.close();
    await page.close();
  });
});
