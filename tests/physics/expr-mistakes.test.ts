import { afterAll, describe, expect, it } from "vitest";
import { checkMapping } from "../../server/physics/checks/check-mapping.ts";
import { DerivationError, deriveBeta } from "../../server/physics/checks/derive.ts";
import { derivePropagation } from "../../server/physics/checks/propagation.ts";
import type { CheckResult, MappingInput, MappingReport } from "../../server/physics/checks/types.ts";
import { compileAst } from "../../server/physics/expr/compile.ts";
import { closeSymbolicPool } from "../../server/physics/expr/pool.ts";
import { createSymbolTable, expandAst } from "../../server/physics/expr/symbols.ts";

/**
 * The mistakes a theorist makes when typing a mapping, each caught by a named check:
 * an upside-down coupling (gr_limit), a dipole that survives identical bodies (symmetry),
 * pi for pi^2 and a source/detector-frame slip in a propagation term (propagation).
 */

afterAll(async () => {
  await closeSymbolicPool();
});

const check = (r: MappingReport, name: CheckResult["name"]): CheckResult => {
  const c = r.checks.find((x) => x.name === name);
  if (c === undefined) throw new Error(`no ${name} check in ${JSON.stringify(r.checks.map((x) => x.name))}`);
  return c;
};

// EdGB at -1PN, convention A: beta = -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^(18/5)),
// zeta = 16 pi alpha^2 / M^4 (normalisation derived from the dipole flux; printed form as in
// Yunes, Yagi & Pretorius 2016, PRD 94 084002, Table I, value from memory).
const EDGB: MappingInput = {
  expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
  target: "ppe_phase",
  b: -7,
  pn_order: -1,
  couplings: [{ symbol: "alpha", dimension: 2, gr_value: "zero" }],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
};

// Massive graviton: beta = -pi^2 D_0 Mc / lambda_g^2, Mc source frame (Will 1998, PRD 57 2061;
// Mirshekari, Yunes & Will 2012, PRD 85 024041 at alpha = 0), GR at lambda_g -> infinity.
const MASSIVE: MappingInput = {
  expression: "-pi^2*D_0*Mc/lambda_g^2",
  target: "ppe_phase",
  b: -3,
  pn_order: 1,
  couplings: [{ symbol: "lambda_g", dimension: 1, gr_value: "infinity" }],
  derivation: { propagation: { alpha_md: 0, coefficient: "1/lambda_g^2" } },
};

