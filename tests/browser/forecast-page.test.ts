import { readFileSync, writeFileSync } from "node:fs";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { testConfig } from "../helpers/app.ts";
import type { BrowserContext, Download, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, expectPng, launchBrowser, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The forecast journey in Chromium against the real app: a visitor runs the multi-band preset (LISA
 * years before merger plus aLIGO design), sees the bound plot, the table with the low-SNR caution
 * beside LISA, the translations into theories and the coupling plot, and downloads the plot as PNG;
 * the demo analyst saves the forecast to a sheet. The forecast lives in the address: the link opened
 * in a fresh tab shows the same forecast. The analyst uploads a curve file, and a forecast with more
 * values of b than one request takes runs as a background job with its progress shown.
 */
describe("browser: forecasting a multi-band bound and translating it", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let visitor: BrowserContext;
  let analyst: BrowserContext;
  let worker: RunningWorker;
  const env = { RATE_LIMIT_PER_MINUTE: "1000", JOBS_ANON_PER_HOUR: "1000", JOBS_TEST_PAUSE_MS: "2000" };

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb, { env });
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    const config = testConfig(tdb.url, env);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    visitor = await launchBrowser();
    analyst = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await visitor?.close();
    await analyst?.close();
    await worker?.stop();
    await stack?.app.locals.jobQueue.stop();
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
    await page.getByTestId("forecast-detector-0").getByLabel("flow [Hz]").fill("2");
    await page.getByTestId("forecast-run").click();
    await expect(page.getByTestId("forecast-error").textContent()).resolves.toMatch(/detectors\.0\.f_low/);
    await page.getByTestId("forecast-detector-0").getByLabel("flow [Hz]").fill("");

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
    expectPng(png, 780 * 2);
    writeFileSync(screenshotPath("forecast-bound-plot-download"), png);
    // The downloaded SVG keeps the title, each theory's verdict mark, the low-SNR caution and the cautions, in symbols.
    const [boundSvg] = (await Promise.all([page.waitForEvent("download"), page.getByTestId("forecast-bound-plot-svg").click()])) as [Download, void];
    expect(boundSvg.suggestedFilename()).toBe("forecast-beta-against-b.svg");
    const bound = readFileSync(await boundSvg.path(), "utf8");
    expect(bound).toContain("<title>Forecast bound on |β| against b</title>");
    expect(bound).toMatch(/data-role="figure-title"[^>]*>Forecast bound on \|β\| against b</);
    expect(bound).toMatch(/data-role="theory-label"[^>]*>[✓✕?] EdGB/);
    expect(bound).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>○<\/tspan><tspan[^>]*>hollow point: network SNR below 10/);
    expect(bound).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>[✓✕?]<\/tspan><tspan[^>]*>(limit valid|outside validity|validity not assessed)/);
    expect(bound).toMatch(/data-role="figure-caution"[^>]*><tspan[^>]*>⚠<\/tspan>/);
    const [couplingSvg] = (await Promise.all([page.waitForEvent("download"), page.getByTestId("forecast-coupling-plot-svg").click()])) as [Download, void];
    const coupling = readFileSync(await couplingSvg.path(), "utf8");
    expect(coupling).toContain("<title>Theories: forecast coupling limit beside published bounds</title>");
    expect(coupling).toMatch(/EdGB, √α \(b = -7\)/);
    expect(coupling).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>[✓✕?]<\/tspan>/);
    for (const file of [bound, coupling]) for (const id of ["sqrt_alpha", ">edgb<", "brans-dicke", "omega_BD", "lambda_g"]) expect(file).not.toContain(id);
    for (const file of [bound, coupling]) await expect(page.evaluate((text) => new DOMParser().parseFromString(text, "image/svg+xml").querySelector("parsererror") === null, file)).resolves.toBe(true);
    // Symbols, not code names: the limits are typeset (KaTeX) and no ASCII condition text is left.
    await translations.locator(".katex").first().waitFor();
    const translated = (await translations.textContent()) ?? "";
    expect(translated).not.toMatch(/alpha\^2|Mdot_loss|<=|0\.1666/);
    await page.screenshot({ path: screenshotPath("forecast-multiband"), fullPage: true });

    // The forecast is in the address: the link opened in a new tab shows the same forecast.
    const link = page.url();
    expect(new URL(link).searchParams.get("q")).toMatch(/"networks"/);
    const again = await visitor.newPage();
    await again.goto(link, { waitUntil: "networkidle" });
    await again.getByTestId("forecast-results").waitFor({ timeout: 60_000 });
    await expect(again.getByTestId("forecast-cell-2--7").locator("[data-value]").first().getAttribute("data-value")).resolves.toBe(cell);
    await expect(again.getByTestId("forecast-form").getByLabel("m₁ [M☉]").inputValue()).resolves.toBe("36");
    await again.setViewportSize({ width: 375, height: 800 });
    await again.screenshot({ path: screenshotPath("forecast-multiband-375"), fullPage: true });
    await again.close();

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

    // A curve uploaded as a file: a bad row is named with its line and column, a good file is stored.
    const upload = page.getByTestId("curve-upload");
    await upload.locator("summary").click();
    await upload.getByLabel("Second column").selectOption("asd");
    await upload.getByLabel(/^Table/).setInputFiles({ name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from("# f, asd\n10, 1e-23\n20, 0\n") });
    await upload.getByRole("button", { name: "Upload" }).click();
    await expect(upload.getByText(/line 3, column 2 \(ASD\)/).textContent({ timeout: 30_000 })).resolves.toMatch(/must be positive/);
    const rows = Array.from({ length: 30 }, (_, i) => 10 * 100 ** (i / 29)).map((f) => `${f.toPrecision(6)}, ${(3e-24 * (1 + (30 / f) ** 4)).toExponential(4)}`);
    await upload.getByLabel("Name").fill("Invented flat curve");
    await upload.getByLabel(/^Table/).setInputFiles({ name: "flat.csv", mimeType: "text/csv", buffer: Buffer.from(["frequency,asd", ...rows].join("\n")) });
    await upload.getByRole("button", { name: "Upload" }).click();
    await upload.getByText(/Invented flat curve/).first().waitFor({ timeout: 30_000 });
    const curve = await tdb.db("forecast_curves").where({ name: "Invented flat curve" }).first();
    expect(curve.frequencies).toHaveLength(30);
    expect(errors.filter((e) => !/status of 400/.test(e))).toEqual([]);
  });

  it("when more values of b are asked than one request takes and a second binary is added, then the forecast runs as a background job with its progress, the binaries are compared side by side, and per-detector phases are offered", { timeout: 180_000 }, async () => {
    const page = await visitor.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/forecast`, { waitUntil: "networkidle" });
    const bs = Array.from({ length: 48 }, (_, i) => -14 + i * 0.25).filter((b) => b !== 0 && b !== 3);
    await page.getByTestId("forecast-form").getByLabel("b values").fill(bs.join(", "));
    await page.getByTestId("forecast-coalescence").selectOption("phi_c_per_detector");
    await page.getByTestId("forecast-more-sources").fill("20, 15");
    await page.getByTestId("forecast-run").click();
    await page.getByTestId("forecast-job-progress").waitFor({ timeout: 60_000 });
    await page.screenshot({ path: screenshotPath("forecast-job-running"), fullPage: false });
    await page.getByTestId("forecast-results").waitFor({ timeout: 120_000 });
    await expect(page.getByTestId("forecast-table").locator("tbody tr").count()).resolves.toBe(bs.length);
    await expect(page.getByTestId("forecast-coalescence-used").textContent()).resolves.toMatch(/own coalescence phase/);
    // The grid: both binaries side by side at one b; the lighter binary's band reaches higher.
    const grid = page.getByTestId("forecast-grid");
    await expect(grid.locator("tbody tr").count()).resolves.toBe(2);
    await expect(grid.locator("tbody tr").nth(1).textContent()).resolves.toMatch(/20 \+ 15 M☉/);
    await grid.getByTestId("forecast-grid-b").selectOption("-7");
    await grid.getByTestId("forecast-grid-cell-1-0").locator("[data-value]").first().waitFor();
    await page.screenshot({ path: screenshotPath("forecast-grid"), fullPage: true });
    // The second binary's plots and tables on request: its ISCO (a lighter binary) is higher.
    const isco = async () => (await page.getByTestId("forecast-assumptions").textContent()) ?? "";
    const firstIsco = await isco();
    await page.getByTestId("forecast-shown-binary").selectOption("1");
    await expect.poll(isco).not.toBe(firstIsco);
    await expect(page.getByTestId("forecast-assumptions").textContent()).resolves.toMatch(/Source: 20\.00 \+ 15\.00 M☉/);
    const job = await tdb.db("analysis_jobs").where({ kind: "forecast" }).orderBy("created_at", "desc").first();
    expect(job.status).toBe("done");
    // The address names the job beside the request: reloading reads the finished job back, no new job.
    expect(new URL(page.url()).searchParams.get("job")).toBe(job.id);
    const jobsBefore = await tdb.db("analysis_jobs").where({ kind: "forecast" }).count<{ count: string }[]>("* as count");
    await page.reload({ waitUntil: "networkidle" });
    await page.getByTestId("forecast-results").waitFor({ timeout: 60_000 });
    await expect(page.getByTestId("forecast-table").locator("tbody tr").count()).resolves.toBe(bs.length);
    const jobsAfter = await tdb.db("analysis_jobs").where({ kind: "forecast" }).count<{ count: string }[]>("* as count");
    expect(Number(jobsAfter[0]!.count)).toBe(Number(jobsBefore[0]!.count));
    expect(errors).toEqual([]);
  });
});
