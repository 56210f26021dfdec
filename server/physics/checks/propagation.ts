import { DERIVED_LIMITS, type Node } from "../expr/ast.ts";
import { ExpressionError, isExpressionError } from "../expr/errors.ts";
import { guardExpression } from "../expr/guard.ts";
import { toLatex } from "../expr/latex.ts";
import { printExpression } from "../expr/print.ts";
import type { SymbolTable } from "../expr/symbols.ts";
import { DerivationError } from "./derive-error.ts";
import { Rational } from "./rational.ts";
import type { PropagationInput } from "./types.ts";

/**
 * beta of a propagation effect, from the dispersion relation E^2 = p^2 + A p^alpha (c = 1) of
 * Mirshekari, Yunes & Will 2012 (Phys. Rev. D 85, 024041, arXiv:1110.2720) [derived here]:
 *
 * - speed v = p/E = 1 - (1/2) A E^(alpha - 2) to first order in A (the particle speed MYW use;
 *   the group velocity dE/dp would multiply the delay by (1 - alpha));
 * - a graviton observed at frequency f (emitted at (1 + z) f) arrives later than a massless one by
 *   dt(f) = (D_alpha / 2) Acal ((1 + z) f)^(alpha - 2), Acal = A / h^(2 - alpha) a power of length,
 *   with the distance measure D_alpha = (1+z)^(1-alpha)/H0 int_0^z (1+z')^(alpha-2)/E(z') dz' of MYW;
 * - the stationary-phase approximation, d^2 Psi / df^2 = 2 pi dt/df, integrates to
 *   dPsi = pi D_alpha Acal ((1 + z) f)^(alpha - 1) / (alpha - 1) (alpha != 1);
 * - with u^3 = pi Mc_z f and Mc_z = (1 + z) Mc:
 *   beta = pi^(2 - alpha) D_alpha Acal Mc^(1 - alpha) / (alpha - 1),  b = 3 (alpha - 1),
 *   the chirp mass in the SOURCE frame (the (1 + z) factors cancel).
 *
 * alpha = 0 is the massive graviton (Acal = 1/lambda_g^2, D_0): beta = -pi^2 D_0 Mc / lambda_g^2
 * (Will 1998, Phys. Rev. D 57, 2061). alpha = 1 gives pi D_1 Acal ln(u) * 3, a logarithm and no
 * power of u; alpha = 2 gives b = 3, degenerate with the coalescence time.
 */

export interface PropagationTerm {
  readonly b: number;
  readonly pn_order: number;
  readonly beta: Node;
  readonly steps: readonly string[];
  readonly notes: readonly string[];
}

export interface PropagationOptions {
  /** The distance symbol the formula accumulates over (D_0 for alpha = 0 by default, else D_alpha). */
  readonly distance?: "D_0" | "D_alpha";
}

export function derivePropagation(input: PropagationInput, table: SymbolTable, options: PropagationOptions = {}): PropagationTerm {
  const alpha = typeof input.alpha_md === "number" ? Rational.fromNumber(input.alpha_md) : undefined;
  if (alpha === undefined) {
    throw new DerivationError("bad_order", "propagation: alpha_md must be a number such as 0, 2.5 or 4 (a fraction with a small denominator)", "propagation");
  }
  const one = Rational.of(1);
  const b = Rational.of(3).mul(alpha.sub(one));
  const n = b.add(Rational.of(5)).div(Rational.of(2));
  if (input.order !== undefined) {
    const stated = Rational.fromNumber(input.order);
    if (stated === undefined || !stated.equals(n)) {
      throw new DerivationError(
        "bad_order",
        `propagation: a dispersion E^2 = p^2 + A p^${alpha} enters at ${n}PN (b = 3 (alpha - 1) = ${b}), but order ${input.order} was stated`,
        "propagation",
      );
    }
  }
  if (alpha.equals(one)) {
    throw new DerivationError(
      "degenerate_order",
      "propagation: alpha = 1 gives dPsi = 3 pi D_1 A ln(u), a logarithm rather than a power of u: no ppE beta at one b (a bound needs a logarithmic phase term, as for the 2.5PN log term)",
      "propagation",
    );
  }
  let coefficient: Node;
  try {
    coefficient = guardExpression(input.coefficient, { symbols: table.names }).ast;
  } catch (err) {
    if (!isExpressionError(err)) throw err;
    throw new ExpressionError(err.code, `propagation coefficient: ${err.message}`, err.token, err.position);
  }
  const distance = options.distance ?? (alpha.isZero() ? "D_0" : "D_alpha");
  const prefactor = one.div(alpha.sub(one));
  const piPower = Rational.of(2).sub(alpha);
  const massPower = one.sub(alpha);
  const power = (base: string, e: Rational): string[] => (e.isZero() ? [] : e.equals(one) ? [base] : [`${base}^${e.toExpression()}`]);
  const magnitude = prefactor.num < 0n ? prefactor.neg() : prefactor;
  const factors = [
    ...(magnitude.equals(one) ? [] : [magnitude.toExpression()]),
    ...power("pi", piPower),
    distance,
    `(${printExpression(coefficient)})`,
    ...power("Mc", massPower),
  ];
  const text = `${prefactor.num < 0n ? "-" : ""}${factors.join("*")}`;
  const beta = guardExpression(text, { symbols: table.names, limits: DERIVED_LIMITS }).ast;
  const notes: string[] = [];
  if (b.equals(Rational.of(3))) notes.push("b = 3 (alpha = 2, a frequency-independent speed) is degenerate with the coalescence time: no phase bound exists there");
  const steps = [
    `E^{2} = p^{2} + \\left(${toLatex(coefficient)}\\right) h^{${piPower.toLatex()}}\\, p^{${alpha.toLatex()}}`,
    `v = \\frac{p}{E} = 1 - \\tfrac12 A\\,E^{${alpha.sub(Rational.of(2)).toLatex()}}`,
    `\\delta t(f) = \\frac{${distance === "D_0" ? "D_0" : "D_\\alpha"}}{2}\\,\\mathcal{A}\\,[(1+z) f]^{${alpha.sub(Rational.of(2)).toLatex()}}, \\qquad \\frac{d^{2}\\Psi}{df^{2}} = 2\\pi \\frac{d\\,\\delta t}{df}`,
    `u^{3} = \\pi \\mathcal{M}_z f,\\ \\mathcal{M}_z = (1+z)\\mathcal{M}:\\quad b = ${b.toLatex()},\\quad \\beta = ${toLatex(beta)}`,
  ];
  return { b: b.toNumber(), pn_order: n.toNumber(), beta, steps, notes };
}
