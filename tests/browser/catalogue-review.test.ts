import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startSmtpSink, type SmtpSink } from "../../fakes/smtp.ts";
import { seedCatalogue } from "../api/catalogue-fixtures.ts";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The review journey end to end, in Chromium against the real app, the fake GitHub and the local
 * mail sink: a contributor writes a mapping with a dimension error, sees the engine say so while
 * typing, fixes it and submits; an editor starts the review and accepts; the catalogue shows the new
 * entry's revision and the outbox holds both e-mails.
 *
 * The mapping is the scalar-dipole phase term at -1PN, beta = -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 /
 * (M^4 eta^(18/5)) with zeta = 16 pi alpha^2 / M^4 (Yagi 2012 EdGB dipole term; normalisation
 * derived there from the dipole flux). The deliberate error writes alpha (a length^2) where the
 * dimensionless zeta belongs.
 */
const SLUG = "quartic-dipole-demo";
const NAME = "Quartic scalar dipole (demo entry)";
const GOOD = "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))";
const WRONG = "-(5/7168)*alpha*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))";
// Yunes & Pretorius 2009, Phys. Rev. D 80, 122003, arXiv:0909.3328: the ppE framework itself.
const BIBTEX = `@article{yunes2009,
  author = {Yunes, Nicolas and Pretorius, Frans},
  title = {Fundamental theoretical bias in gravitational wave astrophysics and the parametrized post-Einsteinian framework},
  journal = {Phys. Rev. D},
  volume = {80},
  pages = {122003},
  year = {2009},
  doi = {10.1103/PhysRevD.80.122003},
  eprint = {0909.3328},
  archivePrefix = {arXiv}
}`;

