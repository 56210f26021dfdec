/**
 * Every seeded mapping, compiled from its stored expression, checked against the formulas
 * of the published formulas (typed again here), inversion round trips, frames, and catalogue shape.
 */
import katex from "katex";
import { describe, expect, it } from "vitest";
import { THEORIES, theoryBySlug } from "../../seeds/data/theories.ts";
import type { TheoryEntry } from "../../seeds/data/theory-entry.ts";
import { binarySymbols, makeBinary, type BinaryInput } from "../../server/physics/binary.ts";
import { compileTheoryMappings, type CompiledMapping } from "../../server/physics/catalogue-mapping.ts";
import { convertInContext, convertMany, createConversionContext, type BoundedResult, type ConversionResult } from "../../server/physics/convert.ts";
import { distanceAlphaKm } from "../../server/physics/cosmology.ts";
import { compileExpression } from "../../server/physics/expr/compile.ts";
import { createSymbolTable, expandDefinitions } from "../../server/physics/expr/symbols.ts";

const PI = Math.PI;

/** A binary every seeded mapping constrains: unequal, spinning, BH-NS with a sensitivity, at z = 0.1. */
const NSBH: BinaryInput = {
  m1: 12,
  m2: 1.5,
  chi1: 0.3,
  chi2: 0.1,
  bodies: ["bh", "ns"],
  frame: "source",
  z: 0.1,
  scalar_sensitivities: [undefined, 0.2],
};
const NSBH_DETECTOR: BinaryInput = { ...NSBH, m1: 12 * 1.1, m2: 1.5 * 1.1, frame: "detector" };
/** Mappings that hold only for black holes (mass loss into an extra dimension) get the same masses as two black holes. */
const BBH: BinaryInput = { ...NSBH, bodies: ["bh", "bh"], scalar_sensitivities: undefined };
const BBH_DETECTOR: BinaryInput = { ...BBH, m1: 12 * 1.1, m2: 1.5 * 1.1, frame: "detector" };
const binaryFor = (m: CompiledMapping) => (m.onlyFor ? BBH : NSBH);

const every = THEORIES.flatMap((t) => compileTheoryMappings(t).map((m) => [t, m] as const));
const label = (t: TheoryEntry, m: CompiledMapping) => `${t.slug}#${m.index} (${m.coupling.symbol})`;

/** beta_max small enough that every mapping binds (Brans-Dicke needs |beta| below its omega -> 0 value). */
const betaMaxFor = (m: CompiledMapping) => (m.slug === "brans-dicke" ? 1e-6 : 1e-3);

function bounded(r: ConversionResult): BoundedResult {
  if (r.status !== "bounded") throw new Error(`expected a bound: ${r.reason}`);
  return r;
}

describe("round trip: limit -> beta -> the same bound, for every seeded mapping", () => {
  for (const [t, m] of every) {
    it(label(t, m), () => {
      const context = createConversionContext(binaryFor(m));
      const betaMax = betaMaxFor(m);
      const r = bounded(convertInContext({ kind: "ppe", b: m.b, beta_max: betaMax }, context, m));
      const env = context.envFor(m);
      expect(Math.abs(Math.abs(m.evaluate(r.coupling.value, env)) / betaMax - 1)).toBeLessThan(1e-12);
      expect(Math.abs(Math.abs(r.beta_at_limit) / betaMax - 1)).toBeLessThan(1e-12);
      // The side must be the one on which |beta| grows away from GR.
      const inside = r.side === "upper" ? r.coupling.value * 0.5 : r.coupling.value * 2;
      expect(Math.abs(m.evaluate(inside, env))).toBeLessThan(betaMax);
      if (r.method === "closed_form") {
        // A power law: halving beta_max scales the limit by 2^(-1/p).
        const half = bounded(convertInContext({ kind: "ppe", b: m.b, beta_max: betaMax / 2 }, context, m));
        expect(half.coupling.value / r.coupling.value).toBeCloseTo(2 ** (-1 / r.power!), 12);
      }
    });
  }
});

