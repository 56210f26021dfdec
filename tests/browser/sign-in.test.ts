import type { BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { clientIsBuilt, launchBrowser, offLoopback, recordRequests, screenshotPath } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

describe("browser: signing in through the fake GitHub's pick page", () => {
  let tdb: TestDatabase;
  let stack: SignInStack;
  let browser: BrowserContext;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    stack = await startSignInStack(tdb);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await stack?.close();
    await tdb?.drop();
  });

  /** Console errors include CSP violations, so an empty list also means the policy let everything through. */
  function watch(page: Page) {
    const errors: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") errors.push(m.text());
    });
    page.on("pageerror", (e) => errors.push(e.message));
    page.on("response", (r) => {
      if (r.status() >= 400) errors.push(`${r.status()} ${r.url()}`);
    });
    return errors;
  }

  it("when demo-editor picks their account, then the header shows their name, roles and navigation, and signing out returns to a visitor", async () => {
    const page = await browser.newPage();
    const requests = recordRequests(page);
    const errors = watch(page);
    await page.goto(stack.baseUrl, { waitUntil: "networkidle" });
    await page.getByRole("banner").getByTestId("sign-in").click();

    await page.waitForURL((u) => u.href.startsWith(stack.fake.url));
    await expect(page.locator("h1").textContent()).resolves.toBe("Local sign-in stand-in");
    await page.screenshot({ path: screenshotPath("sign-in-pick-page") });
    await page.locator('a[data-login="demo-editor"]').click();

    await page.waitForURL(`${stack.baseUrl}/`);
    const menu = page.getByTestId("user-menu");
    await menu.waitFor();
    await expect(menu.textContent()).resolves.toContain("Tomasz Quell");
    const nav = page.getByRole("navigation", { name: "Main" });
    await expect(nav.textContent()).resolves.toContain("Overview");
    // People is for admins only.
    await expect(nav.getByText("People").count()).resolves.toBe(0);
    await menu.click();
    await expect(page.getByTestId("user-roles").textContent()).resolves.toBe("editor");
    await page.screenshot({ path: screenshotPath("sign-in-editor-menu") });

    // The admin page, typed in by hand, says which role it needs.
    await page.goto(`${stack.baseUrl}/admin/people`, { waitUntil: "networkidle" });
    await page.waitForURL(/\/forbidden\?role=admin$/);
    await expect(page.getByTestId("forbidden").textContent()).resolves.toMatch(/needs the admin role.*signed in as Tomasz Quell.*the roles editor/s);
    await page.screenshot({ path: screenshotPath("sign-in-forbidden") });

    await page.getByTestId("user-menu").click();
    await page.getByTestId("sign-out").click();
    await page.waitForURL(`${stack.baseUrl}/`);
    await page.getByRole("banner").getByTestId("sign-in").waitFor();
    await expect(page.getByTestId("user-menu").count()).resolves.toBe(0);
    await page.screenshot({ path: screenshotPath("sign-in-signed-out") });
    const session = await page.evaluate(async () => (await fetch("/api/v1/session")).json());
    expect(session).toEqual({ user: null, csrf_token: null });

    expect(offLoopback(requests)).toEqual([]);
    expect(errors).toEqual([]);
    await page.close();
  });

  it("when a visitor opens the admin page, then they sign in as demo-admin, come back to it and can change a role", async () => {
    const page = await browser.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/admin/people`, { waitUntil: "networkidle" });
    await page.waitForURL(/\/sign-in\?return_to=%2Fadmin%2Fpeople$/);
    await expect(page.locator("main").textContent()).resolves.toMatch(/That page is for signed-in people/);
    await page.screenshot({ path: screenshotPath("sign-in-page") });
    await page.getByTestId("sign-in").click();
    await page.waitForURL((u) => u.href.startsWith(stack.fake.url));
    await page.locator('a[data-login="demo-admin"]').click();

    await page.waitForURL(`${stack.baseUrl}/admin/people`);
    await page.getByTestId("user-row-demo-reader").waitFor();
    await expect(page.getByRole("navigation", { name: "Main" }).textContent()).resolves.toContain("People");
    const toggle = page.getByTestId("role-demo-reader-analyst");
    expect(await toggle.isChecked()).toBe(false);
    // The box follows the stored roles (it is ticked once the server has saved them), so click and wait
    // for the saved state rather than asking Playwright's check() to see it change at once.
    await toggle.click();
    await expect.poll(() => toggle.isChecked(), { timeout: 15_000 }).toBe(true);
    await page.getByTestId("audit-list").getByText("demo-reader").waitFor();
    await expect(page.getByTestId("audit-list").textContent()).resolves.toMatch(/demo-admin.*changed the roles of.*demo-reader.*none → analyst/s);
    expect(await page.getByTestId("role-demo-reader-analyst").isChecked()).toBe(true);
    const stored = await tdb.db("users").where({ login: "demo-reader" }).first();
    expect(stored.roles).toEqual(["analyst"]);

    // Sorting: by name, descending after two clicks.
    await page.getByRole("button", { name: /^Name/ }).click();
    await page.getByRole("button", { name: /^Name/ }).click();
    const firstRow = await page.locator("tbody tr").first().getAttribute("data-testid");
    expect(firstRow).toBe("user-row-demo-editor"); // Tomasz Quell sorts last by name
    await page.screenshot({ path: screenshotPath("sign-in-admin-people"), fullPage: true });
    expect(errors).toEqual([]);
    await page.close();
  });

  it("when demo-analyst makes an API token on the tokens page, then the secret is shown once, works, and revoking it removes it", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    const errors = watch(page);
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=demo-analyst&return_to=%2F`, { waitUntil: "networkidle" });
    await page.getByTestId("user-menu").click();
    await page.getByTestId("api-tokens-link").click();
    await page.waitForURL(`${stack.baseUrl}/account/tokens`);

    await page.getByTestId("create-token").click();
    await expect(page.getByRole("alert").first().textContent()).resolves.toBe("give the token a name");
    await page.getByTestId("token-name").fill("notebook on the cluster");
    await page.getByTestId("create-token").click();
    const secret = (await page.getByTestId("new-token").locator("code").first().textContent()) ?? "";
    expect(secret).toMatch(/^drg_[A-Za-z0-9_-]{43}$/);
    await page.getByTestId("token-list").getByText("notebook on the cluster").waitFor();
    await page.screenshot({ path: screenshotPath("sign-in-api-tokens"), fullPage: true });

    const me = await fetch(`${stack.baseUrl}/api/v1/me`, { headers: { Authorization: `Bearer ${secret}` } });
    expect(await me.json()).toEqual({ user: { login: "demo-analyst", name: "Ruairi Falk", roles: ["analyst"] } });

    await page.getByTestId("token-list").getByRole("button", { name: "Revoke" }).click();
    await page.getByText("You have no API tokens.").waitFor();
    expect((await fetch(`${stack.baseUrl}/api/v1/me`, { headers: { Authorization: `Bearer ${secret}` } })).status).toBe(401);
    expect(errors).toEqual([]);
    await page.close();
  });

  it("when the fake denies an unknown account, then the sign-in page shows a sentence and nobody is signed in", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await page.goto(`${stack.baseUrl}/auth/github?login_hint=nobody-at-all`);
    await page.waitForURL(/\/sign-in\?error=access_denied$/);
    await expect(page.getByTestId("sign-in-error").textContent()).resolves.toMatch(/You are not signed in\.GitHub did not let you in/);
    expect(await page.evaluate(async () => (await fetch("/api/v1/session")).json())).toEqual({ user: null, csrf_token: null });
    await expect(page.getByTestId("sign-in").count()).resolves.toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath("sign-in-denied") });
    await page.close();
  });
});
