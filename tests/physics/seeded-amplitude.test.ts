import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TheoryDetail, TheoryMapping } from "../../common/catalogue.ts";
import { amplitudeCatalogueSeed } from "../../seeds/amplitude-catalogue.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { THEORIES_AMPLITUDE } from "../../seeds/data/theories-amplitude.ts";
import { seedSteps } from "../../seeds/index.ts";
import { catalogueService } from "../../server/features/catalogue/service.ts";
import { deriveBeta } from "../../server/physics/checks/derive.ts";
import { compileExpression } from "../../server/physics/expr/compile.ts";
import { closeSymbolicPool } from "../../server/physics/expr/pool.ts";
import { createSymbolTable, expandDefinitions } from "../../server/physics/expr/symbols.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * The amplitude entries (seed step "catalogue-amplitude"): every mapping passes every engine check,
 * the dipole amplitude is re-derived by the engine from its flux, and each stored expression, at a
 * stated point, equals a formula typed here from its source or derivation.
 */

let tdb: TestDatabase;
const details = new Map<string, TheoryDetail>();
let firstRun: string[] = [];
let secondRun: string[] = [];

beforeAll(async () => {
  tdb = await createTestDatabase();
  firstRun = await seedSteps(tdb.db, [catalogueSeed, amplitudeCatalogueSeed]);
  secondRun = await seedSteps(tdb.db, [catalogueSeed, amplitudeCatalogueSeed]);
  const catalogue = catalogueService(tdb.db);
  for (const e of THEORIES_AMPLITUDE) details.set(e.slug, await catalogue.detail(e.slug));
}, 180_000);
afterAll(async () => {
  await tdb.drop();
  await closeSymbolicPool();
});

/** The stated point: masses in km (about 10 and 6 solar masses), redshift, D_2 in km, Omega_m. */
const POINT: Record<string, number> = { m1: 14.77, m2: 8.86, z: 0.3, D_alpha: 2.9e21, Omega_m: 0.31, f_low: 20 / 299792.458 };
const m1 = POINT.m1 as number;
const m2 = POINT.m2 as number;
const M = m1 + m2;
const eta = (m1 * m2) / M ** 2;
const Mc = eta ** 0.6 * M;
const z = POINT.z as number;
const Om = POINT.Omega_m as number;

function evaluate(t: TheoryDetail, m: TheoryMapping, couplings: Record<string, number>): number {
  const table = createSymbolTable({
    couplings: t.couplings.map((c) => ({ symbol: c.symbol, dimension: c.dimension })),
    definitions: t.definitions.map((d) => ({ symbol: d.symbol, expression: d.expression })),
  });
  const expanded = expandDefinitions(m.expression, table);
  const values: Record<string, number> = { ...POINT, ...couplings };
  const args = table.primitives.filter((p) => expanded.match(new RegExp(`\\b${p}\\b`)));
  for (const a of args) if (values[a] === undefined) throw new Error(`no value at the test point for ${a}`);
  return compileExpression(expanded, args)(args.map((a) => values[a] as number));
}

const mappingOf = (slug: string, coupling: string): { t: TheoryDetail; m: TheoryMapping } => {
  const t = details.get(slug) as TheoryDetail;
  return { t, m: t.mappings.find((x) => x.coupling === coupling) as TheoryMapping };
};

