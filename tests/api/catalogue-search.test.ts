import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { searchTerms } from "../../server/features/catalogue/search-terms.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

describe("GET /api/v1/theories?text= (search by coupling)", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb);
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  const slugs = async (text: string) => {
    const res = await request(app).get("/api/v1/theories").query({ text });
    expect(res.status).toBe(200);
    return (res.body.theories as { slug: string }[]).map((t) => t.slug);
  };

  it("when Greek letters are typed or pasted, then they are searched spelled out as well", () => {
    expect(searchTerms("α")).toEqual(["α", "alpha"]);
    expect(searchTerms("λ_g")).toEqual(["λ_g", "lambda_g"]);
    expect(searchTerms("Ġ")).toEqual(["Ġ", "Gdot"]);
    expect(searchTerms("\\sqrt{\\alpha}")).toEqual(["\\sqrt{\\alpha}", "sqrt{alpha}"]);
  });

  it("when the text names a coupling by symbol, code name or Greek letter, then the entries holding it are found", async () => {
    // The seeded catalogue: EdGB and dCS both take alpha; the massive graviton lambda_g; varying G, Gdot.
    expect(await slugs("alpha")).toEqual(expect.arrayContaining(["edgb", "dcs"]));
    expect(await slugs("α")).toEqual(expect.arrayContaining(["edgb", "dcs"]));
    expect(await slugs("lambda_g")).toContain("massive-graviton");
    expect(await slugs("λ_g")).toContain("massive-graviton");
    expect(await slugs("Gdot")).toEqual(["varying-g"]);
    expect(await slugs("Ġ")).toEqual(["varying-g"]);
    expect(await slugs("omega_BD")).toEqual(["brans-dicke"]);
    // Entry words still work, and nothing matches nonsense.
    expect(await slugs("chern")).toEqual(["dcs"]);
    expect(await slugs("no-such-coupling-xyz")).toEqual([]);
  });
});
