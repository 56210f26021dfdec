import type { Node } from "./ast.ts";
import { compileAst } from "./compile.ts";
import { guardExpression } from "./guard.ts";
import { printExpression } from "./print.ts";

/** What dimension inference needs from a symbol table. */
export interface DimensionLookup {
  get(name: string): { readonly dimension: number | null } | undefined;
}

export type DimensionResult =
  | { readonly ok: true; readonly dimension: number }
  | {
      readonly ok: false;
      readonly reason: "inhomogeneous" | "non_constant_exponent" | "function_argument" | "unknown_symbol";
      readonly message: string;
      readonly position: number;
    };

const TOLERANCE = 1e-9;

/**
 * Dimension by the algebra of the tree: sums must agree, products add, a power of a dimensional
 * base needs a constant exponent, exp/log/sin/cos need dimensionless arguments. Exact, and it can
 * point at the offending sum; it cannot see cancellations (checks/ also measure numerically).
 */
export function inferDimension(expression: string | Node, table: DimensionLookup & { names?: ReadonlySet<string> }): DimensionResult {
  const ast =
    typeof expression === "string"
      ? guardExpression(expression, table.names !== undefined ? { symbols: table.names } : {}).ast
      : expression;
  return inferAstDimension(ast, table);
}

export function inferAstDimension(ast: Node, table: DimensionLookup): DimensionResult {
  try {
    return { ok: true, dimension: walk(ast, table) };
  } catch (err) {
    if (err instanceof DimensionFailure) return { ok: false, reason: err.reason, message: err.message, position: err.position };
    throw err;
  }
}

class DimensionFailure extends Error {
  constructor(
    readonly reason: "inhomogeneous" | "non_constant_exponent" | "function_argument" | "unknown_symbol",
    message: string,
    readonly position: number,
  ) {
    super(message);
  }
}

const snippet = (n: Node): string => {
  const s = printExpression(n);
  return s.length > 60 ? `${s.slice(0, 57)}...` : s;
};

function walk(n: Node, table: DimensionLookup): number {
  switch (n.kind) {
    case "num":
    case "const":
      return 0;
    case "sym": {
      const info = table.get(n.name);
      if (info === undefined) throw new DimensionFailure("unknown_symbol", `unknown symbol "${n.name}"`, n.pos);
      if (info.dimension === null) {
        throw new DimensionFailure("inhomogeneous", `"${n.name}" has no single dimension (its definition adds unlike terms)`, n.pos);
      }
      return info.dimension;
    }
    case "neg":
      return walk(n.arg, table);
    case "add": {
      const first = n.terms[0];
      if (first === undefined) return 0;
      const d0 = walk(first.node, table);
      for (const t of n.terms.slice(1)) {
        const d = walk(t.node, table);
        if (Math.abs(d - d0) > TOLERANCE) {
          throw new DimensionFailure(
            "inhomogeneous",
            `terms of different dimension are added: "${snippet(first.node)}" has ${formatDimension(d0)} but "${snippet(t.node)}" has ${formatDimension(d)}`,
            t.node.pos,
          );
        }
      }
      return d0;
    }
    case "mul":
      return n.factors.reduce((acc, f) => acc + (f.div ? -1 : 1) * walk(f.node, table), 0);
    case "pow": {
      const base = walk(n.base, table);
      const exp = walk(n.exp, table);
      if (Math.abs(exp) > TOLERANCE) {
        throw new DimensionFailure("function_argument", `exponent "${snippet(n.exp)}" has ${formatDimension(exp)}; exponents must be dimensionless`, n.exp.pos);
      }
      if (Math.abs(base) <= TOLERANCE) return 0;
      const value = constantValue(n.exp);
      if (value === undefined) {
        throw new DimensionFailure(
          "non_constant_exponent",
          `"${snippet(n.base)}" has ${formatDimension(base)} and is raised to the non-constant power "${snippet(n.exp)}"`,
          n.pos,
        );
      }
      return base * value;
    }
    case "call": {
      const d = walk(n.arg, table);
      if (n.fn === "sqrt") return d / 2;
      if (n.fn === "abs") return d;
      if (Math.abs(d) > TOLERANCE) {
        throw new DimensionFailure("function_argument", `${n.fn} of "${snippet(n.arg)}", which has ${formatDimension(d)}; its argument must be dimensionless`, n.pos);
      }
      return 0;
    }
  }
}

function hasSymbols(n: Node): boolean {
  switch (n.kind) {
    case "sym":
      return true;
    case "num":
    case "const":
      return false;
    case "neg":
    case "call":
      return hasSymbols(n.arg);
    case "add":
      return n.terms.some((t) => hasSymbols(t.node));
    case "mul":
      return n.factors.some((f) => hasSymbols(f.node));
    case "pow":
      return hasSymbols(n.base) || hasSymbols(n.exp);
  }
}

function constantValue(n: Node): number | undefined {
  if (hasSymbols(n)) return undefined;
  const v = compileAst(n, [])([]);
  return Number.isFinite(v) ? v : undefined;
}

/** A dimension for messages: "length^-4", "length^(1/2)", "no dimension". */
export function formatDimension(d: number): string {
  if (Math.abs(d) <= TOLERANCE) return "no dimension (length^0)";
  const r = toSmallFraction(d);
  if (r === undefined) return `length^${d.toPrecision(6)}`;
  const [p, q] = r;
  return q === 1 ? `length^${p}` : `length^(${p}/${q})`;
}

/** p/q with q <= 60 when d is that fraction to 1e-9, else undefined. */
export function toSmallFraction(d: number): [number, number] | undefined {
  for (let q = 1; q <= 60; q += 1) {
    const p = Math.round(d * q);
    if (Math.abs(p / q - d) <= TOLERANCE * Math.max(1, Math.abs(d))) return [p, q];
  }
  return undefined;
}
