import { DERIVED_LIMITS, isForbiddenName, isFunctionName, parse, type Node } from "./ast.ts";
import { inferAstDimension } from "./dimension.ts";
import { ExpressionError, isExpressionError, showToken } from "./errors.ts";
import { guardExpression } from "./guard.ts";
import { printExpression } from "./print.ts";

export { formatDimension, inferAstDimension, inferDimension, type DimensionResult } from "./dimension.ts";

/**
 * Symbols carry a dimension in geometric units (G = c = 1): the power of length. A mass m stands
 * for G m / c^2, so m1 has dimension 1; spins, eta and beta have dimension 0.
 */
export type SymbolKind = "primitive" | "derived" | "coupling" | "definition";

export interface SymbolInfo {
  readonly name: string;
  readonly kind: SymbolKind;
  /** Power of length; null when a definition has no single dimension (inhomogeneous). */
  readonly dimension: number | null;
  readonly description: string;
  /** For derived symbols and definitions: the defining expression. */
  readonly expression?: string;
  readonly ast?: Node;
}

export interface CouplingDeclaration {
  readonly symbol: string;
  readonly dimension: number;
  readonly description?: string;
  /** Where GR lies: the coupling's value at which every deviation must vanish (checked by gr_limit). */
  readonly gr_value?: "zero" | "infinity";
  /** Physical range of the coupling (informational for the checks; the translator uses it). */
  readonly range?: "positive" | "non_negative" | "any_sign";
}

export interface DefinitionDeclaration {
  readonly symbol: string;
  readonly expression: string;
}

export interface SymbolTableInput {
  readonly couplings?: readonly CouplingDeclaration[];
  readonly definitions?: readonly DefinitionDeclaration[];
}

export interface SymbolTable {
  readonly symbols: ReadonlyMap<string, SymbolInfo>;
  /** Every name an expression may use (for the guard). */
  readonly names: ReadonlySet<string>;
  /** Symbols that are not defined in terms of others: masses, spins, charges, z, distances, couplings. */
  readonly primitives: readonly string[];
  readonly couplings: readonly string[];
  /** User definitions, each after the ones it uses. */
  readonly definitions: readonly string[];
  get(name: string): SymbolInfo | undefined;
  /**
   * Node count of each derived symbol and definition once every definition in it is substituted
   * (computed arithmetically from the definitions, never by expanding them).
   */
  readonly expandedSizes: ReadonlyMap<string, number>;
}

const PRIMITIVES: ReadonlyArray<readonly [string, number, string]> = [
  ["m1", 1, "mass of the heavier body"],
  ["m2", 1, "mass of the lighter body"],
  ["chi1", 0, "dimensionless aligned spin of body 1"],
  ["chi2", 0, "dimensionless aligned spin of body 2"],
  ["s1", 0, "scalar-charge factor of body 1"],
  ["s2", 0, "scalar-charge factor of body 2"],
  ["sigma1", 0, "scalar-tensor sensitivity of body 1"],
  ["sigma2", 0, "scalar-tensor sensitivity of body 2"],
  ["z", 0, "redshift"],
  ["D", 1, "distance"],
  ["D_0", 1, "distance measure D_0 (massive graviton)"],
  ["D_alpha", 1, "distance measure D_alpha (modified dispersion)"],
  ["Omega_m", 0, "matter density today of the flat Lambda-CDM background (distance-ratio mappings)"],
  ["f_low", -1, "lowest GW frequency of the analysis band (observed), as 1/length"],
  ["tau", 1, "time the signal spends in band above f_low, (5/256) Mc (pi Mc f)^(-8/3), as a length"],
  // Ringdown and remnant mappings: the final black hole (source frame).
  ["M_f", 1, "mass of the remnant black hole"],
  ["chi_f", 0, "dimensionless spin of the remnant black hole"],
];

const DERIVED: ReadonlyArray<readonly [string, string, string]> = [
  ["M", "m1 + m2", "total mass"],
  ["eta", "m1*m2/M^2", "symmetric mass ratio"],
  ["Mc", "eta^(3/5)*M", "chirp mass"],
  ["dm", "(m1 - m2)/M", "reduced mass difference"],
  ["q", "m2/m1", "mass ratio (<= 1)"],
  ["chi_s", "(chi1 + chi2)/2", "symmetric spin"],
  ["chi_a", "(chi1 - chi2)/2", "antisymmetric spin"],
];

