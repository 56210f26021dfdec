import { readFileSync } from "node:fs";
import path from "node:path";
import type { BrowserContext, Page } from "playwright-core";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "../../seeds/index.ts";
import { bearerFor, ensureUser, startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { axeSerious } from "../helpers/axe.ts";
import { clientIsBuilt, launchBrowser, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * Every route of the client router, walked at a phone's width (375 px) and a laptop's (1366 px) by a
 * person holding every role: the page must not scroll sideways, its title must be its own, and an
 * accessibility scan (axe-core) must find no serious or critical violation. The route list is read
 * from client/app/router.tsx, so a page added there is covered without touching this test; a route
 * parameter this test does not know gets a placeholder value (the page's "not found" state is then
 * what is checked).
 */

const WIDTHS = [375, 1366] as const;

/** The paths declared in the router, in order ("*" last). */
function routerPaths(): string[] {
  const source = readFileSync(path.resolve("client", "app", "router.tsx"), "utf8");
  return [...source.matchAll(/path:\s*"([^"]+)"/g)].map((m) => m[1]!);
}

/** The outermost elements that stick out on the right (inside a scrolling box is fine), to name the culprit. */
async function widest(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    const inScroller = (el: Element) => {
      for (let p = el.parentElement; p; p = p.parentElement) if (/(auto|scroll|hidden)/.test(getComputedStyle(p).overflowX)) return true;
      return false;
    };
    for (const el of document.querySelectorAll("body *")) {
      if (el.getBoundingClientRect().right <= window.innerWidth + 0.5 || inScroller(el)) continue;
      if (el.parentElement && el.parentElement.getBoundingClientRect().right > window.innerWidth + 0.5 && !inScroller(el.parentElement)) continue;
      out.push(`<${el.tagName.toLowerCase()} class="${el.getAttribute("class") ?? ""}"> ${(el.textContent ?? "").slice(0, 40)}`);
      if (out.length >= 4) break;
    }
    return out;
  });
}

describe("browser: every route at 375 px and 1366 px", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let browser: BrowserContext;
  const params: Record<string, string> = {};

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await seedDemo(tdb.db);
    stack = await startSignInStack(tdb, { env: { RATE_LIMIT_PER_MINUTE: "100000" } });
    // One person who may open every page.
    await ensureUser(tdb.db, { login: "demo-admin", roles: ["admin", "editor", "analyst", "contributor"] });
    const token = `Bearer ${await bearerFor(tdb.db, "demo-admin")}`;
    const sheet = await request(stack.app)
      .post("/api/v1/sheets")
      .set("Authorization", token)
      .send({
        name: "Route walk sheet",
        records: [{ label: "KV-231107a", detector_network: "Kestrel-Vireo", bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } }],
      });
    expect(sheet.status, JSON.stringify(sheet.body)).toBe(201);
    const share = await request(stack.app).post(`/api/v1/sheets/${sheet.body.id}/share`).set("Authorization", token).expect(201);
    const submission = await tdb.db("submissions").orderBy("id").first<{ id: number }>("id");
    params["sheets/:id"] = String(sheet.body.id);
    params[":token"] = String(share.body.token);
    params[":slug"] = "edgb";
    params["submit/:id"] = String(submission?.id ?? 1);
    // The resubmission: its review page carries both diffs (since the returned version, against the published revision).
    const resubmission = await tdb.db("submissions").where({ status: "resubmitted" }).first<{ id: number } | undefined>("id");
    params["review/:id"] = String(resubmission?.id ?? submission?.id ?? 1);
    browser = await launchBrowser();
    const page = await browser.newPage();
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-admin&return_to=/`, { waitUntil: "networkidle" });
    await page.close();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await stack?.close();
    await tdb?.drop();
  });

  function concrete(route: string): string {
    if (route === "*") return "/no-such-page";
    return `/${route
      .split("/")
      .map((part) => (part.startsWith(":") ? (params[`${route.split("/")[0]}/${part}`] ?? params[part] ?? "1") : part))
      .join("/")}`;
  }

  it("when each route is opened at both widths, then nothing scrolls sideways, each title is its own and axe finds nothing serious", { timeout: 600_000 }, async () => {
    const routes = ["/", ...routerPaths().map(concrete)];
    const shotName = (url: string) => (url === "/" ? "home" : (routerPaths().find((r) => concrete(r) === url) ?? url).replace(/[^a-z0-9]+/gi, "-").replace(/^-|-$/g, ""));
    expect(routes.length).toBeGreaterThan(15);
    const titles = new Map<string, string>();
    const problems: string[] = [];
    for (const width of WIDTHS) {
      const page = await browser.newPage();
      await page.setViewportSize({ width, height: width === 375 ? 740 : 860 });
      for (const url of routes) {
        await page.goto(`${stack.baseUrl}${url}`, { waitUntil: "networkidle" });
        await page.locator("main h1").first().waitFor({ timeout: 15_000 });
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
        if (overflow > 0) problems.push(`${url} at ${width} px: the page is ${overflow} px wider than the screen, because of ${(await widest(page)).join(", ")}`);
        const title = await page.title();
        // A route that sends a signed-in person elsewhere (the sign-in page) is judged where it lands.
        if (width === 375 && new URL(page.url()).pathname === url) {
          const clash = [...titles.entries()].find(([, t]) => t === title);
          if (clash) problems.push(`${url} has the same title as ${clash[0]}: "${title}"`);
          titles.set(url, title);
        }
        for (const v of await axeSerious(page)) problems.push(`${url} at ${width} px: ${v}`);
        // Phones: the first screen (what the header and the page's start look like); laptops: the whole page.
        await page.screenshot({ path: screenshotPath(`route-${width}-${shotName(url)}`), fullPage: width !== 375 });
      }
      await page.close();
    }
    expect(problems).toEqual([]);
  });

  it("when the keyboard is used on a narrow screen, then a skip link comes first and the menu opens and closes", { timeout: 60_000 }, async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 375, height: 740 });
    await page.goto(`${stack.baseUrl}/catalogue`, { waitUntil: "networkidle" });
    await page.locator("main h1").first().waitFor();
    await page.keyboard.press("Tab");
    await expect(page.evaluate(() => document.activeElement?.textContent ?? "")).resolves.toMatch(/Skip to the content/);
    await page.keyboard.press("Enter");
    await page.waitForFunction(() => document.activeElement?.id === "main", undefined, { timeout: 5000 });
    const menu = page.getByRole("button", { name: "Menu" });
    await expect(menu.getAttribute("aria-expanded")).resolves.toBe("false");
    await expect(page.getByRole("navigation", { name: "Main" }).isVisible()).resolves.toBe(false);
    await menu.click();
    await expect(menu.getAttribute("aria-expanded")).resolves.toBe("true");
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Translate" }).click();
    await page.waitForURL(/\/translate$/);
    // The menu closes once the new page has rendered (its module loads on demand): poll, do not race it.
    await expect.poll(() => menu.getAttribute("aria-expanded"), { timeout: 15_000 }).toBe("false");
    await expect(page.title()).resolves.toMatch(/^Translate a bound · Dragoman$/);
    await page.close();
  });
});
