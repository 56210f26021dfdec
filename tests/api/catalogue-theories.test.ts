import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { theoryDetailSchema, theoryListResponseSchema } from "../../common/catalogue.ts";
import { THEORIES } from "../../seeds/data/theories.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { seedCatalogue } from "./catalogue-fixtures.ts";

let tdb: TestDatabase;
let app: DragomanApp;
let published: string[];

beforeAll(async () => {
  tdb = await createTestDatabase();
  await seedCatalogue(tdb.db);
  app = buildTestApp(tdb);
  published = (await tdb.db("theories").select<{ slug: string }[]>("slug")).map((r) => r.slug);
});
afterAll(async () => {
  await tdb.drop();
});

describe("GET /api/v1/theories", () => {
  it("when called without filters, then 200 with every accepted entry, each with its mappings and references", async () => {
    const res = await request(app).get("/api/v1/theories");
    expect(res.status).toBe(200);
    const body = theoryListResponseSchema.parse(res.body);
    expect(body.theories.map((t) => t.slug).sort()).toEqual([...published].sort());
    expect(body.theories.length).toBeGreaterThanOrEqual(12);
    for (const slug of ["edgb", "dcs", "massive-graviton", "varying-g", "extra-dimension", "noncommutative", "johannsen"]) {
      expect(published, slug).toContain(slug);
    }
    const edgb = body.theories.find((t) => t.slug === "edgb");
    expect(edgb).toMatchObject({ name: expect.stringContaining("Gauss-Bonnet"), family: "quadratic-gravity", revision: 1 });
    expect(edgb?.mappings).toEqual([{ kind: "inspiral_phase", b: -7, a: null, pn_order: -1, retired: false, source_status: "derived" }]);
    expect(edgb?.references.map((r) => r.arxiv)).toContain("2104.11189");
  });

  it("when filtered by b = -7, then only entries with a b = -7 mapping, matching a direct SQL query", async () => {
    const res = await request(app).get("/api/v1/theories").query({ b: -7 });
    expect(res.status).toBe(200);
    const slugs = (res.body.theories as { slug: string; mappings: { b: number }[] }[]).map((t) => t.slug).sort();
    const sql = await tdb.db("theories as t").whereExists((q) => q.select(tdb.db.raw("1")).from("mappings as m").whereRaw("m.theory_id = t.id and m.b = -7")).orderBy("slug").pluck("slug");
    expect(slugs).toEqual(sql);
    expect(slugs).toContain("edgb");
    expect(slugs).not.toContain("dcs");
    for (const t of res.body.theories as { mappings: { b: number }[] }[]) expect(t.mappings.some((m) => m.b === -7)).toBe(true);
  });

  it("when filtered by family and by text, then the filters combine", async () => {
    const fam = await request(app).get("/api/v1/theories").query({ family: "quadratic-gravity" });
    expect(fam.status).toBe(200);
    expect((fam.body.theories as { slug: string }[]).map((t) => t.slug).sort()).toEqual(["dcs", "edgb"]);
    const text = await request(app).get("/api/v1/theories").query({ text: "chern" });
    expect((text.body.theories as { slug: string }[]).map((t) => t.slug)).toEqual(["dcs"]);
    const both = await request(app).get("/api/v1/theories").query({ family: "quadratic-gravity", b: -1 });
    expect((both.body.theories as { slug: string }[]).map((t) => t.slug)).toEqual(["dcs"]);
    const none = await request(app).get("/api/v1/theories").query({ text: "100%_match" });
    expect(none.body.theories).toEqual([]);
  });

  it("when b is not a number or the family unknown, then 400 naming the parameter", async () => {
    const bad = await request(app).get("/api/v1/theories").query({ b: "minus-seven" });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("b");
    const fam = await request(app).get("/api/v1/theories").query({ family: "string-theory" });
    expect(fam.status).toBe(400);
    expect(fam.body.error.fields).toHaveProperty("family");
  });
});