describe("the amplitude entries (seed step catalogue-amplitude)", () => {
  it("when seeded twice, then the step runs once and publishes every entry as revision 1", () => {
    expect(firstRun).toEqual(["catalogue", "catalogue-amplitude"]);
    expect(secondRun).toEqual([]);
    for (const e of THEORIES_AMPLITUDE) expect(details.get(e.slug)?.revision.number, e.slug).toBe(1);
  });

  it("when published, then every mapping is an amplitude term that passed every engine check, validity conditions included", () => {
    for (const e of THEORIES_AMPLITUDE) {
      const t = details.get(e.slug) as TheoryDetail;
      for (const m of t.mappings) {
        expect(m.kind).toBe("inspiral_amplitude");
        const failed = [...m.checks, ...m.validity.flatMap((v) => v.checks)].filter((c) => !c.ok);
        expect(failed, `${e.slug} ${m.coupling}`).toEqual([]);
        expect(m.checks.map((c) => c.name)).toEqual(expect.arrayContaining(["parse", "symbols", "dimension", "gr_limit", "pn_order"]));
      }
      // Every published bound carries its credibility.
      for (const b of t.reference_bounds) expect(b.credibility, `${e.slug} ${b.coupling}`).toBeGreaterThan(0);
    }
  });

  it("when a formula rests on memory, then the entry says so (source to be confirmed)", () => {
    expect(details.get("amplitude-birefringence")?.mappings[0]?.source_status).toBe("memory");
    expect(details.get("modified-friction")?.mappings.map((m) => m.source_status)).toEqual(["memory", "memory"]);
    expect(details.get("dipole-amplitude")?.mappings[0]?.source_status).toBe("derived");
  });

  it("when the dipole amplitude states its flux, then the engine re-derived alpha = -gamma/2 from it and says it is the drift piece", () => {
    const { m } = mappingOf("dipole-amplitude", "B_dip");
    expect(m.checks.find((c) => c.name === "derivation")).toMatchObject({ ok: true, message: expect.stringMatching(/equals the derived .* at a = -2 .*frequency-drift piece only/) });
  });

  it("birefringence: alpha = kappa D_2 / (pi Mc f_ref) with kappa in 1/Gpc and f_ref = 100 Hz", () => {
    const { t, m } = mappingOf("amplitude-birefringence", "kappa");
    // Derived from 1 + kappa d_C f / f_ref = 1 + alpha pi Mc_z f: alpha = kappa d_C / (pi (1+z) Mc f_ref) = kappa D_2 / (pi Mc f_ref),
    // with 1 Gpc = 3.085677581491367e22 km (IAU 2015 parsec) and 100 Hz = 100 / 299792.458 per km.
    const kappa = 0.5;
    const expected = ((kappa / 3.085677581491367e22) * 2.9e21) / (Math.PI * Mc * (100 / 299792.458));
    expect(evaluate(t, m, { kappa }) / expected - 1).toBeLessThan(1e-12);
    expect(m.a).toBe(3);
  });

  it("running Planck mass: alpha = 1/r - 1 with r = exp((1/2) int_0^z c_M Omega_L(z')/Omega_L0 dz'/(1+z')), integrated numerically here", () => {
    const { t, m } = mappingOf("modified-friction", "c_M");
    const cM = 1.7;
    // Lagos et al. 2019 (form from memory): d_GW/d_EM = exp((1/2) int_0^z alpha_M/(1+z') dz'), alpha_M = c_M Omega_L(z)/Omega_L0 = c_M / E^2.
    // Simpson's rule on 2000 panels, independent of the closed form stored in the entry.
    const E2 = (x: number) => Om * (1 + x) ** 3 + 1 - Om;
    const f = (x: number) => cM / E2(x) / (1 + x);
    const n = 2000;
    const h = z / n;
    let sum = f(0) + f(z);
    for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * f(i * h);
    const ratio = Math.exp(0.5 * (sum * h) / 3);
    expect(Math.abs(evaluate(t, m, { c_M: cM }) - (1 / ratio - 1))).toBeLessThan(1e-10);
    expect(m.a).toBe(0);
  });

  it("Xi_0: alpha = 1/r - 1 with r = Xi_0 + (1 - Xi_0)(1+z)^(-n), n = 5/2", () => {
    const { t, m } = mappingOf("modified-friction", "dXi0");
    // Belgacem et al. 2018 (form and n from memory).
    const xi0 = 1.4;
    const r = xi0 + (1 - xi0) * (1 + z) ** -2.5;
    expect(Math.abs(evaluate(t, m, { dXi0: xi0 - 1 }) - (1 / r - 1))).toBeLessThan(1e-12);
  });

  it("dipole amplitude: alpha = -(1/2) eta^(2/5) B, the drift piece of a -1PN flux change", () => {
    const { t, m } = mappingOf("dipole-amplitude", "B_dip");
    // Derived (sympy-style, by hand): E = E_GR, F = F_GR (1 + B v^-2) => dv/dt = (dv/dt)_GR (1 + B v^-2); with v = eta^(-1/5) u,
    // df/dt = (df/dt)_GR (1 + gamma u^-2), gamma = B eta^(2/5). SPA: |h(f)| ~ (df/dt)^(-1/2) = GR (1 - (gamma/2) u^-2), so alpha = -gamma/2 at a = -2.
    const B = 0.02;
    expect(evaluate(t, m, { B_dip: B }) / (-0.5 * eta ** 0.4 * B) - 1).toBeLessThan(1e-12);
    // The same number from the engine's derive helper at this point (energy and flux at k = -1, A = 0).
    const table = createSymbolTable({ couplings: [{ symbol: "B_dip", dimension: 0 }] });
    const d = deriveBeta({ flux: { order: -1, coefficient: "B_dip" } }, table, { evaluate_at: { m1, m2, B_dip: B } });
    expect(d.amplitude?.[0]).toMatchObject({ a: -2, note: expect.stringMatching(/drift piece only/) });
    expect((d.amplitude?.[0]?.value as number) / (-0.5 * eta ** 0.4 * B) - 1).toBeLessThan(1e-12);
    // And the phase term of the same derivation is the dipole's -(3/224) eta^(2/5) B at b = -7 = a - 5 (Yunes & Pretorius 2009; derived).
    expect((d.terms[0]?.value as number) / (-(3 / 224) * eta ** 0.4 * B) - 1).toBeLessThan(1e-12);
  });

  it("derive helper: an energy change contributes (k+1) A / 2 eta^(-2k/5) to the drift piece at a = 2k (derived)", () => {
    const table = createSymbolTable({ couplings: [{ symbol: "Acoef", dimension: 0 }, { symbol: "Bcoef", dimension: 0 }] });
    // k = 1: E = E_GR (1 + A v^2), F = F_GR (1 + B v^2): dv/dt = -F/E' changes by 1 + B v^2 - 2 A v^2, so gamma = (B - 2A) eta^(-2/5) and
    // alpha = -gamma/2 = (2A - B) eta^(-2/5) / 2 at a = 2.
    const d = deriveBeta({ energy: { order: 1, coefficient: "Acoef" }, flux: { order: 1, coefficient: "Bcoef" } }, table, { evaluate_at: { m1, m2, Acoef: 0.3, Bcoef: 0.1 } });
    expect(d.amplitude).toHaveLength(1);
    expect(d.amplitude?.[0]?.a).toBe(2);
    expect((d.amplitude?.[0]?.value as number) / (((2 * 0.3 - 0.1) * eta ** -0.4) / 2) - 1).toBeLessThan(1e-12);
  });
});