describe("frames: detector-frame input with z gives the source-frame limit, for every seeded mapping", () => {
  for (const [t, m] of every) {
    it(label(t, m), () => {
      const bound = { kind: "ppe" as const, b: m.b, beta_max: betaMaxFor(m) };
      const src = bounded(convertMany(bound, m.onlyFor ? BBH : NSBH, [m])[0]!);
      const det = bounded(convertMany(bound, m.onlyFor ? BBH_DETECTOR : NSBH_DETECTOR, [m])[0]!);
      expect(det.coupling.value / src.coupling.value).toBeCloseTo(1, 12);
    });
  }
});

describe("stored expressions equal the published formulas (published forms)", () => {
  const b = makeBinary(NSBH);
  const env = { ...binarySymbols(b), D_0: distanceAlphaKm(0.1, 0) };
  const { m1, m2, M, Mc } = b.km;
  const { eta, dm, chi_s, chi_a, s1, s2 } = b;
  const first = (slug: string, index = 0) => compileTheoryMappings(theoryBySlug(slug)!)[index]!;
  const envFor = (m: CompiledMapping) => createConversionContext(NSBH).envFor(m);

  it("EdGB: -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^(18/5)), zeta = 16 pi alpha^2 / M^4 (printed form from memory)", () => {
    const a = 3.7;
    const zeta = (16 * PI * a * a) / M ** 4;
    expect(first("edgb").evaluate(a, env) / ((-(5 / 7168) * zeta * (m1 ** 2 * s2 - m2 ** 2 * s1) ** 2) / (M ** 4 * eta ** 3.6))).toBeCloseTo(1, 12);
  });

  it("dCS: Yagi, Stein, Yunes & Tanaka 2012 (Phys. Rev. D 85, 064022 and erratum)", () => {
    const a = 2.1;
    const zeta = (16 * PI * a * a) / M ** 4;
    const printed =
      (1549225 / 11812864) * (zeta / eta ** 2.8) *
      ((1 - (231808 * eta) / 61969) * chi_s ** 2 + (1 - (16068 * eta) / 61969) * chi_a ** 2 - 2 * dm * chi_s * chi_a);
    expect(first("dcs").evaluate(a, env) / printed).toBeCloseTo(1, 12);
  });

  it("Brans-Dicke: -(5/3584) eta^(2/5) (s1 - s2)^2 / (2 + omega_BD) with BH sensitivity 1/2 (value from memory)", () => {
    expect(first("brans-dicke").evaluate(100, env) / ((-(5 / 3584) * eta ** 0.4 * 0.3 ** 2) / 102)).toBeCloseTo(1, 12);
  });

  it("massive graviton: -pi^2 D_0 Mc / lambda_g^2, Mc source frame (Will 1998)", () => {
    const l = 3e13;
    expect(first("massive-graviton").evaluate(l, env) / ((-(PI ** 2) * env.D_0 * Mc) / l ** 2)).toBeCloseTo(1, 12);
  });

  it("modified dispersion: pi^(2-a) D_a Mc^(1-a) / ((a - 1) lambda^(2-a)) (Mirshekari, Yunes & Will 2012)", () => {
    for (const a of [0.5, 1.5, 2.5, 3, 4]) {
      const m = first(`dispersion-a${String(a).replace(".", "p")}`);
      const e = envFor(m);
      expect(e.D_alpha).toBeCloseTo(distanceAlphaKm(0.1, a), -3);
      const l = 1e-20;
      const printed = (PI ** (2 - a) * distanceAlphaKm(0.1, a) * Mc ** (1 - a)) / ((a - 1) * l ** (2 - a));
      expect(m.evaluate(l, e) / printed).toBeCloseTo(1, 11);
      expect(m.b).toBe(3 * (a - 1));
    }
  });

  it("the dispersion formula at alpha = 0 is the massive-graviton beta (common practice: A = m_g^2)", () => {
    const l = 5e12;
    const generic = (PI ** 2 * env.D_0 * Mc) / ((0 - 1) * l ** 2);
    expect(first("massive-graviton").evaluate(l, env) / generic).toBeCloseTo(1, 12);
  });

  it("varying G: -(275/851968) (Gdot/G) Mc (derived)", () => {
    expect(first("varying-g").evaluate(1e-20, env) / (-(275 / 851968) * 1e-20 * Mc)).toBeCloseTo(1, 12);
  });

  it("BH mass loss: (25/851968) Mdot (3 - 26 eta + 34 eta^2) / (eta^(2/5) (1 - 2 eta)), Mdot = -|Mdot| (derived)", () => {
    const shape = (3 - 26 * eta + 34 * eta ** 2) / (eta ** 0.4 * (1 - 2 * eta));
    expect(first("extra-dimension").evaluate(1e-15, env) / ((25 / 851968) * -1e-15 * shape)).toBeCloseTo(1, 12);
    // RS-II rate per hole, mdot_i = -2.8e-7 (M_sun/m_i)^2 (ell/10 um)^2 M_sun/yr (Emparan, Garcia-Bellido & Kaloper 2003;
    // value from memory), so the binary loses Mdot = 2.8e-7 (1/m1^2 + 1/m2^2) (ell/10 um)^2 (derived: sum over the two holes).
    const mdot = ((2.8e-7 * (1 / 12 ** 2 + 1 / 1.5 ** 2) * 4) * 4.925490947641267e-6) / 31_557_600; // ell = 20 um, m1 = 12, m2 = 1.5
    expect(first("extra-dimension", 1).evaluate(2e-8, env) / ((25 / 851968) * -mdot * shape)).toBeCloseTo(1, 8);
  });

  it("noncommutative: -(75/256) eta^(-4/5) (2 eta - 1) Lambda^2 (value from memory: Kobakhidze, Lagger & Manning 2016)", () => {
    expect(first("noncommutative").evaluate(0.3, env) / (-(75 / 256) * eta ** -0.8 * (2 * eta - 1) * 0.3)).toBeCloseTo(1, 12);
  });

  it("Johannsen: (75/64) (epsilon_3 - 2 alpha_13) eta^(-4/5), one parameter at a time (derived)", () => {
    expect(first("johannsen", 0).evaluate(0.01, env) / ((75 / 64) * -0.02 * eta ** -0.8)).toBeCloseTo(1, 12);
    expect(first("johannsen", 1).evaluate(0.01, env) / ((75 / 64) * 0.01 * eta ** -0.8)).toBeCloseTo(1, 12);
  });

  it("EdGB derivation input: the -1PN flux B gives -(3/224) eta^(2/5) B = the EdGB beta (derived)", () => {
    const entry = theoryBySlug("edgb")!;
    const mapping = entry.mappings[0]!;
    const table = createSymbolTable({ couplings: [{ symbol: "alpha", dimension: 2 }], definitions: entry.definitions ?? [] });
    const B = compileExpression(expandDefinitions(mapping.derivation!.B!, table), table.primitives);
    const a = 1.9;
    const values = table.primitives.map((n) => (n === "alpha" ? a : (env as Record<string, number>)[n] ?? Number.NaN));
    expect((-(3 / 224) * eta ** 0.4 * B(values)) / first("edgb").evaluate(a, env)).toBeCloseTo(1, 12);
    // gIMR form: beta = (3/128) eta^(2/5) dphi_-2 (derived).
    const dphi = compileExpression(expandDefinitions(mapping.gimr_equivalent!.expression, table), table.primitives);
    expect(((3 / 128) * eta ** 0.4 * dphi(values)) / first("edgb").evaluate(a, env)).toBeCloseTo(1, 12);
  });
});

