import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { theoryBySlug } from "../../seeds/data/theories.ts";
import { seedDemo } from "../../seeds/index.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * An editor reviewing a resubmission reads what the author changed since the version an editor
 * returned, beside what the submission changes in the published revision. The demo scenario has
 * one: a change to Brans-Dicke returned at version 1 for a missing sensitivity range, revised as
 * version 2 and resubmitted (invented people and wording).
 */
describe("browser: the review page of a resubmission", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let browser: BrowserContext;
  let id: number;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await seedDemo(tdb.db);
    stack = await startSignInStack(tdb);
    const row = await tdb.db("submissions").where({ status: "resubmitted" }).first<{ id: number } | undefined>("id");
    if (!row) throw new Error("the demo scenario has no resubmitted submission");
    id = row.id;
    browser = await launchBrowser();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
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

  it("when the editor opens it, then the changes since the returned version and against the published revision are both shown, at 1366 px and 375 px", async () => {
    const page = await browser.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-editor&return_to=${encodeURIComponent(`/review/${id}`)}`, { waitUntil: "networkidle" });
    await page.waitForURL(`${stack.baseUrl}/review/${id}`);
    const since = page.getByTestId("since-returned");
    await since.waitFor();
    const n = theoryBySlug("brans-dicke")!.assumptions!.length;

    await expect(since.getByRole("heading").textContent()).resolves.toBe("Changes since the returned version 1");
    await expect(since.textContent()).resolves.toMatch(/Ilse Marrow returned version 1 on \d{1,2} [A-Z][a-z]{2} \d{4}, \d\d:\d\d UTC; this is version 2\./);
    // One row since the return: the reworded assumption, old and new text side by side.
    const sinceRows = since.getByTestId("review-diff-since-returned").locator("tbody tr");
    await expect(sinceRows.count()).resolves.toBe(1);
    const sinceRow = (await sinceRows.first().textContent()) ?? "";
    expect(sinceRow).toContain(`assumptions.${n}`);
    expect(sinceRow).toContain("neutron-star sensitivities from a stiff equation of state");
    expect(sinceRow).toContain("neutron-star sensitivity between 0.1 and 0.3");
    // Against the published revision: the same path, as an addition.
    const published = page.getByTestId("review-diff");
    await expect(page.getByRole("heading", { name: "Changes against the published revision 1" }).isVisible()).resolves.toBe(true);
    const publishedRows = published.locator("tbody tr");
    await expect(publishedRows.count()).resolves.toBe(1);
    await expect(publishedRows.first().textContent()).resolves.toContain("neutron-star sensitivity between 0.1 and 0.3");

    await page.setViewportSize({ width: 1366, height: 900 });
    // Side by side at this width: the two panels start at the same height.
    const boxes = await Promise.all([since.boundingBox(), page.locator("section", { has: published }).boundingBox()]);
    expect(boxes[0] && boxes[1] && Math.abs(boxes[0].y - boxes[1].y)).toBeLessThan(2);
    await page.screenshot({ path: screenshotPath("review-resubmission-1366"), fullPage: true });
    await page.setViewportSize({ width: 375, height: 800 });
    await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(375);
    await page.screenshot({ path: screenshotPath("review-resubmission-375"), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  }, 90_000);
});