export const BUILTIN_SYMBOL_NAMES: ReadonlySet<string> = new Set([
  ...PRIMITIVES.map(([n]) => n),
  ...DERIVED.map(([n]) => n),
]);

const MAX_DECLARATIONS = 50;
/**
 * Bound on a fully expanded tree (a definition, or an expression with its definitions substituted):
 * every walker, the compiler and the checks are linear in it, so it is the evaluation budget.
 */
export const MAX_EXPANDED_NODES = 20_000;
const MAX_DIMENSION = 24;

/** Builds the symbols of one request: built-ins plus the theory's couplings and definitions. */
export function createSymbolTable(input: SymbolTableInput = {}): SymbolTable {
  const couplings = input.couplings ?? [];
  const definitions = input.definitions ?? [];
  if (!Array.isArray(couplings) || !Array.isArray(definitions)) {
    throw new ExpressionError("bad_declaration", "couplings and definitions must be lists");
  }
  if (couplings.length > MAX_DECLARATIONS || definitions.length > MAX_DECLARATIONS) {
    throw new ExpressionError("bad_declaration", `at most ${MAX_DECLARATIONS} couplings and ${MAX_DECLARATIONS} definitions`);
  }
  const symbols = new Map<string, SymbolInfo>();
  for (const [name, dimension, description] of PRIMITIVES) {
    symbols.set(name, { name, kind: "primitive", dimension, description });
  }
  const couplingNames: string[] = [];
  for (const c of couplings) {
    const existing = typeof c?.symbol === "string" ? symbols.get(c.symbol) : undefined;
    if (existing !== undefined && existing.kind === "primitive" && existing.dimension === c.dimension) {
      // Declaring a built-in input again with its own dimension (e.g. sigma1 by older callers)
      // changes nothing: it stays a binary input, not a coupling that the GR limit sets to 0.
      continue;
    }
    const name = checkNewName(c?.symbol, symbols, "coupling");
    couplingNames.push(name);
    if (typeof c.dimension !== "number" || !Number.isFinite(c.dimension) || Math.abs(c.dimension) > MAX_DIMENSION) {
      throw new ExpressionError(
        "bad_declaration",
        `coupling "${name}" needs a finite dimension (a power of length between -${MAX_DIMENSION} and ${MAX_DIMENSION})`,
        name,
      );
    }
    const description = typeof c.description === "string" ? c.description.slice(0, 200) : "theory coupling";
    symbols.set(name, { name, kind: "coupling", dimension: c.dimension, description });
  }
  const defNames: string[] = [];
  for (const d of definitions) {
    defNames.push(checkNewName(d?.symbol, symbols, "definition", defNames));
  }
  const allNames = new Set<string>([...symbols.keys(), ...DERIVED.map(([n]) => n), ...defNames]);

  const parsed = new Map<string, { expression: string; ast: Node; kind: SymbolKind; description: string }>();
  for (const [name, expression, description] of DERIVED) {
    parsed.set(name, { expression, ast: parse(expression), kind: "derived", description });
  }
  definitions.forEach((d, k) => {
    const name = defNames[k] as string;
    let ast: Node;
    try {
      ast = guardExpression(d.expression, { symbols: allNames }).ast;
    } catch (err) {
      if (!isExpressionError(err)) throw err;
      throw new ExpressionError("bad_definition", `definition "${name}": ${err.message}`, err.token, err.position, name);
    }
    parsed.set(name, { expression: d.expression, ast, kind: "definition", description: `defined as ${d.expression}` });
  });

  const order = topologicalOrder(parsed);
  const sizes = new Map<string, number>();
  for (const name of order) {
    const entry = parsed.get(name);
    if (entry === undefined) continue;
    const size = treeSize(entry.ast, sizes);
    if (size > MAX_EXPANDED_NODES) {
      throw new ExpressionError(
        "bad_definition",
        `definition "${name}" expands to more than ${MAX_EXPANDED_NODES} terms; nested definitions grow too fast`,
        name,
        0,
        name,
      );
    }
    sizes.set(name, size);
    const partial = { get: (n: string) => symbols.get(n) };
    const dim = inferAstDimension(entry.ast, partial);
    symbols.set(name, {
      name,
      kind: entry.kind,
      dimension: dim.ok ? dim.dimension : null,
      description: entry.description,
      expression: entry.expression,
      ast: entry.ast,
    });
  }

  const primitives = [...PRIMITIVES.map(([n]) => n), ...couplingNames];
  const userDefinitions = order.filter((n) => parsed.get(n)?.kind === "definition");
  return {
    symbols,
    names: new Set(symbols.keys()),
    primitives,
    couplings: couplingNames,
    definitions: userDefinitions,
    get: (name) => symbols.get(name),
    expandedSizes: sizes,
  };
}

