import { readFileSync } from "node:fs";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { testConfig } from "../helpers/app.ts";
import { axeSerious } from "../helpers/axe.ts";
import { bearerFor, startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { filled, gaussian, rng, toCsv } from "../helpers/samples-data.ts";

/**
 * Saving every kind of result to one sheet in Chromium, as the demo analyst: a posterior-samples job
 * (uploaded on the translate page), a Gaussian and a samples IMR-consistency result (on /consistency),
 * and a stack (through the API: its panel is not built yet). The sheet page shows each kind after a
 * reload, at 1366 and 375 px without horizontal overflow or a serious accessibility violation (axe-core);
 * the CSV export lists each kind. Then an
 * editor retires EdGB: the saved translation is marked stale but unchanged, the re-translation preview
 * shows the EdGB limit going, and accepting keeps the old translation in the record's history.
 */

function remnantCsv(M0: number, c0: number, sM: number, sc: number, n: number, seed: number): string {
  const u = rng(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
  const rows = ["M_f,chi_f"];
  for (let i = 0; i < n; i++) rows.push(`${(M0 + sM * normal()).toFixed(4)},${(c0 + sc * normal()).toFixed(5)}`);
  return `${rows.join("\n")}\n`;
}

async function noHorizontalOverflow(page: Page): Promise<void> {
  const [scroll, client] = await page.evaluate(() => [document.documentElement.scrollWidth, document.documentElement.clientWidth]);
  expect(scroll, "page wider than the viewport").toBeLessThanOrEqual(client);
}

describe("browser: every kind of result saved to a sheet, kept as computed, re-translated on request", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let analyst: BrowserContext;
  let worker: RunningWorker;
  let dir: string;
  const SHEET = "Kinds test sheet";

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "1000", JOBS_ANON_PER_HOUR: "1000" } });
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    const config = testConfig(tdb.url, { JOBS_SWEEP_SECONDS: "1" });
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    analyst = await launchBrowser();
    dir = await mkdtemp(path.join(tmpdir(), "dragoman-browser-sheets-"));
  }, 120_000);
  afterAll(async () => {
    await analyst?.close();
    await worker?.stop();
    await stack?.close();
    await rm(dir, { recursive: true, force: true });
    await tdb?.drop();
  });

  it("when the analyst saves a samples result and two consistency results, and a stack is added, then the sheet shows each after a reload and exports them", { timeout: 240_000 }, async () => {
    const page = await analyst.newPage();
    await page.setViewportSize({ width: 1366, height: 900 });
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-analyst&return_to=${encodeURIComponent("/translate")}`, { waitUntil: "networkidle" });

    // 1. A posterior-samples job on the translate page, saved to a new sheet.
    const n = 4000;
    const csv = path.join(dir, "kv-231107a-posterior.csv");
    await writeFile(csv, toCsv({ beta: gaussian(5, n, 0, 2e-3), m1: filled(n, 10), m2: filled(n, 5) }));
    const panel = page.getByTestId("samples-job-panel");
    await panel.getByTestId("job-theory").selectOption("edgb");
    await panel.getByTestId("job-file").setInputFiles(csv);
    await panel.getByTestId("job-preview").waitFor({ timeout: 30_000 });
    await panel.getByTestId("job-role-deviation").selectOption("beta");
    await panel.getByTestId("job-role-m1").selectOption("m1");
    await panel.getByTestId("job-role-m2").selectOption("m2");
    await panel.getByTestId("job-run").click();
    await panel.getByTestId("job-result").waitFor({ timeout: 90_000 });
    const saveSamples = panel.getByTestId("save-to-sheet");
    await expect(saveSamples.getByLabel("Event or analysis label").inputValue()).resolves.toBe("kv-231107a-posterior");
    await saveSamples.getByLabel("New sheet's name").fill(SHEET);
    await saveSamples.getByTestId("save-record").click();
    await saveSamples.getByRole("status").filter({ hasText: `Saved to ${SHEET}` }).waitFor({ timeout: 30_000 });
    await saveSamples.screenshot({ path: screenshotPath("sheets-save-samples") });

    // 2. The Gaussian consistency test (the form's demonstration values), saved to that sheet.
    await page.goto(`${stack.baseUrl}/consistency`, { waitUntil: "networkidle" });
    await page.getByTestId("run-consistency").click();
    await page.getByTestId("consistency-result").waitFor({ timeout: 30_000 });
    const saveGaussian = page.getByTestId("save-to-sheet");
    await saveGaussian.getByLabel("Event or analysis label").fill("KV-240815b IMR (Gaussian)");
    await saveGaussian.getByLabel("Sheet", { exact: true }).selectOption({ label: SHEET });
    await saveGaussian.getByTestId("save-record").click();
    await saveGaussian.getByRole("status").filter({ hasText: `Saved to ${SHEET}` }).waitFor({ timeout: 30_000 });

    // 3. The samples consistency test on two files, saved to that sheet.
    await page.getByTestId("input-samples").check();
    await page.getByLabel("Inspiral samples").setInputFiles({ name: "kv-inspiral.csv", mimeType: "text/csv", buffer: Buffer.from(remnantCsv(62, 0.68, 2, 0.03, 3000, 3)) });
    await page.getByLabel("Merger-ringdown samples").setInputFiles({ name: "kv-ringdown.csv", mimeType: "text/csv", buffer: Buffer.from(remnantCsv(66, 0.72, 2.5, 0.04, 3000, 4)) });
    await page.getByTestId("run-samples-consistency").click();
    await page.getByTestId("consistency-result").waitFor({ timeout: 90_000 });
    const saveSamplesImr = page.getByTestId("save-to-sheet");
    await saveSamplesImr.getByLabel("Event or analysis label").fill("KV-240815b IMR (samples)");
    await saveSamplesImr.getByLabel("Sheet", { exact: true }).selectOption({ label: SHEET });
    await saveSamplesImr.getByTestId("save-record").click();
    await saveSamplesImr.getByRole("status").filter({ hasText: `Saved to ${SHEET}` }).waitFor({ timeout: 30_000 });

    // 4. A translation and a stack through the API (the stacking panel is another page's work).
    const sheetRow = await tdb.db("sheets").where({ name: SHEET }).first<{ id: number; version: number }>("id", "version");
    const token = await bearerFor(tdb.db, "demo-analyst");
    const samplesJobId = (await tdb.db("analysis_jobs").where({ kind: "samples" }).first<{ id: string }>("id"))!.id;
    const api = (p: string, body: object) =>
      fetch(`${stack.baseUrl}${p}`, { method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: JSON.stringify(body) });
    const stackRes = await api("/api/v1/jobs/stack", {
      theory: "edgb",
      parameter: "ppe_beta",
      b: -7,
      credibility: 0.9,
      include_outside_validity: true,
      events: [
        { label: "KV-231107a", job: samplesJobId },
        { label: "KV-240322c (quick estimate)", summary: { centre: 0, width: 3e-3 }, binary: { m1: 8, m2: 3 } },
      ],
    });
    expect(stackRes.status).toBe(202);
    const stackId = ((await stackRes.json()) as { job: { id: string } }).job.id;
    for (;;) {
      const view = (await (await fetch(`${stack.baseUrl}/api/v1/jobs/${stackId}`)).json()) as { status: string };
      if (view.status !== "queued" && view.status !== "running") break;
      await new Promise((r) => setTimeout(r, 200));
    }
    let version = sheetRow!.version;
    for (const record of [
      { kind: "translation", label: "KV-231107a bound", bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } },
      { kind: "stack", label: "KV-231107a + KV-240322c", job: stackId },
    ]) {
      const res = await api(`/api/v1/sheets/${sheetRow!.id}/records`, { version, record });
      expect(res.status, await res.clone().text()).toBe(201);
      version = ((await res.json()) as { version: number }).version;
    }

    // 5. The sheet page, reloaded: every kind, with its provenance.
    await page.goto(`${stack.baseUrl}/sheets/${sheetRow!.id}`, { waitUntil: "networkidle" });
    await page.reload({ waitUntil: "networkidle" });
    await page.getByTestId("sheet-records").waitFor();
    const kinds = await page.getByTestId("sheet-records").locator("> li").evaluateAll((els) => els.map((e) => e.getAttribute("data-kind")));
    expect(kinds).toEqual(["samples_job", "consistency", "consistency", "translation", "stack"]);
    const samplesCard = page.getByTestId("record-kv-231107a-posterior");
    await expect(samplesCard.textContent()).resolves.toMatch(/kv-231107a-posterior\.csv .*sha256 [0-9a-f]{64}/s);
    await expect(samplesCard.textContent()).resolves.toMatch(/deviation ← beta, m1 ← m1, m2 ← m2/);
    await expect(page.getByTestId("record-KV-240815b IMR (Gaussian)").textContent()).resolves.toMatch(/GR quantile \d/);
    await expect(page.getByTestId("record-KV-240815b IMR (samples)").textContent()).resolves.toMatch(/kv-inspiral\.csv/);
    await expect(page.getByTestId("record-KV-231107a + KV-240322c").textContent()).resolves.toMatch(/quick estimate from a summary/);
    await noHorizontalOverflow(page);
    expect(await axeSerious(page)).toEqual([]);
    await page.screenshot({ path: screenshotPath("sheets-kinds-1366"), fullPage: true });
    await page.setViewportSize({ width: 375, height: 800 });
    await page.reload({ waitUntil: "networkidle" });
    await page.getByTestId("sheet-records").waitFor();
    await noHorizontalOverflow(page);
    expect(await axeSerious(page)).toEqual([]);
    await page.screenshot({ path: screenshotPath("sheets-kinds-375"), fullPage: true });
    await page.setViewportSize({ width: 1366, height: 900 });

    // 6. The CSV export lists each kind.
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("export-csv").click()]);
    const text = readFileSync((await download.path())!, "utf8");
    for (const kind of ["samples_job", "consistency", "translation", "stack"]) expect(text).toContain(`,${kind},`);
    expect(errors).toEqual([]);
  });

  it("when an entry the saved translation used is retired, then the record is marked stale and unchanged; re-translating previews the change and accepting keeps the old one in the history", { timeout: 120_000 }, async () => {
    const sheetRow = await tdb.db("sheets").where({ name: SHEET }).first<{ id: number }>("id");
    const editor = await bearerFor(tdb.db, "demo-editor");
    const retire = await fetch(`${stack.baseUrl}/api/v1/theories/edgb/retire`, {
      method: "POST",
      headers: { Authorization: `Bearer ${editor}`, "Content-Type": "application/json" },
      body: JSON.stringify({ reason: "mapping under review (test)" }),
    });
    expect(retire.status).toBe(200);
    const page = await analyst.newPage();
    await page.setViewportSize({ width: 1366, height: 900 });
    await page.goto(`${stack.baseUrl}/sheets/${sheetRow!.id}`, { waitUntil: "networkidle" });
    const card = page.getByTestId("record-KV-231107a bound");
    await card.getByTestId("record-stale").waitFor();
    await expect(card.getByTestId("record-stale").textContent()).resolves.toMatch(/revision \d+ → retired/);
    // The saved EdGB limit is still shown.
    await expect(card.textContent()).resolves.toMatch(/Einstein-dilaton-Gauss-Bonnet/);
    await card.getByTestId("retranslate-record").click();
    const review = page.getByTestId("retranslation-review");
    await review.waitFor();
    await expect(review.locator('tr[data-status="removed"]').count()).resolves.toBe(1);
    await expect(review.textContent()).resolves.toMatch(/no longer given/);
    expect(await axeSerious(page)).toEqual([]);
    await review.screenshot({ path: screenshotPath("sheets-retranslation-review") });
    await page.setViewportSize({ width: 375, height: 800 });
    await noHorizontalOverflow(page);
    await review.screenshot({ path: screenshotPath("sheets-retranslation-review-375") });
    await page.setViewportSize({ width: 1366, height: 900 });
    await review.getByTestId("accept-retranslation").click();
    await review.waitFor({ state: "detached" });
    await card.getByTestId("record-history").waitFor();
    await expect(card.getByTestId("record-stale").count()).resolves.toBe(0);
    await card.getByTestId("record-history").locator("summary").click();
    await expect(card.getByTestId("record-history").textContent()).resolves.toMatch(/1 earlier translation.*Einstein-dilaton-Gauss-Bonnet/s);
    await page.screenshot({ path: screenshotPath("sheets-after-retranslation"), fullPage: true });
  });
});
