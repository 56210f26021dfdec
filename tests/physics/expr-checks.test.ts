import { afterAll, describe, expect, it } from "vitest";
import { checkMapping } from "../../server/physics/checks/check-mapping.ts";
import { expressionErrorToHttp } from "../../server/physics/checks/http.ts";
import type { CheckResult, MappingInput, MappingReport } from "../../server/physics/checks/types.ts";
import { ExpressionError } from "../../server/physics/expr/errors.ts";
import { guardExpression } from "../../server/physics/expr/guard.ts";
import { closeSymbolicPool } from "../../server/physics/expr/pool.ts";

afterAll(async () => {
  await closeSymbolicPool();
});

// EdGB row of the physics primer section 2 (Yunes, Yagi & Pretorius 2016, arXiv:1603.08955,
// Table I; printed form value from memory, normalisation derived): b = -7 (-1PN).
const EDGB: MappingInput = {
  expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
  target: "ppe_phase",
  b: -7,
  pn_order: -1,
  couplings: [{ symbol: "alpha", dimension: 2 }],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
};

const check = (r: MappingReport, name: CheckResult["name"]): CheckResult => {
  const c = r.checks.find((x) => x.name === name);
  if (c === undefined) throw new Error(`no ${name} check in ${JSON.stringify(r)}`);
  return c;
};