function checkNewName(
  raw: unknown,
  taken: ReadonlyMap<string, SymbolInfo>,
  what: "coupling" | "definition",
  earlier: readonly string[] = [],
): string {
  if (typeof raw !== "string" || !/^[A-Za-z][A-Za-z0-9_]{0,39}$/.test(raw)) {
    throw new ExpressionError(
      "bad_declaration",
      `${what} name "${showToken(String(raw))}" is not valid: use a letter followed by letters, digits or _ (at most 40)`,
      String(raw),
    );
  }
  if (isForbiddenName(raw) || isFunctionName(raw) || raw === "pi") {
    throw new ExpressionError("bad_declaration", `"${raw}" is a reserved name and cannot be a ${what}`, raw);
  }
  const builtin = taken.get(raw);
  if (BUILTIN_SYMBOL_NAMES.has(raw) || (builtin !== undefined && builtin.kind === "primitive")) {
    throw new ExpressionError("bad_declaration", `"${raw}" is a built-in symbol and cannot be redeclared as a ${what}`, raw);
  }
  if (taken.has(raw) || earlier.includes(raw)) {
    throw new ExpressionError("bad_declaration", `"${raw}" is declared twice`, raw);
  }
  return raw;
}

function references(ast: Node, within: ReadonlyMap<string, unknown>): string[] {
  const out: string[] = [];
  const stack: Node[] = [ast];
  while (stack.length > 0) {
    const n = stack.pop() as Node;
    if (n.kind === "sym") {
      if (within.has(n.name)) out.push(n.name);
    } else if (n.kind === "neg" || n.kind === "call") stack.push(n.arg);
    else if (n.kind === "add") for (const t of n.terms) stack.push(t.node);
    else if (n.kind === "mul") for (const f of n.factors) stack.push(f.node);
    else if (n.kind === "pow") stack.push(n.base, n.exp);
  }
  return out;
}

/** Definitions ordered so that each comes after those it uses; a cycle is an error naming it. */
function topologicalOrder(defs: ReadonlyMap<string, { ast: Node }>): string[] {
  const state = new Map<string, "visiting" | "done">();
  const order: string[] = [];
  const visit = (name: string, path: string[]): void => {
    const s = state.get(name);
    if (s === "done") return;
    if (s === "visiting") {
      const cycle = [...path.slice(path.indexOf(name)), name];
      throw new ExpressionError(
        "definition_cycle",
        `definitions refer to each other in a cycle: ${cycle.join(" -> ")}`,
        name,
        0,
        name,
      );
    }
    state.set(name, "visiting");
    const entry = defs.get(name);
    if (entry !== undefined) for (const dep of references(entry.ast, defs)) visit(dep, [...path, name]);
    state.set(name, "done");
    order.push(name);
  };
  for (const name of defs.keys()) visit(name, []);
  return order;
}

