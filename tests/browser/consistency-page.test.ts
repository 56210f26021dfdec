import { readFileSync, writeFileSync } from "node:fs";
import type { BrowserContext, Download, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, expectPng, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { testConfig } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The consistency page in Chromium against the real app: a visitor runs the test on two Gaussian
 * summaries (the form's invented demonstration values), sees the credible regions, the GR point and
 * the quantile, asks which Johannsen alpha_13 the test would exclude and sees the track drawn over the
 * contours, downloads the plot; then translates a ringdown bound on the translate page.
 */

/** The GR quantile of the form's demo values, recomputed here (Ghosh et al. 2016 deviations, first-order propagation, chi-square(2); derived). */
function demoQuantile(): number {
  const I = { M: 63.1, c: 0.66, sM: 4.1, sc: 0.03, r: -0.8 };
  const R = { M: 68.4, c: 0.72, sM: 4.6, sc: 0.08, r: 0.9 };
  const sM = I.M + R.M;
  const sC = I.c + R.c;
  const mu = [(2 * (I.M - R.M)) / sM, (2 * (I.c - R.c)) / sC];
  const a = [(4 * R.M) / sM ** 2, (4 * R.c) / sC ** 2];
  const b = [(4 * I.M) / sM ** 2, (4 * I.c) / sC ** 2];
  const s00 = a[0]! ** 2 * I.sM ** 2 + b[0]! ** 2 * R.sM ** 2;
  const s11 = a[1]! ** 2 * I.sc ** 2 + b[1]! ** 2 * R.sc ** 2;
  const s01 = a[0]! * a[1]! * I.r * I.sM * I.sc + b[0]! * b[1]! * R.r * R.sM * R.sc;
  const d2 = (s11 * mu[0]! ** 2 - 2 * s01 * mu[0]! * mu[1]! + s00 * mu[1]! ** 2) / (s00 * s11 - s01 ** 2);
  return 1 - Math.exp(-d2 / 2);
}

describe("browser: the IMR consistency page and the ringdown panel", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let visitor: BrowserContext;
  let worker: RunningWorker;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "1000" } });
    await tdb.db.transaction(async (trx) => {
      await catalogueSeed.run(trx);
      await ringdownCatalogueSeed.run(trx);
    });
    const config = testConfig(tdb.url, { JOBS_SWEEP_SECONDS: "1" });
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    visitor = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await visitor?.close();
    await worker?.stop();
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

  it("when a visitor runs the test on two summaries, then contours, the GR point and the quantile appear, and a theory's track is drawn over them", { timeout: 90_000 }, async () => {
    const page = await visitor.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/consistency`, { waitUntil: "networkidle" });
    await expect(page.title()).resolves.toMatch(/consistency/i);

    // A field error from the shared schema lands beside its field.
    await page.locator('input[name="inspiral.chi_f"]').fill("1.2");
    await page.getByTestId("run-consistency").click();
    await expect(page.getByText("|chi_f| must be below 1 (a Kerr black hole)").isVisible()).resolves.toBe(true);
    await page.locator('input[name="inspiral.chi_f"]').fill("0.66");
    await page.getByTestId("run-consistency").click();

    await page.getByTestId("gr-quantile").waitFor();
    const shown = Number((await page.getByTestId("gr-quantile").textContent())!.replace(/[^0-9.]/g, "")) / 100;
    expect(shown).toBeCloseTo(demoQuantile(), 3);
    await expect(page.locator('[data-testid="deviation-plot"] path[data-level]').count()).resolves.toBe(3);
    await expect(page.getByTestId("gr-point").count()).resolves.toBe(1);
    await expect(page.getByTestId("consistency-cautions").textContent()).resolves.toMatch(/Gaussian approximation/);

    // What would the test exclude for the Johannsen 2013 entry's light-ring shifts?
    await page.getByLabel("Theory").selectOption("johannsen");
    await page.getByTestId("run-exclusion").click();
    await page.getByTestId("exclusion-table").waitFor();
    await page.getByTestId("deviation-track").waitFor();
    await expect(page.getByTestId("exclusion-table").textContent()).resolves.toMatch(/α₁₃ > 0/);
    // The entry's 2PN term biases the inspiral estimate: the note beside the table says so, with the detector used.
    await expect(page.getByTestId("inspiral-bias-note").textContent()).resolves.toMatch(/inspiral bias included.*b = -1.*Advanced LIGO design \(the detector chosen for the bias\)/);
    await expect(page.getByTestId("inspiral-bias-note").textContent()).resolves.toMatch(/one standard deviation/);
    await expect(page.getByTestId("exclusion-table").textContent()).resolves.toMatch(/inspiral bias past 1σ from/);

    // The excluded couplings are marked on the track in symbols, with their verdict's mark.
    await expect(page.locator('[data-testid="deviation-plot"] [data-role="deviation-mark"]').first().textContent()).resolves.toMatch(/^[✓✕?] α₁₃ = /);
    const [download] = (await Promise.all([page.waitForEvent("download"), page.getByTestId("deviation-plot-svg").click()])) as [Download, void];
    const svg = readFileSync(await download.path(), "utf8");
    expect(download.suggestedFilename()).toBe("imr-consistency.svg");
    expect(svg).toMatch(/<svg[^>]+xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect(svg).toMatch(/data-level="0.9"/);
    // The file keeps the title, the legend with the verdict marks, the cautions and the symbols (no identifiers).
    expect(svg).toContain("<title>Deviation from the remnant estimates</title>");
    expect(svg).toMatch(/data-role="figure-title"[^>]*>Deviation from the remnant estimates</);
    expect(svg).toMatch(/data-role="deviation-mark" data-verdict="(valid|outside_validity|not_assessed)"/);
    expect(svg).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>[✓✕?]<\/tspan><tspan[^>]*>smallest excluded coupling, /);
    expect(svg).toMatch(/data-role="figure-caution"[^>]*><tspan[^>]*>⚠<\/tspan><tspan[^>]*>[^<]*Gaussian approximation/);
    expect(svg).toMatch(/[✓✕?] α₁₃ = −?\d/);
    expect(svg).toMatch(/Δχ<tspan baseline-shift="sub"[^>]*>f<\/tspan>/);
    for (const id of ["alpha13", "johannsen", "chi_f", "M_f"]) expect(svg).not.toContain(id);
    // Well-formed XML, as an SVG editor reads it.
    await expect(page.evaluate((text) => new DOMParser().parseFromString(text, "image/svg+xml").querySelector("parsererror") === null, svg)).resolves.toBe(true);
    const [pngDownload] = (await Promise.all([page.waitForEvent("download"), page.getByTestId("deviation-plot-png").click()])) as [Download, void];
    expect(pngDownload.suggestedFilename()).toBe("imr-consistency.png");
    const png = readFileSync(await pngDownload.path());
    expectPng(png, 560 * 2);
    writeFileSync(screenshotPath("consistency-plot-download"), png);
    await page.screenshot({ path: screenshotPath("consistency-page"), fullPage: true });
    await expect(page.getByTestId("split-source").textContent()).resolves.toMatch(/inspiral estimate's remnant/);

    // The address holds both requests: a link opened elsewhere reproduces the quantile and the coupling table without a click.
    const link = page.url();
    expect(new URL(link).searchParams.get("q")).toMatch(/"inspiral"/);
    expect(new URL(link).searchParams.get("c")).toMatch(/"johannsen"/);
    const again = await visitor.newPage();
    const againErrors = watch(again);
    await again.setViewportSize({ width: 375, height: 800 });
    await again.goto(link, { waitUntil: "networkidle" });
    await again.getByTestId("gr-quantile").waitFor();
    expect(Number((await again.getByTestId("gr-quantile").textContent())!.replace(/[^0-9.]/g, "")) / 100).toBeCloseTo(demoQuantile(), 3);
    await again.getByTestId("exclusion-table").waitFor();
    await expect(again.locator('input[name="inspiral.chi_f"]').inputValue()).resolves.toBe("0.66");
    await again.screenshot({ path: screenshotPath("consistency-page-375"), fullPage: true });
    await expect(again.getByTestId("inspiral-bias-note").textContent()).resolves.toMatch(/inspiral bias included/);
    await again.getByTestId("exclusion-panel").screenshot({ path: screenshotPath("consistency-exclusion-375") });
    // A damaged link says which field is wrong and falls back to the example.
    await again.goto(`${stack.baseUrl}/consistency?q=${encodeURIComponent('{"inspiral":{"M_f":-1}}')}`, { waitUntil: "networkidle" });
    await expect(again.getByTestId("bad-link").textContent()).resolves.toMatch(/inspiral\.M_f/);
    await again.close();

    // The widths forecast for a detector instead of taken from the summaries.
    await page.getByTestId("widths-forecast").check();
    await page.locator('input[name="test.forecast.distance_mpc"]').fill("410");
    await page.getByTestId("run-exclusion").click();
    await expect.poll(async () => (await page.getByTestId("exclusion-table").textContent()) ?? "", { timeout: 20_000 }).toMatch(/\(forecast\).*inspiral SNR/);
    await expect(page.getByTestId("inspiral-bias-note").textContent()).resolves.toMatch(/the forecast's detector/);
    await page.getByTestId("exclusion-panel").screenshot({ path: screenshotPath("consistency-forecast-widths") });
    expect(new URL(page.url()).searchParams.get("c")).toMatch(/"forecast"/);
    // Space curves are offered too; choosing one asks for its observing window and leaves f_low to it.
    await page.locator('select[name="test.forecast.curve"]').selectOption("lisa");
    await expect(page.locator('input[name="test.forecast.f_low"]').inputValue()).resolves.toBe("");
    await page.locator('input[name="test.forecast.years_observed"]').fill("2");
    await expect(page.locator('input[name="test.forecast.years_before_merger"]').isVisible()).resolves.toBe(true);
    expect(errors).toEqual([]);
    expect(againErrors).toEqual([]);
  });

  it("when a visitor translates a ringdown bound, then the spacetime entries get limits with verdicts", { timeout: 60_000 }, async () => {
    const page = await visitor.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/translate`, { waitUntil: "networkidle" });
    await page.getByTestId("run-ringdown").click();
    const row = page.getByTestId("ringdown-result-johannsen");
    await row.waitFor();
    // df = -alpha13/27 and |df| <= 0.05: |alpha13| <= 1.35 (light ring; tests/api/convert-ringdown.test.ts checks it against the metric).
    await expect(row.textContent()).resolves.toMatch(/-1\.35 ≤ α₁₃ ≤ 1\.35\|α₁₃\| ≤ 1\.35/);
    // The mapping's source beside the row, and every cited reference in the answer's bibliography with its BibTeX.
    await expect(row.textContent()).resolves.toMatch(/sources: Cardoso et al\. 2009/);
    const bibliography = page.getByTestId("ringdown-bibliography");
    await expect(bibliography.textContent()).resolves.toMatch(/Geodesic stability, Lyapunov exponents and quasinormal modes/);
    await bibliography.getByRole("button", { name: "BibTeX of these references" }).click();
    await expect(page.getByTestId("ringdown-bibliography-bibtex").textContent()).resolves.toMatch(/@article\{cardoso-et-al-2009,/);
    // |alpha13| < 1 is a rule of thumb exceeded 1.35 times: valid, stretched (the translator's rule, at most 10 times).
    await expect(row.textContent()).resolves.toMatch(/valid/);
    await expect(row.textContent()).resolves.toMatch(/stretched, kept as valid/);
    await expect(page.getByTestId("ringdown-mode").textContent()).resolves.toMatch(/Hz/);
    await page.getByTestId("ringdown-panel").screenshot({ path: screenshotPath("translate-ringdown") });
    expect(errors).toEqual([]);
  });

  it("when a visitor uploads two sample files, then the job runs and the contours and quantile appear", { timeout: 90_000 }, async () => {
    // Samples drawn here from two uncorrelated Gaussians (seeded); the quantile is checked against the
    // first-order Gaussian value 1 - exp(-d^2/2) for the generating widths (derived), within 0.06: the
    // Monte-Carlo tolerance of tests/physics/ringdown-consistency.test.ts plus the draws' own scatter.
    const draw = (M0: number, c0: number, sM: number, sc: number, seed: number) => {
      let s = seed;
      const u = () => {
        s = (s * 16807) % 2147483647;
        return s / 2147483647;
      };
      const g = () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
      const rows = ["M_f,chi_f"];
      for (let i = 0; i < 8000; i += 1) rows.push(`${(M0 + sM * g()).toFixed(4)},${(c0 + sc * g()).toFixed(5)}`);
      return Buffer.from(rows.join("\n"));
    };
    const page = await visitor.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/consistency`, { waitUntil: "networkidle" });
    await page.getByTestId("input-samples").check();
    await page.locator('input[name="inspiral"]').setInputFiles({ name: "inspiral.csv", mimeType: "text/csv", buffer: draw(62, 0.68, 2, 0.03, 7) });
    await page.locator('input[name="merger_ringdown"]').setInputFiles({ name: "ringdown.csv", mimeType: "text/csv", buffer: draw(66, 0.72, 2.5, 0.04, 9) });
    await page.getByTestId("run-samples-consistency").click();
    await page.getByTestId("gr-quantile").waitFor({ timeout: 60_000 });
    await expect(page.locator('[data-testid="deviation-plot"] path[data-level]').count()).resolves.toBe(3);
    const q = Number((await page.getByTestId("gr-quantile").textContent())!.replace(/[^0-9.]/g, "")) / 100;
    const sM = 128;
    const sC = 1.4;
    const mu = [(2 * (62 - 66)) / sM, (2 * (0.68 - 0.72)) / sC];
    const vM = ((4 * 66) / sM ** 2) ** 2 * 4 + ((4 * 62) / sM ** 2) ** 2 * 6.25;
    const vC = ((4 * 0.72) / sC ** 2) ** 2 * 0.0009 + ((4 * 0.68) / sC ** 2) ** 2 * 0.0016;
    const expected = 1 - Math.exp(-(mu[0]! ** 2 / vM + mu[1]! ** 2 / vC) / 2);
    expect(Math.abs(q - expected)).toBeLessThan(0.06);
    await expect(page.getByTestId("consistency-cautions").textContent()).resolves.toMatch(/random \(inspiral, merger-ringdown\) pairs/);
    await page.screenshot({ path: screenshotPath("consistency-samples"), fullPage: true });
    expect(errors).toEqual([]);

    // The address holds the job: reloading (or opening the link later) shows the same result without uploading again.
    const job = new URL(page.url()).searchParams.get("job");
    expect(job).toMatch(/^[A-Za-z0-9_-]{24}$/);
    const quantileText = await page.getByTestId("gr-quantile").textContent();
    await page.reload({ waitUntil: "networkidle" });
    await expect(page.getByTestId("input-samples").isChecked()).resolves.toBe(true);
    await page.getByTestId("gr-quantile").waitFor({ timeout: 30_000 });
    await expect(page.getByTestId("gr-quantile").textContent()).resolves.toBe(quantileText);

    // The coupling question takes its widths from the sample files' moments.
    await expect(page.getByTestId("exclusion-panel").textContent()).resolves.toMatch(/from the sample files above/);
    await page.getByLabel("Theory").selectOption("johannsen");
    await page.getByTestId("run-exclusion").click();
    await expect.poll(async () => (await page.getByTestId("exclusion-table").textContent()) ?? "", { timeout: 20_000 }).toMatch(/inspiral σ\(Mf\) = (1\.9\d|2\.0\d|2) M☉.*\(given\)/);
    expect(errors).toEqual([]);
  });

  it("when a link names a job that is gone or is not a job id, then the page says the result cannot be shown", { timeout: 60_000 }, async () => {
    const page = await visitor.newPage();
    const errors = watch(page);
    // A well-formed id no job has (expired, or never issued): the server's 404 message is shown in words.
    await page.goto(`${stack.baseUrl}/consistency?job=${"A".repeat(24)}`, { waitUntil: "networkidle" });
    await expect(page.getByTestId("samples-job-unavailable").textContent()).resolves.toMatch(/cannot be shown: No job A{24}: it never existed or has expired/);
    await expect(page.getByTestId("gr-quantile").count()).resolves.toBe(0);
    // A mangled id is not sent at all.
    await page.goto(`${stack.baseUrl}/consistency?job=not-a-job`, { waitUntil: "networkidle" });
    await expect(page.getByTestId("samples-job-unavailable").textContent()).resolves.toMatch(/not a job id/);
    await page.setViewportSize({ width: 375, height: 800 });
    await page.screenshot({ path: screenshotPath("consistency-job-link-gone-375"), fullPage: true });
    // The 404 of the first link is the only error the browser logs (a failed request, not a crash).
    expect(errors.every((e) => /404/.test(e))).toBe(true);
  });
});