describe("GET /api/v1/theories/:slug", () => {
  it("when the slug is edgb, then the full entry: three conventions, zeta, mapping with LaTeX, validity, checks, references and bounds", async () => {
    const res = await request(app).get("/api/v1/theories/edgb");
    expect(res.status).toBe(200);
    const t = theoryDetailSchema.parse(res.body);
    expect(t.revision.number).toBe(1);
    expect(new Date(t.revision.published_at).getTime()).not.toBeNaN();
    const alpha = t.couplings[0];
    expect(alpha).toMatchObject({ symbol: "alpha", dimension: 2, unit: "km^2", quoted: { form: "sqrt", symbol: "sqrt_alpha", unit: "km" } });
    // EdGB normalisations: conventions A, SZ (alpha/sqrt(8 pi)) and JB (alpha/sqrt(16 pi)).
    expect(alpha?.conventions.map((c) => c.name)).toEqual(["A", "SZ", "JB"]);
    expect(alpha?.conventions[1]?.factor).toBeCloseTo(1 / Math.sqrt(8 * Math.PI), 12);
    expect(alpha?.conventions[2]?.factor).toBeCloseTo(1 / Math.sqrt(16 * Math.PI), 12);
    expect(alpha?.conventions[2]?.reference?.arxiv).toBe("2406.03568");
    expect(t.definitions).toEqual([expect.objectContaining({ symbol: "zeta", expression: "16*pi*alpha^2/M^4" })]);

    const m = t.mappings[0];
    expect(m).toMatchObject({ kind: "inspiral_phase", b: -7, pn_order: -1, coupling: "alpha", checks_ok: true });
    expect(m?.latex).toContain("7168");
    expect(m?.checks.map((c) => c.name)).toEqual(expect.arrayContaining(["parse", "symbols", "dimension", "gr_limit", "pn_order", "derivation"]));
    expect(m?.checks.every((c) => c.path === "mappings.0" && c.ok)).toBe(true);
    expect(m?.validity).toHaveLength(2);
    expect(m?.validity[0]).toMatchObject({ max: 1 / 6, kind: "hard", body: 1, applies_to: ["bh"] });
    expect(m?.validity[0]?.reference).toBeNull();
    expect(m?.validity[0]?.reference_note).toContain("memory");
    expect(m?.validity[0]?.checks.length).toBeGreaterThan(0);
    expect(m?.validity[0]?.checks.every((c) => c.path === "mappings.0.validity.0")).toBe(true);
    expect(m?.body_rules[0]).toMatchObject({ kind: "charge", bodies: ["bh", "ns"] });
    expect(m?.references.map((r) => r.key)).toEqual(["yunes-yagi-pretorius-2016", "yagi-2012", "yagi-stein-yunes-2016"]);
    expect(t.reference_bounds.map((b) => [b.value, b.unit, b.reference.key])).toEqual([
      [1.9, "km", "yagi-2012"],
      [1.7, "km", "perkins-nair-silva-yunes-2021"],
      [1.33, "km", "lyu-jiang-yagi-2022"],
    ]);
    // The seed marks EdGB's printed normalisation as recalled, so the entry carries the flag.
    expect(t.source_to_be_confirmed).toBe(true);
  });

  it("when a mapping's formula is marked memory, then that mapping says source to be confirmed", async () => {
    const memory = THEORIES.flatMap((e) => e.mappings.map((m, i) => ({ slug: e.slug, i, status: m.source_status }))).filter((x) => x.status === "memory");
    expect(memory.length).toBeGreaterThan(0);
    for (const x of memory) {
      if (!published.includes(x.slug)) continue;
      const res = await request(app).get(`/api/v1/theories/${x.slug}`);
      expect(res.body.mappings[x.i]).toMatchObject({ source_status: "memory", source_to_be_confirmed: true });
      expect(res.body.source_to_be_confirmed).toBe(true);
    }
    const dcs = await request(app).get("/api/v1/theories/dcs");
    expect(dcs.body.mappings[0].source_to_be_confirmed).toBe(dcs.body.mappings[0].source_status === "memory");
  });

  it("when the list is read, then each mapping carries the same three-way status as the entry's page, and an entry with a formula from memory says source to be confirmed", async () => {
    const list = theoryListResponseSchema.parse((await request(app).get("/api/v1/theories")).body).theories;
    const seen = new Set<string>();
    for (const t of list) {
      const detail = (await request(app).get(`/api/v1/theories/${t.slug}`)).body as { mappings: { source_status: string }[]; source_to_be_confirmed: boolean };
      expect(t.mappings.map((m) => m.source_status), t.slug).toEqual(detail.mappings.map((m) => m.source_status));
      expect(t.source_to_be_confirmed, t.slug).toBe(detail.source_to_be_confirmed);
      if (t.mappings.some((m) => m.source_status === "memory")) expect(t.source_to_be_confirmed, t.slug).toBe(true);
      for (const m of t.mappings) seen.add(m.source_status);
    }
    // The seeded catalogue has formulas of all three kinds (dCS confirmed, EdGB derived, noncommutative from memory).
    expect([...seen].sort()).toEqual(["confirmed", "derived", "memory"]);
  });

  it("when the slug is unknown, then 404 naming it", async () => {
    const res = await request(app).get("/api/v1/theories/no-such-theory");
    expect(res.status).toBe(404);
    expect(res.body.error.message).toContain("no-such-theory");
  });
});

describe("GET /api/v1/theories/:slug/revisions", () => {
  it("when a theory was seeded, then revision 1 is listed and readable with a diff listing everything as added", async () => {
    const list = await request(app).get("/api/v1/theories/massive-graviton/revisions");
    expect(list.status).toBe(200);
    expect(list.body.slug).toBe("massive-graviton");
    expect(list.body.revisions).toHaveLength(1);
    expect(list.body.revisions[0]).toMatchObject({ number: 1, submission_id: null, author: null, accepted_by: null });
    const one = await request(app).get("/api/v1/theories/massive-graviton/revisions/1");
    expect(one.status).toBe(200);
    expect(one.body.entry.slug).toBe("massive-graviton");
    expect(one.body.checks.ok).toBe(true);
    expect(one.body.diff.removed).toEqual([]);
    expect(one.body.diff.changed).toEqual([]);
    expect(one.body.diff.added.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(["slug", "couplings", "mappings", "references"]));
    expect(list.body.revisions[0].change_count).toBe(one.body.diff.added.length);
  });

  it("when the revision does not exist or is not a number, then 404 and 400", async () => {
    expect((await request(app).get("/api/v1/theories/edgb/revisions/2")).status).toBe(404);
    const bad = await request(app).get("/api/v1/theories/edgb/revisions/latest");
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("n");
    expect((await request(app).get("/api/v1/theories/nope/revisions")).status).toBe(404);
  });
});

describe("GET /api/v1/theories/:slug/bibtex", () => {
  it("when the theory cites six papers, then six BibTeX entries with their keys", async () => {
    const res = await request(app).get("/api/v1/theories/edgb/bibtex");
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toContain("application/x-bibtex");
    const keys = [...res.text.matchAll(/^@\w+\{([^,]+),/gm)].map((m) => m[1]);
    const detail = await request(app).get("/api/v1/theories/edgb");
    expect(keys).toEqual(detail.body.references.map((r: { key: string }) => r.key));
    expect(res.text).toContain("eprint = {2104.11189}");
  });
});
