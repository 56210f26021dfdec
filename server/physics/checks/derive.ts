import { collectSymbols, DERIVED_LIMITS, type Node } from "../expr/ast.ts";
import { compileAst } from "../expr/compile.ts";
import { ExpressionError, isExpressionError } from "../expr/errors.ts";
import { guardExpression } from "../expr/guard.ts";
import { toLatex } from "../expr/latex.ts";
import { printExpression } from "../expr/print.ts";
import { expandAst, type SymbolTable } from "../expr/symbols.ts";
import { DerivationError } from "./derive-error.ts";
import { derivePropagation } from "./propagation.ts";
import { Rational } from "./rational.ts";
import type { DerivationInput, DerivationTerm } from "./types.ts";

// Formulas: docs physics primer section 1.1 [derived], on the ppE form of Yunes & Pretorius 2009
// (PRD 80 122003, arXiv:0909.3328): energy balance dt/dv = -E'(v)/F(v) and the SPA
// d^2 Psi/df^2 = 2 pi dt/df, to first order in the corrections.

export { DerivationError, type DerivationErrorCode } from "./derive-error.ts";

export interface DerivedPhaseTerm {
  readonly b: number;
  /** Relative PN order of the term. */
  readonly pn_order: number;
  readonly beta: string;
  readonly beta_latex: string;
  readonly value?: number;
  readonly source: "energy_flux" | "frequency_drift" | "propagation";
}

export interface DerivedAmplitudeTerm {
  readonly a: number;
  readonly alpha: string;
  readonly alpha_latex: string;
  readonly value?: number;
  /** What the term leaves out. */
  readonly note?: string;
}

/** Said beside every amplitude term derived from an energy and flux change. */
export const DRIFT_PIECE_NOTE =
  "frequency-drift piece only: alpha = [(k+1) A - B] eta^(-2k/5) / 2 at a = b + 5; the conservative (Kepler-law) piece that an energy change adds to the amplitude is left out (Tahura & Yagi 2018, PRD 98 084042); for a change of the flux alone the Kepler law is unchanged, so the drift piece is the whole correction to the quadrupole harmonic";

export interface Derivation {
  readonly terms: readonly DerivedPhaseTerm[];
  readonly amplitude?: readonly DerivedAmplitudeTerm[];
  readonly steps: readonly string[];
  /** Remarks such as "an energy change at -1PN never contributes". */
  readonly notes: readonly string[];
}

export interface DeriveOptions {
  /** Values of m1, m2 and any primitive symbol or coupling; M, eta, ... follow from them. */
  readonly evaluate_at?: Readonly<Record<string, number>>;
}

type Field = "energy" | "flux" | "frequency_drift";

function order(term: DerivationTerm, field: Field): Rational {
  const r = typeof term.order === "number" ? Rational.fromNumber(term.order) : undefined;
  if (r === undefined) {
    throw new DerivationError("bad_order", `${field}: order must be a number such as -1, 1.5 or 2 (a fraction with a small denominator)`, field);
  }
  return r;
}

function coefficient(term: DerivationTerm, field: Field, table: SymbolTable): Node {
  try {
    return guardExpression(term.coefficient, { symbols: table.names }).ast;
  } catch (err) {
    if (!isExpressionError(err)) throw err;
    throw new ExpressionError(err.code, `${field} coefficient: ${err.message}`, err.token, err.position);
  }
}

const R = Rational.of;
const TWO = R(2);
const FIVE = R(5);
const EIGHT = R(8);

function degeneracy(b: Rational, field: Field, what: string): void {
  if (b.isZero()) {
    throw new DerivationError("degenerate_order", `${field}: ${what} gives b = 0 (2.5PN), degenerate with the coalescence phase; no ppE bound exists there`, field);
  }
  if (b.equals(R(3))) {
    throw new DerivationError("degenerate_order", `${field}: ${what} gives b = 3 (4PN), degenerate with the coalescence time; no ppE bound exists there`, field);
  }
}

/** "rational * eta^e * (X)" built as text in our own syntax and re-parsed. */
function build(coef: Rational, etaExp: Rational, body: string, table: SymbolTable): Node {
  const eta = etaExp.isZero() ? "" : `*eta^${etaExp.toExpression()}`;
  const sign = coef.num < 0n ? "-" : "";
  const magnitude = coef.num < 0n ? coef.neg() : coef;
  const text = coef.isZero() ? "0" : `${sign}${magnitude.toExpression()}${eta}*(${body})`;
  return guardExpression(text, { symbols: table.names, limits: DERIVED_LIMITS }).ast;
}

/**
 * b and beta from a modified binding energy and/or flux, or from a modified frequency drift.
 * Exact rational prefactors; degenerate orders (b = 0, 3) are explained, not divided by zero.
 */
