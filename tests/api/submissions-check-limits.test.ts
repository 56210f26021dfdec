import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TheoryEntryInput } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { craftedDefinitionChecks } from "../helpers/hostile-corpus.ts";
import { seedCatalogue, toyEntry } from "./catalogue-fixtures.ts";

let tdb: TestDatabase;
let app: DragomanApp;
const token: Record<string, string> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  await seedCatalogue(tdb.db);
  app = buildTestApp(tdb);
  for (const [login, roles] of [["l-theorist", ["contributor"]], ["l-editor", ["editor"]]] as const) {
    await ensureUser(tdb.db, { login, roles: [...roles] });
    token[login] = await bearerFor(tdb.db, login);
  }
});
afterAll(async () => {
  await tdb.drop();
});

const auth = (login: string) => ({ Authorization: `Bearer ${token[login]}` });

/** The toy entry with the crafted definitions (each under the per-definition cap) and `expression` as its mapping. */
function craftedEntry(slug: string, expression: string, validity = "16*pi*alpha^2/m1^4"): TheoryEntryInput {
  const [crafted] = craftedDefinitionChecks();
  const base = toyEntry({ slug });
  const mapping = base.mappings[0] as TheoryEntryInput["mappings"][number];
  return {
    ...base,
    couplings: [{ symbol: "alpha", latex: "\\alpha", dimension: 0, unit: "1" }],
    definitions: crafted?.body.definitions ?? [],
    mappings: [{ ...mapping, expression, validity: [{ expression: validity, max: 1 / 6, label: "small coupling" }] }],
  };
}

describe("POST /api/v1/submissions: the evaluation budget", () => {
  it("when a mapping multiplies a definition 600 times, then 400 naming theory.mappings.0.expression with its size, and nothing is stored", async () => {
    const before = await tdb.db("submissions").count<{ count: string }[]>("id as count");
    const res = await request(app)
      .post("/api/v1/submissions")
      .set(auth("l-theorist"))
      .send({ theory: craftedEntry("crafted-mapping", Array.from({ length: 600 }, () => "u").join("*")) });
    expect(res.status).toBe(400);
    const message = res.body.error.fields["theory.mappings.0.expression"] as string;
    expect(message).toMatch(/^theory\.mappings\.0\.expression is too large to evaluate: with its definitions substituted it has \d+ nodes, over the limit of 20000$/);
    expect(res.body.error.message).toContain("theory.mappings.0.expression");
    expect(await tdb.db("submissions").count<{ count: string }[]>("id as count")).toEqual(before);
  });

  it("when only a validity condition is over the budget, then 400 naming its path", async () => {
    const res = await request(app)
      .post("/api/v1/submissions")
      .set(auth("l-theorist"))
      .send({ theory: craftedEntry("crafted-validity", "alpha*w1", Array.from({ length: 600 }, () => "u").join("+")) });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["theory.mappings.0.validity.0.expression"]);
  });
});
