import { collectSymbols, DERIVED_LIMITS, type Node } from "../expr/ast.ts";
import { compileAst } from "../expr/compile.ts";
import { guardExpression } from "../expr/guard.ts";
import { getSymbolicPool, SymbolicError, type SymbolicPool } from "../expr/pool.ts";
import { expandAst, type SymbolTable } from "../expr/symbols.ts";
import { createRandom, describePoint, samplePoint } from "./sampling.ts";

export interface BetaComparison {
  readonly equal: boolean;
  /** Which method decided: a CAS proof that the difference is 0, or agreement at random points. */
  readonly method: "symbolic" | "numeric";
  readonly message: string;
  /** Largest |x - y| / max(|x|, |y|) over the points (numeric method). */
  readonly maxRelativeDifference?: number;
  readonly points?: number;
  /** What the symbolic attempt gave, when the numeric method decided. */
  readonly symbolic?: "not_shown" | "timeout" | "failed" | "skipped";
}

export interface CompareOptions {
  /** The pool to use (default: the shared one). */
  readonly pool?: SymbolicPool;
  /** false skips the CAS and compares numerically only. */
  readonly symbolic?: boolean;
  readonly timeoutMs?: number;
  readonly tolerance?: number;
  readonly seed?: number;
}

const POINTS = 7;
const MAX_ATTEMPTS = 40;

const toAst = (e: string | Node, table: SymbolTable): Node =>
  typeof e === "string" ? guardExpression(e, { symbols: table.names, limits: DERIVED_LIMITS }).ast : e;

const difference = (a: Node, b: Node): Node => ({
  kind: "add",
  terms: [
    { neg: false, node: a },
    { neg: true, node: b },
  ],
  pos: 0,
});

/**
 * Is the contributed beta the derived one? The CAS tries to prove the difference 0, written with
 * fewer and fewer atoms (as typed; user definitions expanded; everything in masses and spins).
 * If it cannot, evaluation at 7 random physical points with relative tolerance 1e-10 decides.
 * Values are computed first anyway (cheap), so a clear mismatch skips the CAS.
 */
export async function compareBeta(
  contributed: string | Node,
  derived: string | Node,
  table: SymbolTable,
  options: CompareOptions = {},
): Promise<BetaComparison> {
  const a = toAst(contributed, table);
  const b = toAst(derived, table);
  // Numbers first: a CAS can only ever prove "equal", so when the values clearly differ there is
  // nothing for it to do (and a non-zero difference is where nerdamer is slowest).
  const numeric = numericComparison(a, b, table, options);
  if (!numeric.equal && numeric.maxRelativeDifference !== undefined && numeric.maxRelativeDifference > 1e-6) {
    return { ...numeric, symbolic: "skipped" };
  }
  let symbolic: BetaComparison["symbolic"] = "skipped";
  if (options.symbolic !== false) {
    const candidates = [
      difference(a, b),
      difference(expandAst(a, table, { builtins: false }), expandAst(b, table, { builtins: false })),
      difference(expandAst(a, table), expandAst(b, table)),
    ];
    try {
      const pool = options.pool ?? getSymbolicPool();
      const result = await pool.isZero(candidates, options.timeoutMs === undefined ? {} : { timeoutMs: options.timeoutMs });
      if (result.zero) {
        // A CAS may simplify sqrt(x^2) to x; values at physical points have the last word.
        if (numeric.equal || numeric.maxRelativeDifference === undefined) {
          return { equal: true, method: "symbolic", message: "the difference simplifies to 0 symbolically" };
        }
        return { ...numeric, message: `${numeric.message} (although the CAS simplified the difference to 0)`, symbolic: "not_shown" };
      }
      symbolic = "not_shown";
    } catch (err) {
      if (!(err instanceof SymbolicError)) throw err;
      symbolic = err.code === "timeout" ? "timeout" : "failed";
    }
  }
  return { ...numeric, symbolic };
}

function numericComparison(a: Node, b: Node, table: SymbolTable, options: CompareOptions): BetaComparison {
  const tolerance = options.tolerance ?? 1e-10;
  const ea = expandAst(a, table);
  const eb = expandAst(b, table);
  const used = new Set([...collectSymbols(ea).keys(), ...collectSymbols(eb).keys()]);
  const args = table.primitives.filter((p) => used.has(p));
  const fa = compileAst(ea, args);
  const fb = compileAst(eb, args);
  const rng = createRandom(options.seed ?? 90210);
  let points = 0;
  let worst = 0;
  let worstAt = "";
  for (let attempt = 0; attempt < MAX_ATTEMPTS && points < POINTS; attempt += 1) {
    const pt = samplePoint(args, table, rng);
    const x = fa(pt);
    const y = fb(pt);
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    points += 1;
    const scale = Math.max(Math.abs(x), Math.abs(y));
    const rel = scale === 0 ? 0 : Math.abs(x - y) / scale;
    if (rel > worst) {
      worst = rel;
      worstAt = `${describePoint(args, pt)}: ${x.toPrecision(8)} vs ${y.toPrecision(8)}`;
    }
  }
  if (points < 3) {
    return {
      equal: false,
      method: "numeric",
      points,
      message: "the two expressions could not be evaluated at enough sample points to compare them",
    };
  }
  if (worst <= tolerance) {
    return {
      equal: true,
      method: "numeric",
      points,
      maxRelativeDifference: worst,
      message: `the expressions agree at ${points} random points (largest relative difference ${worst.toExponential(2)})`,
    };
  }
  return {
    equal: false,
    method: "numeric",
    points,
    maxRelativeDifference: worst,
    message: `the expressions differ: relative difference ${worst.toExponential(2)} at ${worstAt}`,
  };
}
