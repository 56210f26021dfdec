import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { testConfig } from "../helpers/app.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * Every plot of the translate, forecast and consistency pages at a laptop's 1366 px and a phone's
 * 375 px: drawn at the width there is room for, so no text is rendered below 11 px (WCAG does not set
 * a floor; 11 px is our own for figure text), the page does not scroll sideways, and the theory labels
 * above the bound plots never overlap. Each figure is saved as a screenshot at both widths.
 */
const WIDTHS = [1366, 375] as const;
const MIN_TEXT_PX = 11;

interface Measured {
  figures: { id: string; minFont: number; smallest: string; labelOverlaps: number; svgWidth: number; shownWidth: number }[];
  pageOverflow: number;
}

/** Rendered size of every SVG text in each figure: its computed font size times the SVG's on-screen scale. */
async function measure(page: Page): Promise<Measured> {
  return page.evaluate(() => {
    const figures = [...document.querySelectorAll("figure[data-testid]")].flatMap((fig) => {
      const svg = fig.querySelector("svg");
      if (!svg) return [];
      const box = svg.getBoundingClientRect();
      const scale = box.width / (svg.width.baseVal.value || box.width);
      let minFont = Infinity;
      let smallest = "";
      for (const t of svg.querySelectorAll("text")) {
        if (!t.textContent?.trim()) continue;
        const size = parseFloat(getComputedStyle(t).fontSize) * scale;
        if (size < minFont) {
          minFont = size;
          smallest = t.textContent.trim().slice(0, 40);
        }
      }
      const labels = [...svg.querySelectorAll('[data-role="theory-label"]')].map((t) => t.getBoundingClientRect());
      let labelOverlaps = 0;
      for (let i = 0; i < labels.length; i++)
        for (let j = i + 1; j < labels.length; j++) {
          const [a, b] = [labels[i]!, labels[j]!];
          if (a.left < b.right - 0.5 && b.left < a.right - 0.5 && a.top < b.bottom - 0.5 && b.top < a.bottom - 0.5) labelOverlaps++;
        }
      return [{ id: fig.getAttribute("data-testid") ?? "", minFont, smallest, labelOverlaps, svgWidth: svg.width.baseVal.value, shownWidth: box.width }];
    });
    return { figures, pageOverflow: document.documentElement.scrollWidth - window.innerWidth };
  });
}

describe("browser: every plot at 1366 px and 375 px", () => {
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
    const config = testConfig(tdb.url, {});
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    visitor = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await visitor?.close();
    await worker?.stop();
    await stack?.close();
    await tdb?.drop();
  });

  /** At each width: every figure drawn at most as wide as it is shown, its text at least 11 px, labels apart; screenshots saved. */
  async function checkWidths(page: Page, name: string, figureIds: readonly string[]) {
    for (const width of WIDTHS) {
      await page.setViewportSize({ width, height: 900 });
      // The figures redraw for the new width (a resize observer): wait until each was drawn for the room its box has now.
      await expect
        .poll(() =>
          page.evaluate(
            (ids) =>
              ids.every((id) => {
                const host = document.querySelector(`figure[data-testid="${id}"] [data-role="plot-host"]`);
                const room = host?.parentElement?.clientWidth ?? 0;
                const drawn = Number(host?.getAttribute("data-drawn-width"));
                return room > 0 && (drawn === room || (drawn < room && drawn >= 500));
              }),
            [...figureIds],
          ),
        )
        .toBe(true);
      await page.evaluate(() => document.fonts.ready);
      const m = await measure(page);
      for (const id of figureIds) {
        const f = m.figures.find((x) => x.id === id);
        expect(f, `${id} drawn at ${width} px`).toBeDefined();
        expect(f!.minFont, `${id} at ${width} px: smallest text "${f!.smallest}"`).toBeGreaterThanOrEqual(MIN_TEXT_PX - 0.01);
        expect(f!.labelOverlaps, `${id} at ${width} px: overlapping theory labels`).toBe(0);
        await page.getByTestId(id).screenshot({ path: screenshotPath(`plot-${id}-${width}`) });
      }
      expect(m.pageOverflow, `${name} scrolls sideways at ${width} px`).toBeLessThanOrEqual(0);
    }
  }

  it("when the translate page shows its plots, then they are readable at both widths", { timeout: 90_000 }, async () => {
    const page = await visitor.newPage();
    // |β| ≤ 1e-7 at b = -7 for 60 + 20 solar masses: every catalogued theory labelled, EdGB's limit valid and drawn beside published bounds.
    const q = JSON.stringify({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-7, credibility: 0.9 }, binary: { m1: 60, m2: 20, frame: "source" } });
    await page.goto(`${stack.baseUrl}/translate?q=${encodeURIComponent(q)}`, { waitUntil: "networkidle" });
    await page.getByTestId("beta-plot").locator("svg").first().waitFor();
    await page.getByTestId("coupling-plot-edgb").locator("svg").first().waitFor();
    await checkWidths(page, "translate", ["beta-plot", "coupling-plot-edgb"]);
    await page.close();
  });

  it("when the forecast page shows its plots, then they are readable at both widths", { timeout: 120_000 }, async () => {
    const page = await visitor.newPage();
    await page.goto(`${stack.baseUrl}/forecast`, { waitUntil: "networkidle" });
    await page.getByTestId("forecast-run").click();
    await page.getByTestId("forecast-results").waitFor({ timeout: 60_000 });
    await page.getByTestId("forecast-bound-plot").locator("svg").first().waitFor();
    await page.getByTestId("forecast-coupling-plot").locator("svg").first().waitFor();
    await checkWidths(page, "forecast", ["forecast-bound-plot", "forecast-coupling-plot"]);
    await page.close();
  });

  it("when the consistency page shows the deviation plane with a theory's track, then it is readable at both widths", { timeout: 90_000 }, async () => {
    const page = await visitor.newPage();
    await page.goto(`${stack.baseUrl}/consistency`, { waitUntil: "networkidle" });
    await page.getByTestId("run-consistency").click();
    await page.getByTestId("gr-quantile").waitFor();
    await page.getByLabel("Theory").selectOption("johannsen");
    await page.getByTestId("run-exclusion").click();
    await page.getByTestId("deviation-track").waitFor();
    await checkWidths(page, "consistency", ["deviation-plot"]);
    await page.close();
  });
});