export function deriveBeta(input: DerivationInput, table: SymbolTable, options: DeriveOptions = {}): Derivation {
  if (input === null || typeof input !== "object" || (!input.energy && !input.flux && !input.frequency_drift && !input.propagation)) {
    throw new DerivationError("no_input", "give an energy, a flux, a frequency-drift or a propagation (dispersion) correction", "derivation");
  }
  const notes: string[] = [];
  const steps: string[] = [];
  const terms: Array<{ term: DerivedPhaseTerm; ast: Node }> = [];
  const amplitude: Array<{ term: DerivedAmplitudeTerm; ast: Node }> = [];

  if (input.energy || input.flux) {
    const byOrder = new Map<string, { k: Rational; A?: Node; B?: Node }>();
    if (input.energy) {
      const p = order(input.energy, "energy");
      const A = coefficient(input.energy, "energy", table);
      steps.push(`E(v) = -\\frac{1}{2} M \\eta v^{2}\\left[1 + \\left(${toLatex(A)}\\right) v^{${TWO.mul(p).toString()}}\\right]`);
      if (p.add(R(1)).isZero()) {
        notes.push("an energy correction at -1PN (p = -1) never contributes to the phase: its factor (p + 1) is 0");
      } else {
        degeneracy(TWO.mul(p).sub(FIVE), "energy", `order p = ${p}`);
        byOrder.set(p.toString(), { k: p, A });
      }
    }
    if (input.flux) {
      const q = order(input.flux, "flux");
      const B = coefficient(input.flux, "flux", table);
      steps.push(`\\mathcal{F}(v) = \\frac{32}{5} \\eta^{2} v^{10}\\left[1 + \\left(${toLatex(B)}\\right) v^{${TWO.mul(q).toString()}}\\right]`);
      degeneracy(TWO.mul(q).sub(FIVE), "flux", `order q = ${q}`);
      const entry = byOrder.get(q.toString());
      if (entry !== undefined) entry.B = B;
      else byOrder.set(q.toString(), { k: q, B });
    }
    steps.push("\\frac{dt}{dv} = -\\frac{E'(v)}{\\mathcal{F}(v)}");
    steps.push("\\frac{d^{2}\\Psi}{df^{2}} = 2\\pi \\frac{dt}{df}, \\qquad u = \\eta^{1/5} v");
    steps.push("\\beta = \\frac{15\\,\\left[(k+1) A - B\\right]\\,\\eta^{-2k/5}}{16\\,(2k-8)(2k-5)}, \\qquad b = 2k - 5");
    steps.push("\\dot f = \\dot f_{\\mathrm{GR}}\\left[1 + \\gamma\\, u^{2k}\\right],\\quad \\gamma = \\left[B - (k+1) A\\right]\\eta^{-2k/5},\\qquad \\alpha = -\\frac{\\gamma}{2}, \\quad a = 2k = b + 5");
    for (const { k, A, B } of byOrder.values()) {
      const base = R(15).div(R(16).mul(TWO.mul(k).sub(EIGHT)).mul(TWO.mul(k).sub(FIVE)));
      const etaExp = R(-2).mul(k).div(FIVE);
      const kp1 = k.add(R(1));
      const a = A === undefined ? undefined : printExpression(A);
      const bb = B === undefined ? undefined : printExpression(B);
      const ast =
        a !== undefined && bb !== undefined
          ? build(base, etaExp, `${kp1.toExpression()}*(${a}) - (${bb})`, table)
          : a !== undefined
            ? build(base.mul(kp1), etaExp, a, table)
            : build(base.neg(), etaExp, bb as string, table);
      const b = TWO.mul(k).sub(FIVE);
      terms.push({
        term: { b: b.toNumber(), pn_order: k.toNumber(), beta: printExpression(ast), beta_latex: toLatex(ast), source: "energy_flux" },
        ast,
      });
      steps.push(`k = ${k.toLatex()}:\\quad b = ${b.toLatex()},\\quad \\beta = ${toLatex(ast)}`);
      // The frequency-drift piece of the amplitude: dv/dt = -F/E' changes by 1 + [B - (k+1) A] v^(2k), so
      // the drift is df/dt = GR [1 + gamma u^(2k)] with gamma = [B - (k+1) A] eta^(-2k/5), and the SPA
      // amplitude ~ (df/dt)^(-1/2) gives alpha = -gamma/2 = [(k+1) A - B] eta^(-2k/5) / 2 at a = 2k = b + 5.
      // The conservative (Kepler-law) piece of the amplitude is not included (Tahura & Yagi 2018).
      const half = R(1, 2);
      const alphaAst =
        a !== undefined && bb !== undefined
          ? build(half, etaExp, `${kp1.toExpression()}*(${a}) - (${bb})`, table)
          : a !== undefined
            ? build(half.mul(kp1), etaExp, a, table)
            : build(half.neg(), etaExp, bb as string, table);
      const aExp = b.add(FIVE);
      amplitude.push({ term: { a: aExp.toNumber(), alpha: printExpression(alphaAst), alpha_latex: toLatex(alphaAst), note: DRIFT_PIECE_NOTE }, ast: alphaAst });
      steps.push(`a = ${aExp.toLatex()}:\\quad \\alpha = -\\frac{\\gamma}{2} = ${toLatex(alphaAst)}\\quad\\text{(frequency-drift piece only)}`);
    }
  }

  if (input.frequency_drift) {
    const n = order(input.frequency_drift, "frequency_drift");
    const gamma = coefficient(input.frequency_drift, "frequency_drift", table);
    const b = TWO.mul(n).sub(FIVE);
    degeneracy(b, "frequency_drift", `order n = ${n}`);
    const g = printExpression(gamma);
    const ast = build(R(-15).div(R(16).mul(b).mul(b.sub(R(3)))), R(0), g, table);
    const alphaAst = build(R(-1, 2), R(0), g, table);
    const a = b.add(FIVE);
    steps.push(`\\dot f = \\dot f_{\\mathrm{GR}}\\left[1 + \\left(${toLatex(gamma)}\\right) u^{${a.toLatex()}}\\right]`);
    steps.push("\\beta = -\\frac{15\\,\\gamma}{16\\, b\\,(b-3)}, \\qquad \\alpha = -\\frac{\\gamma}{2}, \\quad a = b + 5");
    steps.push(`b = ${b.toLatex()}:\\quad \\beta = ${toLatex(ast)},\\quad a = ${a.toLatex()}:\\quad \\alpha = ${toLatex(alphaAst)}`);
    terms.push({
      term: { b: b.toNumber(), pn_order: n.toNumber(), beta: printExpression(ast), beta_latex: toLatex(ast), source: "frequency_drift" },
      ast,
    });
    amplitude.push({ term: { a: a.toNumber(), alpha: printExpression(alphaAst), alpha_latex: toLatex(alphaAst) }, ast: alphaAst });
  }
  if (input.propagation) {
    const p = derivePropagation(input.propagation, table);
    steps.push(...p.steps);
    notes.push(...p.notes);
    terms.push({
      term: { b: p.b, pn_order: p.pn_order, beta: printExpression(p.beta), beta_latex: toLatex(p.beta), source: "propagation" },
      ast: p.beta,
    });
  }
  if (input.frequency_drift && (input.energy || input.flux)) {
    notes.push("both a frequency drift and an energy/flux change were given; they are derived separately and should agree");
  }
  if (input.frequency_drift) {
    notes.push("the amplitude term comes from the frequency drift only; the conservative (Kepler-law) piece is not included (Tahura & Yagi 2018, PRD 98 084042)");
  }

  const at = options.evaluate_at;
  const valueOf = at === undefined ? undefined : evaluator(at, table);
  return {
    terms: terms.map(({ term, ast }) => (valueOf ? { ...term, value: valueOf(ast) } : term)),
    ...(amplitude.length > 0
      ? { amplitude: amplitude.map(({ term, ast }) => (valueOf ? { ...term, value: valueOf(ast) } : term)) }
      : {}),
    steps,
    notes,
  };
}