function treeSize(ast: Node, sizes: ReadonlyMap<string, number>, stopAbove = MAX_EXPANDED_NODES): number {
  let total = 0;
  const stack: Node[] = [ast];
  while (stack.length > 0) {
    const n = stack.pop() as Node;
    if (n.kind === "sym") total += sizes.get(n.name) ?? 1;
    else total += 1;
    if (n.kind === "neg" || n.kind === "call") stack.push(n.arg);
    else if (n.kind === "add") for (const t of n.terms) stack.push(t.node);
    else if (n.kind === "mul") for (const f of n.factors) stack.push(f.node);
    else if (n.kind === "pow") stack.push(n.base, n.exp);
    if (total > stopAbove) return total;
  }
  return total;
}

/**
 * How many nodes `ast` has once every definition (and built-in derived symbol) is substituted:
 * the size of the tree the checks and the compiler will walk. Linear in `ast`, whatever the
 * definitions expand to, because each definition's size is known from the table.
 */
export function substitutedSize(ast: Node, table: SymbolTable): number {
  return treeSize(ast, table.expandedSizes, Number.POSITIVE_INFINITY);
}

/** An expression over the evaluation budget; `field` is where it sits in the request ("expression", "derivation.flux.coefficient"). */
export class ExpressionBudgetError extends ExpressionError {
  constructor(
    readonly field: string,
    readonly size: number,
    readonly cap: number,
  ) {
    super("too_large", budgetMessage(field, size, cap), "", 0);
  }
}

export function budgetMessage(field: string, size: number, cap: number): string {
  return `${field} is too large to evaluate: with its definitions substituted it has ${size} nodes, over the limit of ${cap}`;
}

/** Refuses, before any work, an expression whose substituted tree is over MAX_EXPANDED_NODES. */
export function assertWithinBudget(ast: Node, table: SymbolTable, field = "expression"): void {
  const size = substitutedSize(ast, table);
  if (size > MAX_EXPANDED_NODES) throw new ExpressionBudgetError(field, size, MAX_EXPANDED_NODES);
}

export interface ExpandOptions {
  /** Also replace the built-in derived symbols (M, eta, Mc, ...) by masses and spins. Default true. */
  readonly builtins?: boolean;
  /** Also replace user definitions. Default true. */
  readonly definitions?: boolean;
}

/** Replaces defined symbols by their definitions, recursively. */
export function expandAst(ast: Node, table: SymbolTable, options: ExpandOptions = {}): Node {
  // The expansion itself shares sub-trees, but everything after it walks the tree: refuse first.
  assertWithinBudget(ast, table);
  const expandBuiltins = options.builtins ?? true;
  const expandUser = options.definitions ?? true;
  const memo = new Map<string, Node>();
  const shouldExpand = (info: SymbolInfo | undefined): boolean =>
    info !== undefined && info.ast !== undefined && ((info.kind === "derived" && expandBuiltins) || (info.kind === "definition" && expandUser));
  const walk = (n: Node): Node => {
    switch (n.kind) {
      case "num":
      case "const":
        return n;
      case "sym": {
        const info = table.get(n.name);
        if (!shouldExpand(info)) return n;
        const hit = memo.get(n.name);
        if (hit !== undefined) return hit;
        const expanded = walk((info as SymbolInfo).ast as Node);
        memo.set(n.name, expanded);
        return expanded;
      }
      case "neg":
        return { ...n, arg: walk(n.arg) };
      case "call":
        return { ...n, arg: walk(n.arg) };
      case "add":
        return { ...n, terms: n.terms.map((t) => ({ neg: t.neg, node: walk(t.node) })) };
      case "mul":
        return { ...n, factors: n.factors.map((f) => ({ div: f.div, node: walk(f.node) })) };
      case "pow":
        return { ...n, base: walk(n.base), exp: walk(n.exp) };
    }
  };
  return walk(ast);
}

/**
 * An expression rewritten in primitive symbols only (masses, spins, charges, z, distances,
 * couplings), ready for compileExpression with table.primitives (or any superset of its symbols).
 */
export function expandDefinitions(expression: string, table: SymbolTable): string {
  const guarded = guardExpression(expression, { symbols: table.names });
  const text = printExpression(expandAst(guarded.ast, table));
  if (text.length > DERIVED_LIMITS.maxLength) {
    throw new ExpressionError("too_large", `the expression is too large once definitions are expanded (${text.length} characters)`);
  }
  return text;
}