describe("catalogue content", () => {
  it("has at least 12 entries with the required slugs, each unique", () => {
    const slugs = THEORIES.map((t) => t.slug);
    expect(slugs.length).toBeGreaterThanOrEqual(12);
    expect(new Set(slugs).size).toBe(slugs.length);
    for (const s of ["edgb", "dcs", "brans-dicke", "massive-graviton", "varying-g", "extra-dimension", "noncommutative", "johannsen"]) {
      expect(slugs).toContain(s);
    }
  });

  it("every mapping has b = 2n - 5 for its PN order n, a source status and citable references", () => {
    for (const t of THEORIES) {
      const keys = new Set(t.references.map((r) => r.key));
      // arXiv id or DOI; a journal reference only for papers whose identifier we have not confirmed.
      for (const r of t.references) expect(Boolean(r.arxiv || r.doi || (r.journal && r.details_from_memory)), `${t.slug}: ${r.key}`).toBe(true);
      for (const m of t.mappings) {
        expect(m.b, t.slug).toBeCloseTo(2 * m.pn_order - 5, 12);
        expect(["confirmed", "derived", "memory"]).toContain(m.source_status);
        for (const k of m.references ?? []) expect(keys.has(k), `${t.slug} cites ${k}`).toBe(true);
      }
      for (const rb of t.reference_bounds ?? []) expect(keys.has(rb.reference), `${t.slug} bound ${rb.reference}`).toBe(true);
      const memory = t.mappings.some((m) => m.source_status === "memory") || (t.reference_bounds ?? []).some((r) => r.source_status === "memory");
      if (memory) expect(t.needs_source_confirmation, t.slug).toBe(true);
    }
  });

  it("EdGB carries the A, SZ and JB conventions with alpha_A = factor x alpha_other (EdGB normalisation conventions)", () => {
    const conventions = theoryBySlug("edgb")!.couplings[0]!.conventions!;
    expect(conventions.map((c) => c.name)).toEqual(["A", "SZ", "JB"]);
    expect(conventions[1]!.factor).toBeCloseTo(1 / Math.sqrt(8 * PI), 15);
    expect(conventions[2]!.factor).toBeCloseTo(1 / Math.sqrt(16 * PI), 15);
  });

  it("the published EdGB reference bounds are present", () => {
    const edgbBounds = theoryBySlug("edgb")!.reference_bounds!.map((r) => r.value);
    expect(edgbBounds).toEqual([1.9, 1.7, 1.33]);
    expect(theoryBySlug("massive-graviton")!.reference_bounds!.map((r) => r.value)).toContain(1.27e-23);
  });
});