describe("gr_limit with the declared GR value", () => {
  it("when a coupling declared to reach GR at 0 is written upside down, then gr_limit is an error", async () => {
    // 1/alpha^2 where alpha^2 belongs: beta diverges as alpha -> 0 (its GR value).
    const r = await checkMapping({ ...EDGB, definitions: [{ symbol: "zeta", expression: "16*pi*M^4/alpha^2" }], expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^12*eta^(18/5))" });
    expect(check(r, "gr_limit")).toMatchObject({ ok: false, severity: "error" });
    expect(check(r, "gr_limit").message).toMatch(/declared to reach GR at 0, but the expression vanishes only as alpha -> infinity and diverges as alpha -> 0: the coupling is written upside down/);
    expect(r.ok).toBe(false);
  });

  it("when the graviton wavelength (GR at infinity) is written upside down, then gr_limit is an error", async () => {
    const r = await checkMapping({ ...MASSIVE, expression: "-pi^2*D_0*Mc*lambda_g^2/Mc^4", derivation: undefined });
    expect(check(r, "gr_limit")).toMatchObject({ ok: false, severity: "error" });
    expect(check(r, "gr_limit").message).toMatch(/GR is declared at lambda_g -> infinity, but the expression vanishes only as lambda_g -> 0 and diverges as lambda_g -> infinity/);
  });

  it("when the GR value is declared and respected, then gr_limit passes without a warning", async () => {
    const r = await checkMapping(MASSIVE);
    expect(check(r, "gr_limit")).toEqual({ name: "gr_limit", ok: true, message: "the expression vanishes in the GR limit lambda_g -> infinity" });
    expect(check(await checkMapping(EDGB), "gr_limit")).toMatchObject({ ok: true, message: "the expression vanishes when alpha = 0" });
  });

  it("when no GR value is declared, then GR at infinity passes with a warning that asks for the declaration", async () => {
    const r = await checkMapping({ ...MASSIVE, couplings: [{ symbol: "lambda_g", dimension: 1 }], derivation: undefined });
    expect(check(r, "gr_limit")).toMatchObject({ ok: true, severity: "warning" });
    expect(check(r, "gr_limit").message).toMatch(/declare the coupling's GR value as infinity/);
  });

  it("when two couplings reach GR at different ends, then each is sent to its own", async () => {
    // Toy: a dimensionless x (GR at 0) and omega (GR at infinity), beta = x / omega.
    const couplings = [
      { symbol: "x", dimension: 0, gr_value: "zero" as const },
      { symbol: "omega", dimension: 0, gr_value: "infinity" as const },
    ];
    const ok = await checkMapping({ expression: "x/omega", target: "ppe_phase", b: -7, pn_order: -1, couplings });
    expect(check(ok, "gr_limit").ok).toBe(true);
    const wrong = await checkMapping({ expression: "omega/x", target: "ppe_phase", b: -7, pn_order: -1, couplings });
    expect(check(wrong, "gr_limit")).toMatchObject({ ok: false, severity: "error" });
    expect(check(wrong, "gr_limit").message).toMatch(/upside down/);
  });
});

describe("symmetry: a dipole term vanishes for identical bodies", () => {
  it("when the EdGB charge difference is written as a sum, then the symmetry check fails", async () => {
    const r = await checkMapping({ ...EDGB, expression: "-(5/7168)*zeta*(m1^2*s2 + m2^2*s1)^2/(M^4*eta^(18/5))" });
    expect(check(r, "symmetry")).toMatchObject({ ok: false, severity: "error" });
    expect(check(r, "symmetry").message).toMatch(/for identical bodies \(m1 = .*, m2 = .*, s1 = .*, s2 = .*\) it equals .*emit no dipole radiation/);
    expect(r.ok).toBe(false);
  });

  it("when a Brans-Dicke dipole has its sensitivities summed, then the symmetry check fails", async () => {
    // Dipole flux (1/3) eta^2 v^8 (a1 - a2)^2, a_i proportional to (1 - 2 s_i) (Will 1994, value from memory; derived).
    const bd = {
      target: "ppe_phase" as const,
      b: -7,
      pn_order: -1,
      couplings: [{ symbol: "omega_BD", dimension: 0, gr_value: "infinity" as const }],
    };
    const right = await checkMapping({ ...bd, expression: "-(5/3584)*eta^(2/5)*(sigma1 - sigma2)^2/(2 + omega_BD)" });
    expect(check(right, "symmetry")).toMatchObject({ ok: true });
    expect(check(right, "symmetry").severity).toBeUndefined();
    const wrong = await checkMapping({ ...bd, expression: "-(5/3584)*eta^(2/5)*(sigma1 + sigma2)^2/(2 + omega_BD)" });
    expect(check(wrong, "symmetry")).toMatchObject({ ok: false, severity: "error" });
  });

  it("when the dipole is a per-binary coefficient with no body dependence, then it passes with a warning", async () => {
    // Generic dipole flux B: beta = -(3/224) eta^(2/5) B (energy balance at -1PN, derived).
    const r = await checkMapping({ expression: "-(3/224)*eta^(2/5)*B_dip", target: "ppe_phase", b: -7, pn_order: -1, couplings: [{ symbol: "B_dip", dimension: 0, gr_value: "zero" }] });
    expect(check(r, "symmetry")).toMatchObject({ ok: true, severity: "warning" });
    expect(check(r, "symmetry").message).toMatch(/depends on no property of the individual bodies/);
  });

  it("when the mapping is not at -1PN, then no symmetry check runs", async () => {
    const r = await checkMapping(MASSIVE);
    expect(r.checks.map((c) => c.name)).not.toContain("symmetry");
  });
});

describe("propagation: beta re-derived from the dispersion relation", () => {
  it("when the massive graviton is typed right, then the propagation check passes", async () => {
    const r = await checkMapping(MASSIVE);
    expect(check(r, "propagation")).toMatchObject({ ok: true });
    expect(check(r, "propagation").message).toMatch(/equals -pi\^2\*D_0\*\(1\/lambda_g\^2\)\*Mc/);
    expect(r.ok).toBe(true);
  });

  it("when pi is typed for pi^2, then the propagation check fails and names the missing pi", async () => {
    const r = await checkMapping({ ...MASSIVE, expression: "-pi*D_0*Mc/lambda_g^2" });
    expect(check(r, "propagation")).toMatchObject({ ok: false, severity: "error" });
    expect(check(r, "propagation").message).toMatch(/a factor 1\/pi: one power of pi missing/);
  });

  it("when the detector-frame chirp mass is used, then the propagation check fails and names the frame slip", async () => {
    const r = await checkMapping({ ...MASSIVE, expression: "-pi^2*D_0*(1 + z)*Mc/lambda_g^2" });
    expect(check(r, "propagation")).toMatchObject({ ok: false, severity: "error" });
    expect(check(r, "propagation").message).toMatch(/times \(1\+z\)\^1: a source\/detector-frame slip/);
    // For alpha = 2.5 the slip is (1+z)^(1 - alpha) = (1+z)^-1.5 (Mc^(1 - alpha) in the detector frame).
    const lambda = [{ symbol: "lam", dimension: 1, gr_value: "zero" as const }];
    const d = await checkMapping({
      expression: "pi^(-1/2)*D_alpha*((1 + z)*Mc)^(-3/2)*lam^(1/2)/(3/2)",
      target: "ppe_phase",
      b: 4.5,
      pn_order: 4.75,
      couplings: lambda,
      derivation: { propagation: { alpha_md: 2.5, coefficient: "lam^(1/2)" } },
    });
    expect(check(d, "propagation").message).toMatch(/times \(1\+z\)\^-1\.5: a source\/detector-frame slip/);
  });

  it("when the luminosity distance is used, then the check says which distance the effect accumulates over", async () => {
    const r = await checkMapping({ ...MASSIVE, expression: "-pi^2*D*Mc/lambda_g^2" });
    expect(check(r, "propagation")).toMatchObject({ ok: false });
    expect(check(r, "propagation").message).toMatch(/accumulates over the distance measure D_0, not D/);
  });

  it("when the group velocity is used for alpha = 3, then the factor (1 - alpha) is named", async () => {
    // Group velocity dE/dp = 1 + ((alpha - 1)/2) A p^(alpha - 2) vs p/E = 1 - (1/2) A p^(alpha - 2) (derived): delays differ by (1 - alpha).
    const r = await checkMapping({
      expression: "-2*pi^(-1)*D_alpha*Mc^(-2)*lam/2",
      target: "ppe_phase",
      b: 6,
      pn_order: 5.5,
      couplings: [{ symbol: "lam", dimension: 1, gr_value: "zero" }],
      derivation: { propagation: { alpha_md: 3, coefficient: "lam" } },
    });
    expect(check(r, "propagation").message).toMatch(/a factor \(1 - alpha\) = -2: the group velocity/);
  });

  it("when the stated b does not match the dispersion exponent, then the check names b = 3 (alpha - 1)", async () => {
    const r = await checkMapping({ ...MASSIVE, b: -1, pn_order: 2 });
    expect(check(r, "propagation").message).toBe("a dispersion with alpha = 0 enters at b = 3 (alpha - 1) = -3, but b = -1 was stated");
  });
});

describe("derivePropagation (Mirshekari, Yunes & Will 2012, PRD 85 024041, re-derived)", () => {
  const table = createSymbolTable({ couplings: [{ symbol: "lam", dimension: 1 }] });
  const at = (node: ReturnType<typeof derivePropagation>["beta"], values: Record<string, number>): number => {
    const e = expandAst(node, table);
    const args = Object.keys(values);
    return compileAst(e, args)(args.map((a) => values[a] as number));
  };

  it("gives beta = pi^(2 - a) D_a Acal Mc^(1 - a)/(a - 1) at b = 3 (a - 1), for a = 3.5 at a stated point", () => {
    const t = derivePropagation({ alpha_md: 3.5, coefficient: "lam^(3/2)" }, table);
    expect(t.b).toBe(7.5);
    expect(t.pn_order).toBe(6.25);
    const m1 = 30;
    const m2 = 20;
    const M = m1 + m2;
    const Mc = (m1 * m2) ** 0.6 / M ** 0.2;
    const [D, lam] = [1.3e22, 2.5e-9];
    // Formula written here: pi^(-1.5) D Mc^(-2.5) lam^1.5 / 2.5.
    const want = (Math.PI ** -1.5 * D * Mc ** -2.5 * lam ** 1.5) / 2.5;
    expect(at(t.beta, { m1, m2, D_alpha: D, lam }) / want - 1).toBeLessThan(1e-12);
  });

  it("refuses alpha = 1 (a logarithm, no single b) and a stated order that does not match", () => {
    expect(() => derivePropagation({ alpha_md: 1, coefficient: "1/lam" }, table)).toThrow(DerivationError);
    expect(() => derivePropagation({ alpha_md: 1, coefficient: "1/lam" }, table)).toThrow(/logarithm/);
    expect(() => derivePropagation({ alpha_md: 0, coefficient: "1/lam^2", order: 2 }, table)).toThrow(/enters at 1PN/);
  });

  it("notes that alpha = 2 (a constant speed) is degenerate with the coalescence time", () => {
    const t = derivePropagation({ alpha_md: 2, coefficient: "lam/lam" }, table);
    expect(t.b).toBe(3);
    expect(t.notes.join(" ")).toMatch(/degenerate with the coalescence time/);
  });

  it("is offered by deriveBeta as a propagation term", () => {
    const d = deriveBeta({ propagation: { alpha_md: 0, coefficient: "1/lam^2" } }, table);
    expect(d.terms).toEqual([expect.objectContaining({ b: -3, pn_order: 1, source: "propagation", beta: "-pi^2*D_0*(1/lam^2)*Mc" })]);
  });
});
