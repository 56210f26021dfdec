/**
 * The conversion core against hand-written mappings (plain functions typed from the printed
 * published formulas), independent of the expression compiler.
 */
import { describe, expect, it } from "vitest";
import { makeBinary } from "../../server/physics/binary.ts";
import {
  convertMany,
  convertToCoupling,
  type BoundedResult,
  type ConversionResult,
  type MappingSpec,
} from "../../server/physics/convert.ts";
import { distanceAlphaKm } from "../../server/physics/cosmology.ts";
import { PhysicsInputError } from "../../server/physics/input-error.ts";
import { convertQuotedConvention } from "../../server/physics/quoted-forms.ts";
import { lambdaToGravitonMassEv } from "../../server/physics/units.ts";

const PI = Math.PI;
const MSUN_KM = 1.3271244e20 / 299_792_458 ** 2 / 1000; // G M_sun / c^2 from the IAU 2015 B3 nominal (G M)_sun

const edgb: MappingSpec = {
  b: -7,
  coupling: {
    symbol: "alpha",
    latex: "\\alpha",
    unit: "km^2",
    quoted: { form: "sqrt", symbol: "sqrt_alpha", latex: "\\sqrt{\\alpha}", unit: "km" },
    conventions: [
      { name: "A", factor: 1 },
      { name: "SZ", factor: 1 / Math.sqrt(8 * PI) },
      { name: "JB", factor: 1 / Math.sqrt(16 * PI) },
    ],
  },
  // Yunes, Yagi & Pretorius 2016 Table I form (printed form: value from memory).
  evaluate: (a, e) => {
    const zeta = (16 * PI * a * a) / e.M! ** 4;
    return (-(5 / 7168) * zeta * (e.m1! ** 2 * e.s2! - e.m2! ** 2 * e.s1!) ** 2) / (e.M! ** 4 * e.eta! ** 3.6);
  },
  validity: ([1, 2] as const).map((i) => ({
    label: `body ${i}`,
    condition: `16 pi alpha^2 / m${i}^4 <= 1/6`,
    evaluate: (a: number, e: Record<string, number>) => (16 * PI * a * a) / e[`m${i}`]! ** 4,
    max: 1 / 6,
    kind: "hard" as const,
    body: i,
    appliesTo: ["bh"] as const,
  })),
};

const massiveGraviton: MappingSpec = {
  b: -3,
  coupling: {
    symbol: "lambda_g",
    latex: "\\lambda_g",
    unit: "km",
    quoted: { form: "graviton_wavelength", symbol: "lambda_g", latex: "\\lambda_g", unit: "km" },
  },
  distance: { alphaMd: 0 },
  evaluate: (l, e) => (-(PI ** 2) * e.D_0! * e.Mc!) / (l * l),
};

const bransDicke: MappingSpec = {
  b: -7,
  coupling: {
    symbol: "omega_BD",
    latex: "\\omega_{BD}",
    unit: "1",
    quoted: { form: "identity", symbol: "omega_BD", latex: "\\omega_{BD}", unit: "1" },
  },
  requires: ["sigma1", "sigma2"],
  evaluate: (w, e) => (-(5 / 3584) * e.eta! ** 0.4 * (e.sigma1! - e.sigma2!) ** 2) / (2 + w),
};

function bounded(r: ConversionResult): BoundedResult {
  if (r.status !== "bounded") throw new Error(`expected a bound, got ${r.status}: ${r.reason}`);
  return r;
}

const bbh = { m1: 10, m2: 5, frame: "source" } as const;

