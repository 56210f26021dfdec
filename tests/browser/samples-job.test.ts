import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import type { Server } from "node:http";
import { tmpdir } from "node:os";
import path from "node:path";
import type { BrowserContext, Download } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { clientIsBuilt, launchBrowser, listen, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { filled, gaussian, toCsv, writeHdf5 } from "../helpers/samples-data.ts";

/**
 * The translate page's "Posterior files" panel in Chromium: a visitor uploads an HDF5 posterior,
 * maps its columns from the preview, watches the job's progress bar (the worker pauses halfway,
 * JOBS_TEST_PAUSE_MS, so the bar is seen mid-way), and reads the verdict and the plot.
 */
describe("browser: a posterior file as a background job", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let server: Server;
  let baseUrl: string;
  let browser: BrowserContext;
  let worker: RunningWorker;
  let dir: string;
  const overrides = { RATE_LIMIT_PER_MINUTE: "1000", JOBS_ANON_PER_HOUR: "1000", JOBS_TEST_PAUSE_MS: "2500" };

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, overrides);
    ({ server, url: baseUrl } = await listen(app));
    const config = testConfig(tdb.url, overrides);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    browser = await launchBrowser();
    dir = await mkdtemp(path.join(tmpdir(), "dragoman-browser-h5-"));
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    await new Promise((r) => server?.close(r));
    await rm(dir, { recursive: true, force: true });
    await tdb?.drop();
  });

  it("when a visitor uploads an HDF5 posterior and maps its columns, then the progress bar runs and the bound, verdict and plot appear", { timeout: 120_000 }, async () => {
    const n = 20_000;
    const file = path.join(dir, "invented-event.h5");
    await writeHdf5(file, "posterior", { beta: gaussian(1, n, 0, 2e-3), mass_1: gaussian(2, n, 12, 0.5), mass_2: gaussian(3, n, 6, 0.3), spin1: filled(n, 0.1) });

    const page = await browser.newPage();
    const requests = recordRequests(page);
    const errors: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") errors.push(m.text());
    });
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${baseUrl}/translate`, { waitUntil: "networkidle" });

    const panel = page.getByTestId("samples-job-panel");
    await panel.getByTestId("job-theory").selectOption("edgb");
    await panel.getByTestId("job-file").setInputFiles(file);
    await panel.getByTestId("job-preview").waitFor({ timeout: 30_000 });
    await expect(panel.getByTestId("job-preview").textContent()).resolves.toMatch(/mass_1.*mass_2/s);
    // beta and the spin are guessed from their names; the masses are mapped by hand.
    await expect(panel.getByTestId("job-role-deviation").inputValue()).resolves.toBe("beta");
    await panel.getByTestId("job-role-m1").selectOption("mass_1");
    await panel.getByTestId("job-role-m2").selectOption("mass_2");
    await panel.getByTestId("job-role-chi1").selectOption("spin1");
    await panel.getByTestId("job-run").click();

    const bar = panel.getByTestId("job-progress");
    await bar.waitFor({ timeout: 30_000 });
    await page.waitForFunction(() => Number((document.querySelector('[data-testid="job-progress"]') as HTMLProgressElement | null)?.value ?? 0) >= 0.5, null, { timeout: 30_000 });
    await panel.screenshot({ path: screenshotPath("samples-job-running") });
    await expect(panel.getByTestId("job-cancel").isVisible()).resolves.toBe(true);

    await panel.getByTestId("job-result").waitFor({ timeout: 60_000 });
    await expect(panel.getByTestId("job-bound").textContent()).resolves.toMatch(/√α\s*≤\s*[\d.]+/);
    await expect(panel.getByTestId("job-verdict").getAttribute("data-verdict")).resolves.toMatch(/^(valid|outside_validity)$/);
    await expect(panel.getByTestId("job-counts").textContent()).resolves.toMatch(/of 20000 samples used; effective sample size/);
    await panel.getByTestId("job-histogram").locator("svg").waitFor({ timeout: 20_000 });
    await expect(panel.getByTestId("job-csv").getAttribute("href")).resolves.toMatch(/^\/api\/v1\/jobs\/[A-Za-z0-9_-]{24}\/samples\.csv$/);
    await panel.screenshot({ path: screenshotPath("samples-job-result") });
    expect(offLoopback(requests)).toEqual([]);
    expect(errors).toEqual([]);
  });

  it("when a finished job and a summary are combined in the stacking panel, then the progress runs and the combined bound, verdicts, events and plot appear", { timeout: 150_000 }, async () => {
    const n = 20_000;
    const file = path.join(dir, "invented-event-a.csv");
    await writeFile(file, toCsv({ beta: gaussian(5, n, 0, 1e-5), m1: filled(n, 10), m2: filled(n, 5) }));
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${baseUrl}/translate`, { waitUntil: "networkidle" });

    const jobs = page.getByTestId("samples-job-panel");
    await jobs.getByTestId("job-theory").selectOption("edgb");
    await jobs.getByTestId("job-file").setInputFiles(file);
    await jobs.getByTestId("job-preview").waitFor({ timeout: 30_000 });
    await jobs.getByTestId("job-run").click();
    await jobs.getByTestId("job-result").waitFor({ timeout: 60_000 });

    const stack = page.getByTestId("stack-panel");
    await stack.getByTestId("stack-theory").selectOption("edgb");
    // The finished job is offered by its file name.
    await stack.getByTestId("stack-0-job").selectOption({ label: "invented-event-a.csv (edgb, b = -7)" });
    await stack.getByTestId("stack-0-label").fill("KV-a");
    await stack.getByTestId("stack-1-source").selectOption("summary");
    await stack.getByTestId("stack-1-label").fill("KV-b");
    for (const [k, v] of [["centre", "0"], ["width", "2e-5"], ["m1", "20"], ["m2", "12"]] as const) await stack.getByTestId(`stack-1-${k}`).fill(v);
    await stack.getByTestId("stack-run").click();
    await stack.getByTestId("stack-progress").waitFor({ timeout: 30_000 });
    await expect(stack.getByTestId("stack-cancel").isVisible()).resolves.toBe(true);
    await stack.getByTestId("stack-result").waitFor({ timeout: 60_000 });
    await expect(stack.getByTestId("stack-bound").textContent()).resolves.toMatch(/√α\s*≤\s*[\d.]+/);
    await expect(stack.getByTestId("stack-verdict").getAttribute("data-verdict")).resolves.toMatch(/^(valid|outside_validity|not_assessed)$/);
    await expect(stack.getByTestId("stack-event-0").textContent()).resolves.toMatch(/KV-a.*samples job/);
    await expect(stack.getByTestId("stack-event-1").textContent()).resolves.toMatch(/KV-b.*summary/);
    await expect(stack.getByTestId("stack-cautions").textContent()).resolves.toMatch(/Quick estimate/);
    await stack.getByTestId("stack-plot").locator("svg").first().waitFor({ timeout: 20_000 });
    // The downloaded plot keeps the events' legend, the verdict on the combined bound and the cautions, in symbols.
    const [download] = (await Promise.all([page.waitForEvent("download"), stack.getByTestId("stack-plot-svg").click()])) as [Download, void];
    const svg = await readFile((await download.path())!, "utf8");
    expect(svg).toMatch(/data-role="figure-title"[^>]*>[^<]*posterior of √α/);
    expect(svg).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>╌<\/tspan><tspan[^>]*>KV-a</);
    expect(svg).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>[✓✕?]<\/tspan><tspan[^>]*>combined bound \(brick line\)/);
    expect(svg).toMatch(/data-role="figure-caution"[^>]*><tspan[^>]*>⚠<\/tspan><tspan[^>]*>[^<]*Quick estimate/);
    expect(svg).not.toContain("sqrt_alpha");
    // Saving needs the analyst role: a visitor is told so beside the result.
    await expect(stack.getByTestId("save-to-sheet-gate").textContent()).resolves.toMatch(/analyst role/);
    await stack.screenshot({ path: screenshotPath("stack-result") });
    await page.setViewportSize({ width: 375, height: 800 });
    await expect.poll(async () => Number(await stack.getByTestId("stack-plot").locator('[data-role="plot-host"]').getAttribute("data-drawn-width"))).toBeLessThan(375);
    await stack.getByTestId("stack-plot").screenshot({ path: screenshotPath("stack-plot-375") });
    expect(errors).toEqual([]);
  });
});
