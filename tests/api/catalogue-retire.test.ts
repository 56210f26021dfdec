import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { theoryEntrySchema, type TheoryEntry } from "../../common/catalogue.ts";
import { publishEntry } from "../../server/features/catalogue/publish.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * Retiring and restoring entries, couplings and mappings (editors): the translator's answers before,
 * during and after, the revision history, and the refusals.
 */

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
let editor: string;
let analyst: string;

const EDGB_BOUND = { bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" } };
const JOHANNSEN_BOUND = { bound: { parameter: "ppe_beta", b: -1, upper: 0.5, credibility: 0.9 }, binary: { m1: 30, m2: 25, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" } };

beforeAll(async () => {
  tdb = await createTestDatabase();
  await tdb.db.transaction((trx) => catalogueSeed.run(trx));
  app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  await ensureUser(tdb.db, { login: "r-editor", roles: ["editor"] });
  await ensureUser(tdb.db, { login: "r-analyst", roles: ["analyst"] });
  editor = await bearerFor(tdb.db, "r-editor");
  analyst = await bearerFor(tdb.db, "r-analyst");
});
afterAll(async () => {
  await tdb?.drop();
});

async function translated(body: object): Promise<{ theory: string; coupling: { symbol: string; value: number } }[]> {
  const res = await request(app).post("/api/v1/convert").send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.results;
}
const post = (path: string, body: object, token = editor) => request(app).post(path).set("Authorization", `Bearer ${token}`).send(body);

describe("POST /api/v1/theories/:slug/retire and /restore (entry)", () => {
  it("when an editor retires an entry, then it leaves translations, stays readable with its reason, and a restore brings the same answer back", async () => {
    const before = (await translated(EDGB_BOUND)).find((r) => r.theory === "edgb");
    expect(before?.coupling.value).toBeGreaterThan(0);
    const revisionsBefore = (await request(app).get("/api/v1/theories/edgb/revisions")).body.revisions.length;

    const res = await post("/api/v1/theories/edgb/retire", { reason: "superseded by a corrected mapping" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ slug: "edgb", revision: revisionsBefore + 1, retired: { reason: "superseded by a corrected mapping", by: "r-editor" } });

    expect((await translated(EDGB_BOUND)).some((r) => r.theory === "edgb")).toBe(false);
    const detail = await request(app).get("/api/v1/theories/edgb");
    expect(detail.status).toBe(200);
    expect(detail.body.retired).toMatchObject({ reason: "superseded by a corrected mapping", by: "r-editor" });
    const listed = (await request(app).get("/api/v1/theories")).body.theories.find((t: { slug: string }) => t.slug === "edgb");
    expect(listed?.retired?.reason).toBe("superseded by a corrected mapping");
    // Retiring is a revision like any other: the history shows who and the diff shows the mark.
    const revs = (await request(app).get("/api/v1/theories/edgb/revisions")).body.revisions;
    expect(revs[0]).toMatchObject({ number: revisionsBefore + 1, author: { login: "r-editor" }, accepted_by: { login: "r-editor" } });
    const rev = (await request(app).get(`/api/v1/theories/edgb/revisions/${revisionsBefore + 1}`)).body;
    expect(JSON.stringify(rev.diff)).toContain("retired");
    expect(rev.entry.retired.reason).toBe("superseded by a corrected mapping");

    const again = await post("/api/v1/theories/edgb/retire", { reason: "twice" });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already retired/);

    const restored = await post("/api/v1/theories/edgb/restore", {});
    expect(restored.status).toBe(200);
    expect(restored.body).toMatchObject({ revision: revisionsBefore + 2, retired: null });
    const after = (await translated(EDGB_BOUND)).find((r) => r.theory === "edgb");
    expect(after?.coupling.value).toBe(before?.coupling.value);
    expect((await request(app).get("/api/v1/theories/edgb")).body.retired).toBeNull();

    const twice = await post("/api/v1/theories/edgb/restore", {});
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toMatch(/not retired/);
  });

  it("when a change to a retired theory is published, then 409: an editor restores it first", async () => {
    expect((await post("/api/v1/theories/dcs/retire", { reason: "under re-derivation" })).status).toBe(200);
    const latest = await tdb.db("theory_revisions as r").join("theories as t", "t.id", "r.theory_id").where("t.slug", "dcs").orderBy("r.number", "desc").first("r.entry", "r.checks");
    const entry = theoryEntrySchema.parse(latest.entry);
    const { retired: _mark, ...change } = entry;
    await expect(
      tdb.db.transaction((trx) => publishEntry(trx, { ...change, summary: `${change.summary} (edited)` } as TheoryEntry, latest.checks, { targetSlug: "dcs", submissionId: null, authorId: null, acceptedBy: null, now: new Date() })),
    ).rejects.toThrow(/retired; an editor restores it/);
    expect((await post("/api/v1/theories/dcs/restore", {})).status).toBe(200);
  });
});

describe("POST /api/v1/theories/:slug/retire (one coupling or one mapping)", () => {
  it("when one coupling is retired, then its mappings leave translations and the other coupling stays; a restore brings it back", async () => {
    const symbolsOf = async () => (await translated(JOHANNSEN_BOUND)).filter((r) => r.theory === "johannsen").map((r) => r.coupling.symbol);
    const before = await symbolsOf();
    expect(before.length).toBeGreaterThan(0);
    const res = await post("/api/v1/theories/johannsen/retire", { coupling: "alpha13", reason: "no field equations behind this deformation" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.target).toMatch(/coupling alpha13/);
    const detail = (await request(app).get("/api/v1/theories/johannsen")).body;
    expect(detail.retired).toBeNull();
    expect(detail.couplings.find((c: { symbol: string }) => c.symbol === "alpha13").retired.reason).toMatch(/no field equations/);
    for (const m of detail.mappings.filter((x: { coupling: string }) => x.coupling === "alpha13")) expect(m.retired).not.toBeNull();
    const during = await symbolsOf();
    expect(during).not.toContain("alpha13");
    expect((await post("/api/v1/theories/johannsen/restore", { coupling: "alpha13" })).status).toBe(200);
    expect(await symbolsOf()).toEqual(before);
  });

  it("when one mapping is retired, then only that mapping leaves translations", async () => {
    const res = await post("/api/v1/theories/edgb/retire", { mapping: 0, reason: "printed form to be confirmed" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.target).toMatch(/^mapping 0/);
    expect((await translated(EDGB_BOUND)).some((r) => r.theory === "edgb")).toBe(false);
    const detail = (await request(app).get("/api/v1/theories/edgb")).body;
    expect(detail.retired).toBeNull();
    expect(detail.mappings[0].retired.reason).toBe("printed form to be confirmed");
    expect((await post("/api/v1/theories/edgb/restore", { mapping: 0 })).status).toBe(200);
    expect((await translated(EDGB_BOUND)).some((r) => r.theory === "edgb")).toBe(true);
  });

  it("when an entry keeps a live mapping of a retired coupling, then the entry is refused naming the mapping's coupling", () => {
    const parsed = theoryEntrySchema.safeParse({
      slug: "toy",
      name: "Toy",
      family: "other",
      summary: "A toy entry.",
      couplings: [{ symbol: "g", latex: "g", dimension: 0, unit: "1", retired: { reason: "gone", at: "2026-01-01T00:00:00.000Z" } }],
      mappings: [{ kind: "inspiral_phase", pn_order: -1, b: -7, expression: "g*eta^(2/5)", coupling: "g" }],
      references: [{ key: "r", authors: ["A. Author"], title: "T", year: 2020 }],
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join("."))).toContain("mappings.0.coupling");
  });
});

describe("amplitude mappings (common/theory-entry.ts)", () => {
  it("when an amplitude exponent does not match its PN order, then the entry is refused naming a (a = 2n, Yunes & Pretorius 2009)", () => {
    const entry = (a: number) => ({
      slug: "toy-amp",
      name: "Toy",
      family: "other",
      summary: "A toy entry.",
      couplings: [{ symbol: "g", latex: "g", dimension: 0, unit: "1" }],
      mappings: [{ kind: "inspiral_amplitude", pn_order: -1, a, expression: "g" }],
      references: [{ key: "r", authors: ["A. Author"], title: "T", year: 2020 }],
    });
    expect(theoryEntrySchema.safeParse(entry(-2)).success).toBe(true);
    const wrong = theoryEntrySchema.safeParse(entry(-7));
    expect(wrong.success).toBe(false);
    expect(wrong.error?.issues.find((i) => i.path.join(".") === "mappings.0.a")?.message).toMatch(/gives a = -2, not -7/);
  });
});

describe("retire and restore: refusals", () => {
  it("when the caller is not an editor, the theory unknown, a field unknown or the target out of range, then 401/403/404/400", async () => {
    expect((await request(app).post("/api/v1/theories/edgb/retire").send({ reason: "x" })).status).toBe(401);
    const forbidden = await post("/api/v1/theories/edgb/retire", { reason: "x" }, analyst);
    expect(forbidden.status).toBe(403);
    expect((await post("/api/v1/theories/no-such-theory/retire", { reason: "x" })).status).toBe(404);
    const unknown = await post("/api/v1/theories/edgb/retire", { reason: "x", because: "y" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toContain("because");
    const noReason = await post("/api/v1/theories/edgb/retire", {});
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields).toHaveProperty("reason");
    const badIndex = await post("/api/v1/theories/edgb/retire", { reason: "x", mapping: 40 });
    expect(badIndex.status).toBe(400);
    expect(badIndex.body.error.fields).toHaveProperty("mapping");
    const badCoupling = await post("/api/v1/theories/edgb/retire", { reason: "x", coupling: "nope" });
    expect(badCoupling.status).toBe(400);
    expect(badCoupling.body.error.fields).toHaveProperty("coupling");
    // Nothing was written by any refusal.
    expect((await request(app).get("/api/v1/theories/edgb")).body.retired).toBeNull();
  });
});