describe("EdGB worked numbers (derived)", () => {
  it("m1 = 10, m2 = 5 non-spinning BHs, |beta| <= 1e-3 at b = -7: sqrt(alpha) from the printed formula", () => {
    const r = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-3 }, bbh, edgb));
    // Independent inversion of beta = -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^(18/5)), s = 1.
    const m1 = 10 * MSUN_KM;
    const m2 = 5 * MSUN_KM;
    const M = m1 + m2;
    const eta = (m1 * m2) / M ** 2;
    const alpha2 = (1e-3 * 7168 * M ** 8 * eta ** 3.6) / (5 * 16 * PI * (m1 ** 2 - m2 ** 2) ** 2);
    expect(r.quoted.value / alpha2 ** 0.25).toBeCloseTo(1, 12);
    expect(r.quoted.unit).toBe("km");
    expect(r.side).toBe("upper");
    expect(r.method).toBe("closed_form");
    expect(r.power).toBe(2);
    expect(r.theory_sign).toBe(-1);
    expect(r.latex).toContain("^{1/2}");
    // Validity on each black hole with its own mass.
    expect(r.validity).toHaveLength(2);
    expect(r.validity[0]!.value).toBeCloseTo((16 * PI * alpha2) / m1 ** 4, 12);
    expect(r.validity[1]!.value).toBeCloseTo((16 * PI * alpha2) / m2 ** 4, 12);
    expect(r.validity[1]!.value / r.validity[0]!.value).toBeCloseTo(16, 12);
    // 16 pi alpha^2 / m2^4 ~ 4.65: far outside the small-coupling regime, so the limit is not valid.
    expect(r.validity[1]!.ok).toBe(false);
    expect(r.valid).toBe(false);
  });

  it("equal-mass non-spinning black holes: no constraint, with a reason, never a division by zero", () => {
    const r = convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-3 }, { m1: 20, m2: 20, frame: "source" }, edgb);
    expect(r.status).toBe("no_constraint");
    if (r.status !== "no_constraint") return;
    expect(r.code).toBe("vanishing_mapping");
    expect(r.reason).toMatch(/constrains nothing/);
  });

  it("skips the horizon condition on a neutron star (no EdGB charge, Yagi 2012)", () => {
    const r = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-3 }, { m1: 8, m2: 1.4, bodies: ["bh", "ns"], frame: "source" }, edgb));
    expect(r.validity.map((v) => v.label)).toEqual(["body 1"]);
  });

  it("the gIMR form dphi_-2 = -(10 pi/21) alpha^2 (s1/m1^2 - s2/m2^2)^2 gives the same limit as the equivalent beta", () => {
    const binary = { m1: 12, m2: 7, chi1: 0.3, chi2: 0.6, frame: "source" } as const;
    const dphiMax = 2e-3;
    const viaGimr = bounded(convertToCoupling({ kind: "gimr", k: -2, dphi_max: dphiMax }, binary, edgb));
    const b = makeBinary(binary);
    const direct = Math.sqrt((21 * dphiMax) / (10 * PI * (b.s1 / b.km.m1 ** 2 - b.s2 / b.km.m2 ** 2) ** 2));
    expect(viaGimr.coupling.value / direct).toBeCloseTo(1, 12);
    const eta = b.eta;
    const viaBeta = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: (3 / 128) * eta ** 0.4 * dphiMax }, binary, edgb));
    expect(viaBeta.coupling.value / viaGimr.coupling.value).toBeCloseTo(1, 12);
  });

  it("conventions: l_GB = 0.51 M_sun in JB is sqrt(alpha_A) ~ 0.28 km (Sanger et al. 2024, arXiv:2406.03568)", () => {
    // Choose the bound whose limit is alpha_JB = (0.51 M_sun)^2, i.e. alpha_A = factor_JB * alpha_JB.
    const lJB = 0.51 * MSUN_KM;
    const alphaA = lJB ** 2 / Math.sqrt(16 * PI);
    const b = makeBinary(bbh);
    const env = { m1: b.km.m1, m2: b.km.m2, M: b.km.M, eta: b.eta, s1: 1, s2: 1 };
    const betaMax = Math.abs(edgb.evaluate(alphaA, env));
    const r = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: betaMax }, bbh, edgb));
    const jb = r.conventions.find((c) => c.name === "JB")!;
    const sz = r.conventions.find((c) => c.name === "SZ")!;
    expect(jb.quoted.value / lJB).toBeCloseTo(1, 12);
    expect(r.quoted.value).toBeCloseTo(0.28, 2); // the paper's 0.28 km, to its two digits
    expect(sz.quoted.value).not.toBeCloseTo(0.28, 2); // reading l_GB in the SZ convention would not reproduce it
    expect(jb.quoted.value / r.quoted.value).toBeCloseTo((16 * PI) ** 0.25, 12);
    // The same through the stand-alone helper: quoted sqrt scales by sqrt(factor).
    const inA = convertQuotedConvention(lJB, "sqrt", 1 / Math.sqrt(16 * PI), 1);
    expect(inA).toBeCloseTo(0.28, 2);
    expect(inA / lJB).toBeCloseTo(Math.sqrt(1 / Math.sqrt(16 * PI)), 14);
    expect(convertQuotedConvention(inA, "sqrt", 1, 1 / Math.sqrt(16 * PI)) / lJB).toBeCloseTo(1, 14);
  });

  it("one-signed theory: an interval uses its negative side for EdGB, after the exp(-i Psi) sign flip", () => {
    const wide = { kind: "ppe", b: -7, interval: [-1e-3, 5e-2] } as const;
    const r1 = bounded(convertToCoupling(wide, bbh, edgb));
    const r0 = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-3 }, bbh, edgb));
    expect(r1.coupling.value / r0.coupling.value).toBeCloseTo(1, 14);
    const flipped = bounded(convertToCoupling({ kind: "ppe", b: -7, interval: [-5e-2, 1e-3], convention: "minus" }, bbh, edgb));
    expect(flipped.coupling.value / r0.coupling.value).toBeCloseTo(1, 14);
    // An interval that excludes beta = 0 puts GR itself outside: it is refused, nothing is translated.
    expect(() => convertToCoupling({ kind: "ppe", b: -7, interval: [1e-3, 2e-3] }, bbh, edgb)).toThrow(/GR itself is outside/);
  });
});