describe("checkMapping", () => {
  it("passes the EdGB mapping, with its derivation from a -1PN dipole flux", async () => {
    const r = await checkMapping({
      ...EDGB,
      derivation: { flux: { order: -1, coefficient: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" } },
    });
    expect(r.checks.map((c) => [c.name, c.ok])).toEqual([
      ["parse", true],
      ["symbols", true],
      ["dimension", true],
      ["gr_limit", true],
      ["pn_order", true],
      ["symmetry", true],
      ["derivation", true],
    ]);
    expect(r.ok).toBe(true);
    expect(check(r, "derivation").message).toMatch(/\[method: symbolic\]/);
    expect(r.latex).toContain("\\frac{5}{7168}");
  });

  it("dimension: catches the missing M^4 when zeta is written 16 pi alpha^2 with alpha of dimension 2", async () => {
    const r = await checkMapping({ ...EDGB, definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2" }] });
    const d = check(r, "dimension");
    expect(d.ok).toBe(false);
    expect(d.severity).toBe("error");
    expect(d.message).toBe("expression has dimension length^4; ppE beta must be dimensionless (missing 1/M^4?)");
    expect(r.ok).toBe(false);
  });

  it("dimension: says length^-4 and 'missing M^4' when the coupling is taken as dimensionless but divided by M^4 twice", async () => {
    const r = await checkMapping({ ...EDGB, expression: "zeta/M^4" });
    expect(check(r, "dimension").message).toBe("expression has dimension length^-4; ppE beta must be dimensionless (missing M^4?)");
  });

  it("dimension: reports an inhomogeneous sum and names the terms", async () => {
    const r = await checkMapping({ ...EDGB, expression: "alpha/M^2 + alpha" });
    const d = check(r, "dimension");
    expect(d.ok).toBe(false);
    expect(d.message).toMatch(/not homogeneous/);
    expect(d.message).toContain('"alpha/M^2" has no dimension (length^0) but "alpha" has length^2');
  });

  it("gr_limit: a constant term fails and the message shows its value", async () => {
    const r = await checkMapping({ ...EDGB, expression: `${EDGB.expression} + 3/128` });
    const g = check(r, "gr_limit");
    expect(g.ok).toBe(false);
    expect(g.message).toMatch(/^with alpha = 0 the expression equals 0\.0234375 /);
    expect(check(r, "dimension").ok).toBe(true);
  });

  it("gr_limit: limits at zero coupling (0/0, sqrt) and GR at infinite Compton wavelength", async () => {
    const limit = await checkMapping({ ...EDGB, expression: "alpha^3/(alpha*M^4)" });
    expect(check(limit, "gr_limit")).toMatchObject({ ok: true });
    expect(check(limit, "gr_limit").message).toMatch(/tends to 0/);
    const root = await checkMapping({ ...EDGB, expression: "sqrt(zeta)" });
    expect(check(root, "gr_limit").ok).toBe(true);
    // Massive graviton (physics primer section 2, Will 1998, PRD 57 2061): b = -3, 1PN
    const mg = await checkMapping({
      expression: "-pi^2*D_0*Mc/lambda_g^2",
      target: "ppe_phase",
      b: -3,
      couplings: [{ symbol: "lambda_g", dimension: 1 }],
    });
    expect(check(mg, "gr_limit")).toMatchObject({ ok: true, severity: "warning" });
    expect(check(mg, "dimension").ok).toBe(true);
    expect(mg.ok).toBe(true);
    const noCoupling = await checkMapping({ ...EDGB, expression: "eta^2" });
    expect(check(noCoupling, "gr_limit")).toMatchObject({ ok: false });
    expect(check(noCoupling, "gr_limit").message).toMatch(/uses no coupling \(declared: alpha\)/);
  });

  it("symbols: names an undeclared symbol with its position", async () => {
    const r = await checkMapping({ ...EDGB, expression: "16*pi*alhpa^2/M^4" });
    expect(check(r, "parse").ok).toBe(true);
    expect(check(r, "symbols")).toMatchObject({ ok: false, message: 'unknown symbol "alhpa" at position 6 (did you mean "alpha"?)' });
    expect(r.checks.map((c) => c.name)).toEqual(["parse", "symbols"]);
  });

  it("parse: a syntax error stops the report there, with no LaTeX", async () => {
    const r = await checkMapping({ ...EDGB, expression: "2zeta" });
    expect(r).toMatchObject({ ok: false, latex: null });
    expect(check(r, "parse").message).toMatch(/missing operator/);
  });

  it("pn_order: b = 2n - 5 and a = 2n must match; b = 0 and b = 3 warn that no bound exists", async () => {
    // Source: Yunes & Pretorius 2009, PRD 80 122003 (arXiv:0909.3328), b = 2n - 5, a = 2n
    const bad = await checkMapping({ ...EDGB, b: -3 });
    expect(check(bad, "pn_order")).toMatchObject({ ok: false });
    expect(check(bad, "pn_order").message).toBe(
      "b = -3 is a 1PN correction (b = 2n - 5), but pn_order = -1 was stated, which gives b = -7",
    );
    const b0 = await checkMapping({ ...EDGB, b: 0, pn_order: 2.5 });
    expect(check(b0, "pn_order")).toMatchObject({ ok: true, severity: "warning" });
    expect(check(b0, "pn_order").message).toMatch(/coalescence phase: no bound exists there/);
    const b3 = await checkMapping({ ...EDGB, b: 3, pn_order: undefined });
    expect(check(b3, "pn_order").message).toMatch(/coalescence time: no bound exists there/);
    const amp = await checkMapping({ ...EDGB, target: "ppe_amplitude", b: undefined, a: -2, pn_order: -1 });
    expect(check(amp, "pn_order")).toMatchObject({ ok: true, message: "a = -2 matches pn_order = -1 (a = 2n)" });
    const none = await checkMapping({ ...EDGB, b: undefined, pn_order: undefined });
    expect(check(none, "pn_order").ok).toBe(false);
    const ringdown = await checkMapping({ ...EDGB, target: "ringdown_frequency" });
    expect(ringdown.checks.some((c) => c.name === "pn_order")).toBe(false);
  });

  it("remnant mappings: checked like ringdown ones (dimensionless, vanishing in GR, no PN order)", async () => {
    // A fractional remnant-mass shift linear in zeta = 16 pi alpha^2 / M_f^4 (illustrative form; derived: dimensionless, 0 at alpha = 0).
    const good = await checkMapping({ ...EDGB, expression: "zeta/10", target: "remnant_mass", b: undefined, pn_order: undefined });
    expect(check(good, "dimension").ok).toBe(true);
    expect(check(good, "gr_limit").ok).toBe(true);
    expect(good.checks.some((c) => c.name === "pn_order")).toBe(false);
    // alpha alone has dimension length^2: not a fractional shift.
    const dimensionful = await checkMapping({ ...EDGB, expression: "alpha", target: "remnant_spin", b: undefined, pn_order: undefined });
    expect(check(dimensionful, "dimension").ok).toBe(false);
    expect(check(dimensionful, "dimension").message).toMatch(/remnant-spin shift/);
    // A constant does not vanish in GR.
    const offset = await checkMapping({ ...EDGB, expression: "0.1 + zeta", target: "remnant_mass", b: undefined, pn_order: undefined });
    expect(check(offset, "gr_limit").ok).toBe(false);
  });

  it("derivation: a wrong prefactor fails numerically; a wrong b is named", async () => {
    const derivation = { flux: { order: -1, coefficient: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" } };
    const wrong = await checkMapping({ ...EDGB, expression: EDGB.expression.replace("7168", "3584"), derivation });
    const d = check(wrong, "derivation");
    expect(d.ok).toBe(false);
    expect(d.message).toMatch(/differs from the derived .* \[method: numeric\]/);
    const otherB = await checkMapping({ ...EDGB, b: -3, pn_order: 1, derivation });
    expect(check(otherB, "derivation").message).toBe("the derivation gives b = -7, but b = -3 was stated");
    const degenerate = await checkMapping({ ...EDGB, derivation: { flux: { order: 2.5, coefficient: "zeta" } } });
    expect(check(degenerate, "derivation").message).toMatch(/b = 0 \(2\.5PN\)/);
  });

  it("derivation: the amplitude from a frequency drift, alpha = -gamma/2 at a = b + 5", async () => {
    const r = await checkMapping({
      expression: "-zeta/2",
      target: "ppe_amplitude",
      a: -2,
      couplings: [{ symbol: "alpha", dimension: 2 }],
      definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
      derivation: { frequency_drift: { order: -1, coefficient: "zeta" } },
    });
    expect(check(r, "derivation")).toMatchObject({ ok: true });
  });

  it("validity expressions must be dimensionless too", async () => {
    const r = await checkMapping({ ...EDGB, target: "validity", expression: "16*pi*alpha^2/m2^2" });
    expect(check(r, "dimension").message).toBe(
      "expression has dimension length^2; a validity expression must be dimensionless (missing 1/M^2?)",
    );
  });

  it("reports a bad definition under symbols, naming it", async () => {
    const r = await checkMapping({ ...EDGB, definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/(M^4" }] });
    expect(check(r, "symbols").message).toBe('definition "zeta": "(" at position 14 is never closed');
  });

  it("throws ExpressionError only for input that is not a mapping", async () => {
    await expect(checkMapping({ ...EDGB, expression: 42 as unknown as string })).rejects.toBeInstanceOf(ExpressionError);
    await expect(checkMapping({ ...EDGB, target: "bogus" as MappingInput["target"] })).rejects.toBeInstanceOf(ExpressionError);
  });
});

describe("expressionErrorToHttp", () => {
  it("maps to a 400 on the expression field with code, token and position", () => {
    let err: unknown;
    try {
      guardExpression("x + alhpa", { symbols: ["x", "alpha"] });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ExpressionError);
    const r = expressionErrorToHttp(err as ExpressionError);
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toEqual({ expression: 'unknown symbol "alhpa" at position 4 (did you mean "alpha"?)' });
    expect(r.body.error.detail).toEqual({ code: "undeclared_symbol", token: "alhpa", position: 4 });
  });

  it("points definition errors at the definition", () => {
    const err = new ExpressionError("bad_definition", 'definition "zeta": bad', "x", 3, "zeta");
    expect(Object.keys(expressionErrorToHttp(err).body.error.fields)).toEqual(["definitions.zeta"]);
  });
});
