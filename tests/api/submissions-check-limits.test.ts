import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TheoryEntryInput } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { craftedDefinitionChecks } from "../helpers/hostile-corpus.ts";
import { SymbolicPool } from "../../server/physics/expr/pool.ts";
import { seedCatalogue, toyEntry } from "./catalogue-fixtures.ts";

let tdb: TestDatabase;
let app: DragomanApp;
const token: Record<string, string> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  await seedCatalogue(tdb.db);
  app = buildTestApp(tdb);
  for (const [login, roles] of [["l-theorist", ["contributor"]], ["l-editor", ["editor"]], ["l-editor2", ["editor"]]] as const) {
    await ensureUser(tdb.db, { login, roles: [...roles] });
    token[login] = await bearerFor(tdb.db, login);
  }
});
afterAll(async () => {
  await app.locals.checkPool.close();
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

describe("POST /api/v1/submissions/:id/decision with an inconclusive check", () => {
  it("when a check was stopped by its time limit, then the submission cannot be accepted and says why; a save re-runs the checks and then it can", async () => {
    // A CAS that never answers: the derivation check (whose numbers agree, so it asks the CAS) can
    // only end at the worker's time limit.
    const stalled = buildTestApp(tdb, { CHECK_TIMEOUT_MS: "1500" }, { symbolicPool: new SymbolicPool({ transport: () => new Promise(() => undefined) }) });
    const base = toyEntry({ slug: "toy-inconclusive" });
    const mapping = base.mappings[0] as TheoryEntryInput["mappings"][number];
    // B = (5/96) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^4): the dipole flux behind the toy beta (derived; Yagi 2012, PRD 86 081504).
    const entry = { ...base, mappings: [{ ...mapping, derivation: { kind: "energy_flux" as const, order: -1, B: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" } }] };
    const created = await request(stalled).post("/api/v1/submissions").set(auth("l-theorist")).send({ theory: entry });
    expect(created.status).toBe(201);
    expect(created.body.checks).toMatchObject({ ok: false, failures: 0, inconclusive: 1 });
    const open = created.body.checks.results.filter((r: { severity: string }) => r.severity === "inconclusive");
    expect(open).toEqual([expect.objectContaining({ path: "mappings.0", name: "evaluation", ok: false })]);
    const id = created.body.id as number;
    expect((await request(app).post(`/api/v1/submissions/${id}/submit`).set(auth("l-theorist")).send({})).status).toBe(200);
    expect((await request(app).post(`/api/v1/submissions/${id}/start-review`).set(auth("l-editor")).send({})).status).toBe(200);

    const refused = await request(app).post(`/api/v1/submissions/${id}/decision`).set(auth("l-editor")).send({ decision: "accept" });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain("cannot be accepted: one check is inconclusive");
    expect(refused.body.error.message).toContain("mappings.0 (evaluation)");
    expect(refused.body.error.message).toContain("Save the submission again");
    expect(refused.body.error.details).toMatchObject({ reason: "inconclusive_checks", inconclusive: [expect.objectContaining({ path: "mappings.0" })] });
    expect((await tdb.db("submissions").where({ id }).first()).status).toBe("in_review");

    // An editor saves the same version with the CAS working: the checks finish, and another editor can accept it.
    const saved = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("l-editor")).send({ version: 1, theory: entry });
    expect(saved.status).toBe(200);
    expect(saved.body.checks).toMatchObject({ ok: true, inconclusive: 0 });
    const accepted = await request(app).post(`/api/v1/submissions/${id}/decision`).set(auth("l-editor2")).send({ decision: "accept" });
    expect(accepted.status).toBe(200);
    await stalled.locals.checkPool.close();
  });
});
