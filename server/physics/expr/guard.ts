import { collectSymbols, INPUT_LIMITS, parse, type Node, type ParseLimits } from "./ast.ts";
import { ExpressionError, showToken } from "./errors.ts";

export interface GuardOptions {
  /**
   * The declared symbols. When omitted only the syntax is checked (used by the `parse` check, which
   * reports undeclared symbols separately).
   */
  readonly symbols?: ReadonlySet<string> | readonly string[];
  /** Size limits; the defaults are the ones for typed input. */
  readonly limits?: ParseLimits;
}

export interface GuardedExpression {
  readonly source: string;
  readonly ast: Node;
  /** Every symbol used, with the position of its first use. */
  readonly symbols: ReadonlyMap<string, number>;
}

/**
 * The front door: nothing reaches the compiler, the CAS workers or the LaTeX printer without
 * passing here. Throws ExpressionError naming the offending token and its position.
 */
export function guardExpression(source: string, options: GuardOptions = {}): GuardedExpression {
  const ast = parse(source, options.limits ?? INPUT_LIMITS);
  const symbols = collectSymbols(ast);
  if (options.symbols !== undefined) {
    const declared = options.symbols instanceof Set ? options.symbols : new Set(options.symbols);
    for (const [name, pos] of symbols) {
      if (!declared.has(name)) throw undeclaredSymbolError(name, pos, declared);
    }
  }
  return { source, ast, symbols };
}

export function undeclaredSymbolError(
  name: string,
  pos: number,
  declared: ReadonlySet<string>,
): ExpressionError {
  const hint = closestName(name, declared);
  return new ExpressionError(
    "undeclared_symbol",
    `unknown symbol "${showToken(name)}" at position ${pos}` +
      (hint === undefined ? "; declare it as a coupling or a definition" : ` (did you mean "${hint}"?)`),
    name,
    pos,
  );
}

/** A suggestion for typos such as "alhpa": the nearest declared name within edit distance 2. */
function closestName(name: string, declared: ReadonlySet<string>): string | undefined {
  let best: string | undefined;
  let bestDistance = 3;
  for (const candidate of declared) {
    if (Math.abs(candidate.length - name.length) >= bestDistance) continue;
    const d = editDistance(name, candidate, bestDistance);
    if (d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  return best;
}

/** Damerau (adjacent transposition) edit distance, abandoned once it reaches `cap`. */
function editDistance(a: string, b: string, cap: number): number {
  if (a.length > 64 || b.length > 64) return cap;
  const rows: number[][] = [];
  for (let i = 0; i <= a.length; i += 1) {
    const row: number[] = [i];
    for (let j = 1; j <= b.length; j += 1) {
      if (i === 0) {
        row.push(j);
        continue;
      }
      const prev = rows[i - 1] as number[];
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min((prev[j] as number) + 1, (row[j - 1] as number) + 1, (prev[j - 1] as number) + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        v = Math.min(v, ((rows[i - 2] as number[])[j - 2] as number) + 1);
      }
      row.push(v);
    }
    rows.push(row);
  }
  return (rows[a.length] as number[])[b.length] as number;
}