describe("frames", () => {
  it("detector-frame input with z gives the same limit as source-frame input (generation effect)", () => {
    const src = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-3 }, { m1: 30, m2: 20, frame: "source", z: 0.3 }, edgb));
    const det = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-3 }, { m1: 39, m2: 26, frame: "detector", z: 0.3 }, edgb));
    expect(det.coupling.value / src.coupling.value).toBeCloseTo(1, 12);
  });

  it("massive graviton: detector and source frames agree, lambda_g is a LOWER bound, m_g an upper bound", () => {
    const bound = { kind: "ppe", b: -3, beta_max: 0.05 } as const;
    const src = bounded(convertToCoupling(bound, { m1: 30, m2: 25, frame: "source", z: 0.2 }, massiveGraviton));
    const det = bounded(convertToCoupling(bound, { m1: 36, m2: 30, frame: "detector", z: 0.2 }, massiveGraviton));
    expect(det.coupling.value / src.coupling.value).toBeCloseTo(1, 12);
    expect(src.side).toBe("lower");
    // Independent inversion of beta = -pi^2 D_0 Mc / lambda_g^2 (Will 1998).
    const b = makeBinary({ m1: 30, m2: 25, frame: "source", z: 0.2 });
    const lambda = PI * Math.sqrt((distanceAlphaKm(0.2, 0) * b.km.Mc) / 0.05);
    expect(src.coupling.value / lambda).toBeCloseTo(1, 12);
    const mg = src.extras.find((x) => x.symbol === "m_g")!;
    expect(mg.side).toBe("upper");
    expect(mg.value / lambdaToGravitonMassEv(lambda)).toBeCloseTo(1, 12);
    expect(src.latex).toContain("^{-1/2}");
  });

  it("a propagation mapping without z is refused on the z field", () => {
    try {
      convertToCoupling({ kind: "ppe", b: -3, beta_max: 0.05 }, { m1: 30, m2: 25, frame: "source" }, massiveGraviton);
      expect.unreachable();
    } catch (e) {
      expect((e as PhysicsInputError).field).toBe("z");
    }
  });
});

