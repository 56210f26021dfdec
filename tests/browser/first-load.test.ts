import type { Server } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { describeFirstLoad, FIRST_LOAD_JS_BUDGET, measureFirstLoad } from "../../scripts/measure-first-load.ts";
import { buildTestApp } from "../helpers/app.ts";
import { clientIsBuilt, listen } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { seedCatalogue } from "../api/catalogue-fixtures.ts";

/**
 * The first visit to /catalogue (empty cache, seeded catalogue) stays within its JavaScript budget
 * (200 kB on the wire, after compression), measured in Debian's chromium by scripts/measure-first-load.ts.
 * It is a size, not a time. KaTeX's code and the plotting library are not part of it: the list's
 * symbols arrive typeset from the server.
 */
describe("browser: first load of /catalogue", () => {
  let tdb: TestDatabase;
  let server: Server;
  let baseUrl: string;

  beforeAll(async () => {
    if (!clientIsBuilt()) throw new Error("dist/ is missing: run `npx vite build` first (npm test does it).");
    tdb = await createTestDatabase();
    await seedCatalogue(tdb.db);
    ({ server, url: baseUrl } = await listen(buildTestApp(tdb)));
  });
  afterAll(async () => {
    await new Promise((r) => server?.close(r));
    await tdb?.drop();
  });

  it("when /catalogue is opened with an empty cache, then at most 200 kB of compressed JavaScript arrives, and no KaTeX or plotting code", async () => {
    const m = await measureFirstLoad(baseUrl, "/catalogue");
    const report = describeFirstLoad(m);
    expect(m.scripts.length, report).toBeGreaterThan(0);
    // Every script came compressed.
    expect(
      m.scripts.filter((s) => s.encoding !== "br" && s.transferred > 1024),
      report,
    ).toEqual([]);
    expect(m.bytes.script, report).toBeLessThanOrEqual(FIRST_LOAD_JS_BUDGET);
    expect(
      m.scripts.map((s) => s.url).filter((u) => /\/assets\/(katex|plot|src)-/.test(u)),
      report,
    ).toEqual([]);
    // The list rendered: its API answer arrived.
    expect(m.bytes.api, report).toBeGreaterThan(0);
  });
});