describe("browser: a mapping goes from a contributor's form through review into the catalogue", () => {
  let tdb: TestDatabase;
  let sink: SmtpSink;
  let stack: SignInStack;
  let theorist: BrowserContext;
  let editor: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await seedCatalogue(tdb.db);
    sink = await startSmtpSink({ db: tdb.db });
    stack = await startSignInStack(tdb, { env: sink.env });
    theorist = await launchBrowser();
    editor = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await theorist?.close();
    await editor?.close();
    stack?.app.locals.mailOutbox?.stop();
    await stack?.close();
    await sink?.close();
    await tdb?.drop();
  });

  /** Console errors include CSP violations; failed responses are listed unless a step expects them. */
  function watch(page: Page) {
    const errors: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") errors.push(m.text());
    });
    page.on("pageerror", (e) => errors.push(e.message));
    return errors;
  }

  /** Scrolls a part of the page to the middle of the window, clear of the form's sticky action bar. */
  async function centre(page: Page, testId: string) {
    await page.getByTestId(testId).evaluate((el) => el.scrollIntoView({ block: "center" }));
  }

  async function signIn(page: Page, login: string, returnTo: string) {
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=${login}&return_to=${encodeURIComponent(returnTo)}`, { waitUntil: "networkidle" });
    await page.getByTestId("user-menu").waitFor();
  }

  it("when a visitor filters the catalogue, then the filters live in the URL and the table shows only matching entries, sortable by b", async () => {
    const page = await theorist.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/catalogue`, { waitUntil: "networkidle" });
    await page.getByTestId("theory-row-edgb").waitFor();
    const allRows = await page.locator('tbody tr[data-testid^="theory-row-"]').count();
    expect(allRows).toBeGreaterThanOrEqual(8);

    // b = -13: the time-varying G and mass-loss entries (Yunes, Yagi & Pretorius 2016, Table I).
    await page.getByLabel("ppE exponent b").selectOption("-13");
    await page.waitForURL(/[?&]b=-13\b/);
    // The previous rows stay on screen until the filtered answer arrives; wait for it to replace them.
    await page.getByTestId("theory-row-edgb").waitFor({ state: "detached" });
    await page.getByTestId("theory-row-varying-g").waitFor();
    const bCells = await page.locator('tbody tr[data-testid^="theory-row-"]').evaluateAll((rows) => rows.map((r) => r.textContent ?? ""));
    expect(bCells.length).toBeGreaterThan(0);
    for (const text of bCells) expect(text).toMatch(/b\s*=\s*[−-]13/);

    await page.getByLabel("ppE exponent b").selectOption("");
    await page.getByLabel("Search").fill("Gauss-Bonnet");
    // Debounced: the URL changes once typing stops.
    await page.waitForURL(/[?&]q=Gauss-Bonnet/);
    await page.getByTestId("theory-row-varying-g").waitFor({ state: "detached" });
    await page.getByTestId("theory-row-edgb").waitFor();
    await page.screenshot({ path: screenshotPath("catalogue-review-0-search") });

    await page.getByLabel("Search").fill("");
    await page.waitForURL((u) => !u.search.includes("q="));
    await page.getByTestId("theory-row-varying-g").waitFor();
    await page.getByRole("button", { name: /^ppE b \/ PN order/ }).click();
    await page.getByTestId("theory-row-edgb").waitFor();
    const firstAscending = await page.locator('tbody tr[data-testid^="theory-row-"]').first().textContent();
    expect(firstAscending).toMatch(/b\s*=\s*[−-]13/);
    expect(await page.locator("th", { hasText: "ppE b / PN order" }).getAttribute("aria-sort")).toBe("ascending");
    expect(errors).toEqual([]);
    await page.close();
  });

  it("when the theorist types a dimension error, then the engine flags it inline; fixed and submitted, it reaches the editor's queue", async () => {
    const page = await theorist.newPage();
    const requests = recordRequests(page);
    const errors = watch(page);
    await signIn(page, "demo-theorist", "/submit");
    await page.waitForURL(`${stack.baseUrl}/submit`);

    await page.getByLabel("Name", { exact: true }).fill(NAME);
    await page.getByLabel("Short name (in the address)").fill(SLUG);
    await page.getByLabel("Family").selectOption("quadratic-gravity");
    await page.getByLabel("Summary").fill("A demo entry: a scalar coupled to a quartic curvature term whose black holes carry a scalar charge and radiate dipole waves at -1PN.");
    const coupling = page.getByTestId("coupling-fields-0");
    await coupling.getByLabel("Symbol").fill("alpha");
    await coupling.getByLabel("TeX").fill("\\alpha");
    await coupling.getByLabel("Dimension (power of length)").fill("2");
    await coupling.getByLabel("Unit").fill("km^2");
    await page.getByRole("button", { name: "Add a definition" }).click();
    const definition = page.getByTestId("definition-fields-0");
    await definition.getByLabel("Symbol").fill("zeta");
    await definition.getByLabel("Expression").fill("16*pi*alpha^2/M^4");

    const mapping = page.getByTestId("mapping-fields-0");
    await mapping.getByLabel("PN order n").fill("-1");
    await mapping.getByLabel("ppE b").fill("-7");
    await mapping.getByLabel("Expression for β").fill(WRONG);
    const dimension = page.getByTestId("live-checks-0").locator('[data-check="dimension"]');
    await dimension.waitFor({ timeout: 15_000 });
    expect(await dimension.getAttribute("data-outcome")).toBe("failed");
    await expect(dimension.textContent()).resolves.toMatch(/dimension/i);
    await centre(page, "live-check-0");
    await page.screenshot({ path: screenshotPath("catalogue-review-1-dimension-error") });

    await mapping.getByLabel("Expression for β").fill(GOOD);
    await page.waitForFunction(() => document.querySelector('[data-testid="live-checks-0"] [data-check="dimension"]')?.getAttribute("data-outcome") === "ok", null, { timeout: 15_000 });
    const outcomes = await page.getByTestId("live-checks-0").locator("[data-check]").evaluateAll((els) => els.map((e) => `${e.getAttribute("data-check")}:${e.getAttribute("data-outcome")}`));
    expect(outcomes.filter((o) => o.endsWith(":failed"))).toEqual([]);
    // The new check of a -1PN dipole: identical bodies emit no dipole (the charge difference vanishes).
    expect(outcomes).toContain("symmetry:ok");
    await centre(page, "live-check-0");
    await page.screenshot({ path: screenshotPath("catalogue-review-2-fixed") });

    // The same beta, derived from the dipole flux F = F_GR [1 + B v^-2] with B = (5/96) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^4)
    // (worked check, derived: the k = -1 formula gives -(3/224) eta^(2/5) B, the EdGB beta).
    await mapping.getByText("Derive β from an energy or flux change").click();
    const derive = page.getByTestId("derive-0");
    await derive.getByLabel("k (PN order)").fill("-1");
    await derive.getByLabel("B (flux)").fill("(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)");
    await derive.getByRole("button", { name: "Derive β" }).click();
    const term = page.getByTestId("derived-term-0");
    await term.waitFor();
    await expect(term.textContent()).resolves.toMatch(/b\s*=\s*[−-]7/);
    await term.getByRole("button", { name: "use this β" }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid="live-checks-0"] [data-check="derivation"]')?.getAttribute("data-outcome") === "ok", null, { timeout: 15_000 });
    await centre(page, "derive-0");
    await page.screenshot({ path: screenshotPath("catalogue-review-2b-derived") });

    await mapping.getByRole("button", { name: "+ add a validity condition" }).click();
    const validity = page.getByTestId("validity-fields-0-0");
    await validity.getByLabel("Expression").fill("16*pi*alpha^2/m1^4");
    await validity.getByLabel("Must stay below").fill("0.1667");
    await validity.getByLabel("In words").fill("small coupling on body 1");

    await page.getByLabel("Paste a BibTeX entry").fill(BIBTEX);
    await page.getByRole("button", { name: "Add from BibTeX" }).click();
    const reference = page.getByTestId("reference-fields-0");
    await reference.waitFor();
    await expect(reference.getByLabel("arXiv id").inputValue()).resolves.toBe("0909.3328");
    await expect(reference.getByLabel("Authors").inputValue()).resolves.toMatch(/Yunes.*and.*Pretorius/);
    await mapping.getByLabel("yunes2009").check();

    await page.getByRole("button", { name: "Save draft" }).click();
    await page.waitForURL(/\/submit\/\d+$/);
    const id = Number(new URL(page.url()).pathname.split("/").pop());
    await expect(page.getByTestId("form-status").textContent()).resolves.toMatch(new RegExp(`Submission ${id}, version 1`));
    // Just saved: nothing is unsaved, neither after the first save (the page moved to the draft's address) nor after a later one.
    await page.waitForLoadState("networkidle");
    await expect(page.getByTestId("form-status").textContent()).resolves.not.toMatch(/unsaved changes/);
    await page.getByLabel("Summary").fill("Scalar dipole radiation with a quartic coupling (demo entry, reworded).");
    await page.getByTestId("form-status").getByText(/unsaved changes/).waitFor();
    await page.getByRole("button", { name: "Save draft" }).click();
    await page.getByTestId("form-status").getByText(/Saved as version 2\./).waitFor();
    await page.waitForLoadState("networkidle");
    await expect(page.getByTestId("form-status").textContent()).resolves.not.toMatch(/unsaved changes/);
    const draft = await tdb.db("submissions").where({ id }).first();
    expect(draft.status).toBe("draft");
    await page.screenshot({ path: screenshotPath("catalogue-review-3-saved-draft"), fullPage: true });

    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.waitForURL(`${stack.baseUrl}/my-submissions`);
    const row = page.getByTestId(`submission-row-${id}`);
    await row.waitFor();
    await expect(row.textContent()).resolves.toMatch(/submitted/);
    await page.screenshot({ path: screenshotPath("catalogue-review-4-my-submissions"), fullPage: true });
    expect((await tdb.db("submissions").where({ id }).first()).status).toBe("submitted");

    expect(offLoopback(requests)).toEqual([]);
    expect(errors).toEqual([]);
    await page.close();
  }, 90_000);

  it("when the editor starts the review and accepts, then the catalogue shows revision 1 of the entry and the outbox holds both e-mails", async () => {
    const page = await editor.newPage();
    const errors = watch(page);
    await signIn(page, "demo-editor", "/review");
    await page.waitForURL(`${stack.baseUrl}/review`);
    const [sub] = await tdb.db("submissions").select("id").orderBy("id", "desc").limit(1);
    const id = Number(sub.id);
    await page.getByTestId(`queue-row-${id}`).getByRole("link", { name: NAME }).click();
    await page.waitForURL(`${stack.baseUrl}/review/${id}`);
    await page.getByRole("button", { name: "Start review" }).click();
    const accept = page.getByRole("button", { name: "Accept and publish" });
    await accept.waitFor();
    expect(await accept.isEnabled()).toBe(true);
    await page.screenshot({ path: screenshotPath("catalogue-review-5-in-review"), fullPage: true });

    await page.getByLabel("Comment to the author").fill("Clear derivation; accepted as the first revision.");
    await accept.click();
    await page.getByText("This submission is accepted").waitFor();
    expect((await tdb.db("submissions").where({ id }).first()).status).toBe("accepted");

    await page.goto(`${stack.baseUrl}/catalogue?q=quartic`, { waitUntil: "networkidle" });
    const catalogueRow = page.getByTestId(`theory-row-${SLUG}`);
    await catalogueRow.waitFor();
    await expect(page.getByTestId("theory-count").textContent()).resolves.toMatch(/^1 of \d+ entries/);
    await page.screenshot({ path: screenshotPath("catalogue-review-6-catalogue"), fullPage: true });
    await catalogueRow.getByRole("link", { name: NAME }).click();
    await page.waitForURL(`${stack.baseUrl}/catalogue/${SLUG}`);
    await expect(page.getByTestId("theory-revision").textContent()).resolves.toMatch(/revision 1, published/);
    await page.getByTestId("revision-1").getByText("accepted by Tomasz Quell").waitFor();
    await page.screenshot({ path: screenshotPath("catalogue-review-7-theory"), fullPage: true });

    await page.goto(`${stack.baseUrl}/dev/outbox`, { waitUntil: "networkidle" });
    // The dispatcher sends after the transaction commits; the page polls every few seconds.
    try {
      await page.waitForFunction((n) => document.querySelectorAll('[data-testid^="outbox-message-"]').length >= n, 2, { timeout: 30_000 });
    } catch (err) {
      // Say where the mail got stuck: still queued (and why), or sent but not shown.
      const queue = await tdb.db("mail_queue").select("subject", "status", "attempts", "last_error");
      const outbox = await tdb.db("dev_outbox").select("subject");
      throw new Error(`the outbox page never showed both e-mails; mail_queue: ${JSON.stringify(queue)}; dev_outbox: ${JSON.stringify(outbox)}`, { cause: err });
    }
    const subjects = await page.locator('[data-testid^="outbox-message-"] .font-semibold').allTextContents();
    expect(subjects.some((s) => s.includes(`Submission #${id}`) && /submitted/.test(s))).toBe(true);
    expect(subjects.some((s) => s.includes(`Submission #${id}`) && /accepted/.test(s))).toBe(true);
    // Newest first: the decision mail comes before the submission mail.
    expect(subjects.findIndex((s) => /accepted/.test(s))).toBeLessThan(subjects.findIndex((s) => /submitted/.test(s)));
    await page.screenshot({ path: screenshotPath("catalogue-review-8-outbox"), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  }, 90_000);
});