describe("numeric inversion", () => {
  const nsbh = { m1: 10, m2: 1.4, bodies: ["bh", "ns"], frame: "source", scalar_sensitivities: [undefined, 0.2] } as const;

  it("Brans-Dicke is not a power law in omega_BD: bracketed root, lower bound, equal to the algebraic inverse", () => {
    const r = bounded(convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-6 }, nsbh, bransDicke));
    expect(r.method).toBe("numeric_root");
    expect(r.side).toBe("lower");
    const eta = (10 * 1.4) / 11.4 ** 2;
    const omega = ((5 / 3584) * eta ** 0.4 * 0.3 ** 2) / 1e-6 - 2;
    expect(r.coupling.value / omega).toBeCloseTo(1, 11);
    expect(Math.abs(r.beta_at_limit) / 1e-6).toBeCloseTo(1, 12);
  });

  it("a bound weaker than beta at every coupling gives no constraint", () => {
    const r = convertToCoupling({ kind: "ppe", b: -7, beta_max: 1 }, nsbh, bransDicke);
    expect(r.status === "no_constraint" && r.code).toBe("out_of_range");
  });

  it("a missing neutron-star sensitivity is refused on its field", () => {
    try {
      convertToCoupling({ kind: "ppe", b: -7, beta_max: 1e-6 }, { m1: 10, m2: 1.4, bodies: ["bh", "ns"], frame: "source" }, bransDicke);
      expect.unreachable();
    } catch (e) {
      expect((e as PhysicsInputError).field).toBe("scalar_sensitivities.1");
    }
  });

  it("warns when |beta| is not monotonic and returns the crossing nearest GR", () => {
    const wiggly: MappingSpec = {
      b: -1,
      coupling: { symbol: "x", latex: "x", unit: "1", quoted: { form: "identity", symbol: "x", latex: "x", unit: "1" } },
      evaluate: (x) => x * x * (1.2 + Math.cos(3 * Math.log(x))),
    };
    const r = bounded(convertToCoupling({ kind: "ppe", b: -1, beta_max: 7 }, bbh, wiggly));
    expect(r.warnings.join(" ")).toMatch(/not monotonic/);
    expect(Math.abs(r.beta_at_limit) / 7).toBeCloseTo(1, 12);
    for (let x = r.coupling.value * 0.999; x > 1e-3; x *= 0.99) expect(wiggly.evaluate(x, {})).toBeLessThan(7);
  });
});

describe("bound handling", () => {
  it("b = 0 and b = 3 are degenerate: no bound (Yunes & Pretorius 2009: b = 0 and b = 3 are absorbed by phi_c and t_c)", () => {
    for (const b of [0, 3]) {
      const r = convertToCoupling({ kind: "ppe", b, beta_max: 1 }, bbh, { ...edgb, b });
      expect(r.status === "no_constraint" && r.code).toBe("degenerate_b");
    }
  });

  it("a bound at another b than the mapping's is refused", () => {
    expect(() => convertToCoupling({ kind: "ppe", b: -5, beta_max: 1 }, bbh, edgb)).toThrowError(PhysicsInputError);
  });
});

describe("fast path", () => {
  // Speed is measured by npm run bench (bench/convert.bench.ts), never here.
  it("when 20 entries are converted for one binary, then each equals the one-at-a-time conversion", () => {
    const mappings = Array.from({ length: 20 }, (_, i) => [edgb, massiveGraviton, bransDicke, edgb][i % 4]!);
    const binary = makeBinary({ m1: 10, m2: 1.4, bodies: ["bh", "ns"], frame: "source", z: 0.05, scalar_sensitivities: [undefined, 0.2] });
    const bound = (m: MappingSpec) => ({ kind: "ppe" as const, b: m.b, beta_max: 1e-6 });
    const many = mappings.map((m) => convertMany(bound(m), binary, [m])[0]!);
    expect(many).toHaveLength(20);
    expect(many.every((r) => r.status === "bounded")).toBe(true);
    mappings.forEach((m, i) => expect(many[i]).toEqual(convertToCoupling(bound(m), binary, m)));
  });
});