describe("LaTeX", () => {
  it("every formula in the catalogue and every closed-form limit renders in KaTeX", () => {
    const context = createConversionContext(NSBH);
    let rendered = 0;
    for (const t of THEORIES) {
      const strings = [
        t.action_latex,
        t.metric_latex,
        ...t.mappings.map((m) => m.latex),
        ...(t.definitions ?? []).map((d) => d.latex),
        ...t.couplings.flatMap((c) => [c.latex, c.quoted?.latex, ...(c.conventions ?? []).map((k) => k.action_latex)]),
      ];
      for (const [, m] of every.filter(([e]) => e === t)) {
        strings.push(bounded(convertInContext({ kind: "ppe", b: m.b, beta_max: betaMaxFor(m) }, m.onlyFor ? createConversionContext(BBH) : context, m)).latex);
      }
      for (const s of strings) {
        if (s === undefined) continue;
        expect(() => katex.renderToString(s, { throwOnError: true }), `${t.slug}: ${s}`).not.toThrow();
        rendered++;
      }
    }
    expect(rendered).toBeGreaterThan(50);
  });
});

describe("fast path with compiled catalogue mappings", () => {
  // Speed is measured by npm run bench (bench/convert.bench.ts), never here.
  it("when 20 entries share one conversion context, then each equals its own conversion", () => {
    const mappings = Array.from({ length: 20 }, (_, i) => every[i % every.length]![1]).filter((m) => !m.onlyFor);
    const binary = makeBinary(NSBH);
    const context = createConversionContext(binary);
    const shared = mappings.map((m) => convertInContext({ kind: "ppe", b: m.b, beta_max: betaMaxFor(m) }, context, m));
    expect(shared.length).toBeGreaterThan(15);
    expect(shared.every((r) => r.status === "bounded")).toBe(true);
    mappings.forEach((m, i) => expect(shared[i]).toEqual(convertInContext({ kind: "ppe", b: m.b, beta_max: betaMaxFor(m) }, createConversionContext(binary), m)));
  });
});
