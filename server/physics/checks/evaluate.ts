import { collectSymbols, type Node } from "../expr/ast.ts";
import { compileAst } from "../expr/compile.ts";
import { expandAst, type SymbolTable } from "../expr/symbols.ts";

/** An expression rewritten in primitive symbols and compiled, with what the checks need to vary. */
export interface Prepared {
  readonly expanded: Node;
  /** Primitive symbols the expression uses, in a fixed order. */
  readonly args: readonly string[];
  /** Length dimension of each arg. */
  readonly dims: readonly number[];
  /** Indices of the args that are theory couplings. */
  readonly couplingIndices: readonly number[];
  readonly f: (values: ArrayLike<number>) => number;
}

export function prepare(ast: Node, table: SymbolTable): Prepared {
  const expanded = expandAst(ast, table);
  const used = new Set(collectSymbols(expanded).keys());
  const args = table.primitives.filter((p) => used.has(p));
  const dims = args.map((a) => table.get(a)?.dimension ?? 0);
  const couplings = new Set(table.couplings);
  const couplingIndices = args.flatMap((a, k) => (couplings.has(a) ? [k] : []));
  return { expanded, args, dims, couplingIndices, f: compileAst(expanded, args) };
}
