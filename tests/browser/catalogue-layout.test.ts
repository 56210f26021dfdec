import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "../../seeds/index.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The catalogue list and an entry page at a laptop's width (1366 px) and a phone's (375 px): at 1366 px
 * the table fits its box (no sideways scrolling at all); at 375 px it scrolls inside its box with the
 * theory column pinned, and the page itself never scrolls sideways. Entry pages show couplings by their
 * symbols, with the identifier only as a small "API name".
 */

async function tableBox(page: Page) {
  return page.evaluate(() => {
    const table = document.querySelector("main table");
    const box = table?.parentElement;
    if (!table || !box) throw new Error("no table in main");
    return { scrollWidth: box.scrollWidth, clientWidth: box.clientWidth, pageOverflow: document.documentElement.scrollWidth - window.innerWidth };
  });
}

describe("browser: the catalogue table at 1366 px and 375 px", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let browser: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await seedDemo(tdb.db);
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "100000" } });
    browser = await launchBrowser();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await stack?.close();
    await tdb?.drop();
  });

  it("when the list is opened at 1366 px, then the whole table fits inside the page without scrolling sideways", { timeout: 60_000 }, async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 1366, height: 860 });
    await page.goto(`${stack.baseUrl}/catalogue`, { waitUntil: "networkidle" });
    await page.getByTestId("theory-row-edgb").waitFor();
    const box = await tableBox(page);
    await page.screenshot({ path: screenshotPath("catalogue-list-1366"), fullPage: false });
    expect(box.pageOverflow).toBeLessThanOrEqual(0);
    expect(box.scrollWidth, `table ${box.scrollWidth} px in a box of ${box.clientWidth} px`).toBeLessThanOrEqual(box.clientWidth + 1);
    await page.close();
  });

  it("when the list is opened at 375 px, then the table scrolls inside its box and the theory column stays in view", { timeout: 60_000 }, async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 375, height: 740 });
    await page.goto(`${stack.baseUrl}/catalogue`, { waitUntil: "networkidle" });
    const row = page.getByTestId("theory-row-edgb");
    await row.waitFor();
    const box = await tableBox(page);
    expect(box.pageOverflow).toBeLessThanOrEqual(0);
    expect(box.scrollWidth).toBeGreaterThan(box.clientWidth);
    const pinned = await page.evaluate(() => {
      const table = document.querySelector("main table")!;
      const scroller = table.parentElement!;
      scroller.scrollLeft = scroller.scrollWidth;
      const cell = document.querySelector('[data-testid="theory-row-edgb"] td')!;
      return { cell: cell.getBoundingClientRect().left, box: scroller.getBoundingClientRect().left, scrolled: scroller.scrollLeft };
    });
    expect(pinned.scrolled).toBeGreaterThan(0);
    expect(Math.abs(pinned.cell - pinned.box)).toBeLessThan(2);
    await page.screenshot({ path: screenshotPath("catalogue-list-375-scrolled"), fullPage: false });
    await page.close();
  });

  it("when an entry page is opened, then its couplings read as symbols with the identifier only as a small API name, at both widths", { timeout: 60_000 }, async () => {
    for (const width of [1366, 375]) {
      const page = await browser.newPage();
      await page.setViewportSize({ width, height: width === 375 ? 740 : 860 });
      await page.goto(`${stack.baseUrl}/catalogue/edgb`, { waitUntil: "networkidle" });
      const mapping = page.getByTestId("mapping-0");
      await mapping.waitFor();
      const constrains = await mapping.locator("dd").first().textContent();
      expect(constrains).toMatch(/Gauss-Bonnet coupling in convention A/);
      expect(constrains).toMatch(/API name\s*alpha/);
      // The validity condition and the prose read as mathematics.
      await expect(page.getByTestId("validity-0-0").textContent()).resolves.toMatch(/16π α²\/m₁⁴ < 1\/6/);
      // Apart from what is marked as the machine form (API names, the engine's expression), nothing reads as code.
      const read = await page.evaluate(() => {
        const main = document.querySelector("main")!.cloneNode(true) as HTMLElement;
        // KaTeX keeps the TeX source in a hidden MathML annotation for screen readers: not read as text here.
        for (const el of main.querySelectorAll("[data-machine], .katex-mathml")) el.remove();
        return main.textContent ?? "";
      });
      expect(read).toMatch(/√α/);
      expect(read).not.toMatch(/sqrt_alpha|sqrt\(|\balpha\b|\bpi\b|\^2/);
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      await page.screenshot({ path: screenshotPath(`catalogue-entry-edgb-${width}`), fullPage: width !== 375 });
      await mapping.screenshot({ path: screenshotPath(`catalogue-entry-edgb-mapping-${width}`) });
      await page.getByTestId("coupling-alpha").screenshot({ path: screenshotPath(`catalogue-entry-edgb-coupling-${width}`) });
      await page.close();
    }
  });
});
