import type { Server } from "node:http";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeSymbolicPool } from "../../server/physics/expr/pool.ts";
import { buildTestApp } from "../helpers/app.ts";
import { listen } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { hostileCorpus } from "../helpers/hostile-corpus.ts";

const EDGB = {
  target: "ppe_phase",
  b: -7,
  pn_order: -1,
  couplings: [{ symbol: "alpha", dimension: 2 }],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
};
// EdGB dipole term (normalisation derived; Yagi 2012, PRD 86 081504).
const EDGB_BETA = "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))";

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
});
afterAll(async () => {
  await closeSymbolicPool();
  await tdb.drop();
});

describe("POST /api/v1/expressions/check", () => {
  it("when the EdGB mapping is checked, then every check passes and LaTeX comes back", async () => {
    const res = await request(app).post("/api/v1/expressions/check").send({ ...EDGB, expression: EDGB_BETA });
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(true);
    expect(res.body.checks.map((c: { name: string }) => c.name)).toEqual(expect.arrayContaining(["parse", "symbols", "dimension", "gr_limit", "pn_order"]));
    expect(res.body.latex).toMatch(/\\frac|\\zeta/);
  });

  it("when a coupling declared with GR at 0 is upside down, then 200 with gr_limit failing as an error", async () => {
    const res = await request(app)
      .post("/api/v1/expressions/check")
      .send({ ...EDGB, couplings: [{ symbol: "alpha", dimension: 2, gr_value: "zero" }], definitions: [{ symbol: "zeta", expression: "16*pi*M^4/alpha^2" }], expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^12*eta^(18/5))" });
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    expect(res.body.checks.find((c: { name: string }) => c.name === "gr_limit")).toMatchObject({ ok: false, severity: "error", message: expect.stringMatching(/upside down/) });
  });

  it("when a dipole survives identical bodies, then the symmetry check fails", async () => {
    const res = await request(app).post("/api/v1/expressions/check").send({ ...EDGB, expression: EDGB_BETA.replace("m1^2*s2 - m2^2*s1", "m1^2*s2 + m2^2*s1") });
    expect(res.status).toBe(200);
    expect(res.body.checks.find((c: { name: string }) => c.name === "symmetry")).toMatchObject({ ok: false, severity: "error" });
  });

  it("when a massive-graviton beta has pi for pi^2, then the propagation check names it (Will 1998: -pi^2 D_0 Mc / lambda_g^2)", async () => {
    const body = {
      target: "ppe_phase",
      b: -3,
      pn_order: 1,
      couplings: [{ symbol: "lambda_g", dimension: 1, gr_value: "infinity" }],
      derivation: { propagation: { alpha_md: 0, coefficient: "1/lambda_g^2" } },
    };
    const right = await request(app).post("/api/v1/expressions/check").send({ ...body, expression: "-pi^2*D_0*Mc/lambda_g^2" });
    expect(right.status).toBe(200);
    expect(right.body.ok).toBe(true);
    expect(right.body.checks.find((c: { name: string }) => c.name === "propagation")).toMatchObject({ ok: true });
    const wrong = await request(app).post("/api/v1/expressions/check").send({ ...body, expression: "-pi*D_0*Mc/lambda_g^2" });
    expect(wrong.body.checks.find((c: { name: string }) => c.name === "propagation")).toMatchObject({ ok: false, message: expect.stringMatching(/one power of pi missing/) });
  });

  it("when a coupling's gr_value is not zero or infinity, then 400 naming the field", async () => {
    const res = await request(app).post("/api/v1/expressions/check").send({ ...EDGB, couplings: [{ symbol: "alpha", dimension: 2, gr_value: "one" }], expression: EDGB_BETA });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["couplings.0.gr_value"]);
  });

  it("when zeta lacks its M^4, then the dimension check fails and says which dimension it found", async () => {
    const res = await request(app)
      .post("/api/v1/expressions/check")
      .send({ ...EDGB, definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2" }], expression: EDGB_BETA });
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    const dim = res.body.checks.find((c: { name: string }) => c.name === "dimension");
    expect(dim.ok).toBe(false);
    expect(dim.message).toMatch(/length\^4/);
  });

  it("when a symbol is undeclared, then the symbols check names it", async () => {
    const res = await request(app).post("/api/v1/expressions/check").send({ ...EDGB, expression: "alhpa^2/M^4" });
    expect(res.status).toBe(200);
    const sym = res.body.checks.find((c: { name: string }) => c.name === "symbols");
    expect(sym.ok).toBe(false);
    expect(sym.message).toContain('"alhpa"');
  });

  it("when the input is too long or uses assignment, then 400 with fields.expression naming the position", async () => {
    const long = await request(app).post("/api/v1/expressions/check").send({ ...EDGB, expression: "alpha+".repeat(400) + "alpha" });
    expect(long.status).toBe(400);
    expect(long.body.error.fields.expression).toMatch(/2,?000/);
    const assign = await request(app).post("/api/v1/expressions/check").send({ ...EDGB, expression: "alpha := 2" });
    expect(assign.status).toBe(400);
    expect(assign.body.error.fields.expression).toMatch(/:=/);
    expect(assign.body.error.details.position).toBe(6);
  });

  it("when the body lacks a target, then 400 naming target", async () => {
    const res = await request(app).post("/api/v1/expressions/check").send({ expression: "alpha", couplings: [] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("target");
  });
});

describe("POST /api/v1/expressions/derive", () => {
  it("when a dispersion relation is given, then the propagation term comes back at b = 3 (alpha - 1), evaluated at a point", async () => {
    // Mirshekari, Yunes & Will 2012 (re-derived): beta = pi^(2 - a) D_a Acal Mc^(1 - a) / (a - 1); a = 0, Acal = 1/lambda_g^2.
    const res = await request(app)
      .post("/api/v1/expressions/derive")
      .send({ propagation: { alpha_md: 0, coefficient: "1/lambda_g^2" }, couplings: [{ symbol: "lambda_g", dimension: 1 }], evaluate_at: { m1: 30, m2: 20, D_0: 1e22, lambda_g: 1e13 } });
    expect(res.status).toBe(200);
    const Mc = (30 * 20) ** 0.6 / 50 ** 0.2;
    expect(res.body.terms).toEqual([expect.objectContaining({ b: -3, pn_order: 1, source: "propagation" })]);
    expect(res.body.terms[0].value / ((-(Math.PI ** 2) * 1e22 * Mc) / 1e26) - 1).toBeLessThan(1e-12);
  });

  it("when alpha = 1 is asked for, then 400 naming propagation (a logarithm has no single b)", async () => {
    const res = await request(app).post("/api/v1/expressions/derive").send({ propagation: { alpha_md: 1, coefficient: "1/lam" }, couplings: [{ symbol: "lam", dimension: 1 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.propagation).toMatch(/logarithm/);
  });

  it("when the EdGB dipole flux change is given, then b = -7 and beta equals the EdGB term at a point", async () => {
    // B = (5/96) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^4) (derived).
    const res = await request(app)
      .post("/api/v1/expressions/derive")
      .send({
        flux: { order: -1, coefficient: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" },
        couplings: EDGB.couplings,
        definitions: EDGB.definitions,
        evaluate_at: { m1: 10, m2: 5, s1: 1, s2: 1, alpha: 2 },
      });
    expect(res.status).toBe(200);
    expect(res.body.terms).toHaveLength(1);
    expect(res.body.terms[0].b).toBe(-7);
    const M = 15, eta = 50 / 225, zeta = (16 * Math.PI * 4) / M ** 4;
    const expected = -(5 / 7168) * zeta * (100 * 1 - 25 * 1) ** 2 / (M ** 4 * eta ** (18 / 5));
    expect(res.body.terms[0].value).toBeCloseTo(expected, 12);
    expect(res.body.steps.length).toBeGreaterThan(1);
  });

  it("when the order is degenerate (b = 0), then 400 naming the flux field", async () => {
    const res = await request(app).post("/api/v1/expressions/derive").send({ flux: { order: 2.5, coefficient: "alpha" }, couplings: [{ symbol: "alpha", dimension: 0 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.flux).toMatch(/b = 0/);
  });

  it("when the coefficient has an undeclared symbol, then 400 naming flux.coefficient", async () => {
    const res = await request(app).post("/api/v1/expressions/derive").send({ flux: { order: -1, coefficient: "betaa" }, couplings: [] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields["flux.coefficient"]).toMatch(/betaa/);
  });
});

describe("the expression routes under a hostile corpus", () => {
  let server: Server;
  let base: string;
  beforeAll(async () => {
    ({ server, url: base } = await listen(app));
  });
  afterAll(async () => {
    await new Promise((r) => server.close(r));
  });

  it("when 1,000+ hostile inputs arrive, then no 5xx, each answers within 3 s, and /api/health answers throughout", async () => {
    const corpus = hostileCorpus(1050);
    expect(corpus.length).toBeGreaterThanOrEqual(1000);
    const statuses = new Map<number, number>();
    let slowest = 0;
    let healthFailures = 0;
    let healthChecks = 0;
    let running = true;
    const poll = (async () => {
      while (running) {
        healthChecks++;
        const r = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(1000) }).catch(() => undefined);
        if (!r || r.status !== 200) healthFailures++;
        await new Promise((res) => setTimeout(res, 50));
      }
    })();
    let next = 0;
    const worker = async () => {
      while (next < corpus.length) {
        const expression = corpus[next++] as string;
        const t0 = performance.now();
        const r = await fetch(`${base}/api/v1/expressions/check`, {
          method: "POST",
          headers: { "Content-Type": "application/json" },
          body: JSON.stringify({ ...EDGB, expression }),
        });
        await r.text();
        slowest = Math.max(slowest, performance.now() - t0);
        statuses.set(r.status, (statuses.get(r.status) ?? 0) + 1);
      }
    };
    // Two clients in flight, as many as the symbolic pool has workers: each request is then timed on its own.
    await Promise.all(Array.from({ length: 2 }, worker));
    running = false;
    await poll;
    const fiveHundreds = [...statuses].filter(([s]) => s >= 500).reduce((n, [, c]) => n + c, 0);
    expect(fiveHundreds).toBe(0);
    expect([...statuses.keys()].every((s) => s === 200 || s === 400)).toBe(true);
    expect(slowest).toBeLessThan(3000);
    expect(healthChecks).toBeGreaterThan(5);
    expect(healthFailures).toBe(0);
  }, 180_000);
});
