import type { Node } from "../expr/ast.ts";
import { formatDimension, inferAstDimension, toSmallFraction } from "../expr/dimension.ts";
import type { SymbolTable } from "../expr/symbols.ts";
import type { Prepared } from "./evaluate.ts";
import { createRandom, samplePoint, scalePoint } from "./sampling.ts";
import type { CheckResult, MappingTarget } from "./types.ts";

export type MeasuredDimension =
  | { readonly kind: "dimension"; readonly dimension: number }
  | { readonly kind: "inhomogeneous"; readonly estimates: readonly number[] }
  | { readonly kind: "zero" }
  | { readonly kind: "unevaluable" };

const LAMBDAS = [2, 0.5, 10] as const;
const POINTS_WANTED = 3;
const MAX_ATTEMPTS = 12;
const TOLERANCE = 1e-6;

/**
 * Dimension by scaling: every symbol of dimension d is multiplied by lambda^d; a homogeneous
 * expression of dimension D is multiplied by lambda^D. D is read off at several lambdas and
 * points; disagreement means terms of different dimension are added. Unlike the algebraic
 * inference this sees through cancellations and definitions.
 */
export function measureDimension(p: Prepared, table: SymbolTable, seed = 20240601): MeasuredDimension {
  const rng = createRandom(seed);
  const estimates: number[] = [];
  let good = 0;
  let zeros = 0;
  for (let attempt = 0; attempt < MAX_ATTEMPTS && good < POINTS_WANTED; attempt += 1) {
    const point = samplePoint(p.args, table, rng);
    const f1 = p.f(point);
    if (!Number.isFinite(f1)) continue;
    if (f1 === 0) {
      zeros += 1;
      continue;
    }
    const local: number[] = [];
    let usable = true;
    for (const lambda of LAMBDAS) {
      const fl = p.f(scalePoint(point, p.dims, lambda));
      if (!Number.isFinite(fl)) {
        usable = false;
        break;
      }
      const ratio = fl / f1;
      // A power law keeps its sign under rescaling; a sign change (or vanishing) means unlike terms.
      if (ratio <= 0) return { kind: "inhomogeneous", estimates: [...estimates, Number.NaN] };
      local.push(Math.log(ratio) / Math.log(lambda));
    }
    if (!usable) continue;
    estimates.push(...local);
    good += 1;
  }
  if (good === 0) return zeros > 0 ? { kind: "zero" } : { kind: "unevaluable" };
  const lo = Math.min(...estimates);
  const hi = Math.max(...estimates);
  if (hi - lo > TOLERANCE * Math.max(1, Math.abs(hi))) return { kind: "inhomogeneous", estimates };
  const mean = estimates.reduce((s, x) => s + x, 0) / estimates.length;
  const frac = toSmallFraction(mean);
  return { kind: "dimension", dimension: frac === undefined ? mean : frac[0] / frac[1] };
}

const TARGET_NOUN: Record<MappingTarget, string> = {
  ppe_phase: "ppE beta",
  ppe_amplitude: "ppE alpha",
  ringdown_frequency: "a ringdown frequency shift",
  ringdown_damping: "a ringdown damping-time shift",
  remnant_mass: "a remnant-mass shift",
  remnant_spin: "a remnant-spin shift",
  validity: "a validity expression",
};

/** "(missing M^4?)" for length^-4, "(missing 1/M^2?)" for length^2. */
function missingFactor(d: number): string {
  const frac = toSmallFraction(Math.abs(d));
  const power = frac === undefined ? Math.abs(d).toPrecision(4) : frac[1] === 1 ? `${frac[0]}` : `(${frac[0]}/${frac[1]})`;
  return d < 0 ? `missing M^${power}?` : `missing 1/M^${power}?`;
}

export function dimensionCheck(ast: Node, p: Prepared, table: SymbolTable, target: MappingTarget): CheckResult {
  const noun = TARGET_NOUN[target];
  const measured = measureDimension(p, table);
  switch (measured.kind) {
    case "dimension": {
      if (Math.abs(measured.dimension) <= TOLERANCE) {
        return { name: "dimension", ok: true, message: "expression is dimensionless" };
      }
      return {
        name: "dimension",
        ok: false,
        severity: "error",
        message: `expression has dimension ${formatDimension(measured.dimension)}; ${noun} must be dimensionless (${missingFactor(measured.dimension)})`,
      };
    }
    case "inhomogeneous": {
      const algebraic = inferAstDimension(ast, table);
      const detail = !algebraic.ok && algebraic.reason === "inhomogeneous" ? `: ${algebraic.message}` : "";
      return {
        name: "dimension",
        ok: false,
        severity: "error",
        message: `expression is not homogeneous in dimension (it adds terms of different powers of length)${detail}; ${noun} must be dimensionless`,
      };
    }
    case "zero":
      return {
        name: "dimension",
        ok: true,
        severity: "warning",
        message: "expression is 0 at every sample point, so its dimension cannot be measured",
      };
    case "unevaluable": {
      const algebraic = inferAstDimension(ast, table);
      if (algebraic.ok && Math.abs(algebraic.dimension) <= TOLERANCE) {
        return {
          name: "dimension",
          ok: true,
          severity: "warning",
          message: "expression is dimensionless by its algebra, but it gave no finite value at sample points (square root or log of a negative quantity?)",
        };
      }
      return {
        name: "dimension",
        ok: false,
        severity: "error",
        message: algebraic.ok
          ? `expression has dimension ${formatDimension(algebraic.dimension)}; ${noun} must be dimensionless (${missingFactor(algebraic.dimension)})`
          : `dimension could not be determined: ${algebraic.message}; and the expression gave no finite value at sample points`,
      };
    }
  }
}