function evaluator(at: Readonly<Record<string, number>>, table: SymbolTable): (ast: Node) => number {
  if (at === null || typeof at !== "object") throw new DerivationError("missing_value", "evaluate_at must map symbols to numbers", "evaluate_at");
  const primitives = new Set(table.primitives);
  for (const [name, v] of Object.entries(at)) {
    if (!primitives.has(name)) {
      const info = table.get(name);
      const why = info === undefined ? "is not a declared symbol" : "is derived from other symbols; give those instead";
      throw new DerivationError("missing_value", `evaluate_at: "${name.slice(0, 40)}" ${why}`, "evaluate_at");
    }
    if (typeof v !== "number" || !Number.isFinite(v)) {
      throw new DerivationError("missing_value", `evaluate_at: ${name} must be a finite number`, "evaluate_at");
    }
  }
  const values = new Map(Object.entries(at));
  return (ast) => {
    const expanded = expandAst(ast, table);
    const args = [...collectSymbols(expanded).keys()];
    const missing = args.filter((a) => !values.has(a));
    if (missing.length > 0) {
      throw new DerivationError("missing_value", `evaluate_at: give a value for ${missing.join(", ")}`, "evaluate_at");
    }
    return compileAst(expanded, args)(args.map((a) => values.get(a) as number));
  };
}
