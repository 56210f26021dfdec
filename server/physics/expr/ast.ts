import { ExpressionError, showToken } from "./errors.ts";
import { MAX_EXPRESSION_LENGTH, tokenize, type Token } from "./tokenize.ts";

export const FUNCTIONS = ["sqrt", "exp", "log", "abs", "sin", "cos"] as const;
export type FunctionName = (typeof FUNCTIONS)[number];
export const CONSTANTS = ["pi"] as const;

export const MAX_NESTING = 64;
/** Bound on tree depth (brackets, powers, unary signs): every walker below recurses. */
export const MAX_AST_DEPTH = 256;

/**
 * Sums and products are n-ary so that a long polynomial is a wide, shallow tree; `neg` / `div`
 * flags carry subtraction and division.
 */
export type Node =
  | { readonly kind: "num"; readonly value: number; readonly text: string; readonly pos: number }
  | { readonly kind: "sym"; readonly name: string; readonly pos: number }
  | { readonly kind: "const"; readonly name: "pi"; readonly pos: number }
  | { readonly kind: "neg"; readonly arg: Node; readonly pos: number }
  | { readonly kind: "add"; readonly terms: readonly Term[]; readonly pos: number }
  | { readonly kind: "mul"; readonly factors: readonly Factor[]; readonly pos: number }
  | { readonly kind: "pow"; readonly base: Node; readonly exp: Node; readonly pos: number }
  | { readonly kind: "call"; readonly fn: FunctionName; readonly arg: Node; readonly pos: number };

export interface Term {
  readonly neg: boolean;
  readonly node: Node;
}
export interface Factor {
  readonly div: boolean;
  readonly node: Node;
}

export const isFunctionName = (name: string): name is FunctionName =>
  (FUNCTIONS as readonly string[]).includes(name);

/** Names that must never become symbols: JS prototype members and non-letter starts. */
const PROTOTYPE_NAMES = new Set<string>([
  ...Object.getOwnPropertyNames(Object.prototype),
  ...Object.getOwnPropertyNames(Function.prototype),
  ...Object.getOwnPropertyNames(Array.prototype),
  "prototype",
  "__proto__",
  "constructor",
  "caller",
  "callee",
  "arguments",
]);

export function isForbiddenName(name: string): boolean {
  return PROTOTYPE_NAMES.has(name) || name.startsWith("_");
}

export function forbiddenNameError(name: string, pos: number): ExpressionError {
  const why = name.startsWith("_") ? "names must start with a letter" : "it is a reserved JavaScript name";
  return new ExpressionError(
    "forbidden_symbol",
    `symbol "${showToken(name)}" at position ${pos} is not allowed: ${why}`,
    name,
    pos,
  );
}

export interface ParseLimits {
  readonly maxLength: number;
  readonly maxNesting: number;
  readonly maxDepth: number;
}

/** Limits for what a person types. */
export const INPUT_LIMITS: ParseLimits = {
  maxLength: MAX_EXPRESSION_LENGTH,
  maxNesting: MAX_NESTING,
  maxDepth: MAX_AST_DEPTH,
};

/**
 * Limits for text the server derived from guarded input (definition expansion): longer, but
 * still bounded so that every recursive walker stays far from the stack limit.
 */
export const DERIVED_LIMITS: ParseLimits = { maxLength: 100_000, maxNesting: 512, maxDepth: 1024 };

/** Tokenizes, checks brackets, and parses into an AST. Symbols are not checked here (see guard.ts). */
export function parse(source: string, limits: ParseLimits = INPUT_LIMITS): Node {
  const tokens = tokenize(source, limits.maxLength);
  if (tokens.length === 0) {
    throw new ExpressionError("empty", "expression is empty", "", 0);
  }
  checkBrackets(tokens, limits.maxNesting);
  const parser = new Parser(tokens, source.length, limits.maxDepth);
  return parser.parseAll();
}

function checkBrackets(tokens: readonly Token[], maxNesting: number): void {
  const open: Token[] = [];
  for (const t of tokens) {
    if (t.kind === "lparen") {
      open.push(t);
      if (open.length > maxNesting) {
        throw new ExpressionError(
          "too_deep",
          `brackets nest deeper than ${maxNesting} levels at position ${t.pos}`,
          "(",
          t.pos,
        );
      }
    } else if (t.kind === "rparen") {
      if (open.pop() === undefined) {
        throw new ExpressionError(
          "unbalanced",
          `unmatched ")" at position ${t.pos}`,
          ")",
          t.pos,
        );
      }
    }
  }
  const last = open[open.length - 1];
  if (last !== undefined) {
    throw new ExpressionError(
      "unbalanced",
      `"(" at position ${last.pos} is never closed`,
      "(",
      last.pos,
    );
  }
}

const startsOperand = (t: Token | undefined): boolean =>
  t !== undefined && (t.kind === "number" || t.kind === "ident" || t.kind === "lparen");

class Parser {
  private i = 0;
  constructor(
    private readonly tokens: readonly Token[],
    private readonly length: number,
    private readonly maxDepth: number,
  ) {}

  parseAll(): Node {
    const node = this.parseSum(0);
    const t = this.peek();
    if (t !== undefined) throw this.unexpected(t);
    return node;
  }

  private peek(): Token | undefined {
    return this.tokens[this.i];
  }

  private isOp(op: string): boolean {
    const t = this.peek();
    return t !== undefined && t.kind === "op" && t.text === op;
  }

  private depthGuard(depth: number, pos: number): void {
    if (depth > this.maxDepth) {
      throw new ExpressionError(
        "too_deep",
        `expression nests deeper than ${this.maxDepth} levels (powers, signs and brackets) at position ${pos}`,
        "",
        pos,
      );
    }
  }

  private parseSum(depth: number): Node {
    const first = this.parseProduct(depth);
    if (!this.isOp("+") && !this.isOp("-")) return first;
    const terms: Term[] = [{ neg: false, node: first }];
    while (this.isOp("+") || this.isOp("-")) {
      const op = this.tokens[this.i++] as Token;
      terms.push({ neg: op.text === "-", node: this.parseProduct(depth) });
    }
    return { kind: "add", terms, pos: first.pos };
  }

  private parseProduct(depth: number): Node {
    const first = this.parseUnary(depth);
    if (!this.isOp("*") && !this.isOp("/")) return first;
    const factors: Factor[] = [{ div: false, node: first }];
    while (this.isOp("*") || this.isOp("/")) {
      const op = this.tokens[this.i++] as Token;
      factors.push({ div: op.text === "/", node: this.parseUnary(depth) });
    }
    return { kind: "mul", factors, pos: first.pos };
  }

  private parseUnary(depth: number): Node {
    const t = this.peek();
    if (t !== undefined && t.kind === "op" && (t.text === "-" || t.text === "+")) {
      this.depthGuard(depth + 1, t.pos);
      this.i += 1;
      const arg = this.parseUnary(depth + 1);
      return t.text === "-" ? { kind: "neg", arg, pos: t.pos } : arg;
    }
    return this.parsePower(depth);
  }

  private parsePower(depth: number): Node {
    const base = this.parsePrimary(depth);
    const t = this.peek();
    if (t !== undefined && t.kind === "op" && t.text === "^") {
      this.depthGuard(depth + 1, t.pos);
      this.i += 1;
      // Right-associative, and the exponent may carry a sign: 2^-3, a^b^c = a^(b^c).
      const exp = this.parseUnary(depth + 1);
      return { kind: "pow", base, exp, pos: t.pos };
    }
    return base;
  }

  private parsePrimary(depth: number): Node {
    const t = this.peek();
    if (t === undefined) {
      throw new ExpressionError("syntax", `expression ends early at position ${this.length}: an operand is missing`, "", this.length);
    }
    this.depthGuard(depth, t.pos);
    if (t.kind === "number") {
      this.i += 1;
      const value = Number(t.text);
      if (!Number.isFinite(value) || (value === 0 && /[1-9]/.test(t.text.split(/[eE]/)[0] ?? ""))) {
        throw new ExpressionError(
          "syntax",
          `number "${showToken(t.text)}" at position ${t.pos} is outside the double-precision range`,
          t.text,
          t.pos,
        );
      }
      return { kind: "num", value, text: t.text, pos: t.pos };
    }
    if (t.kind === "lparen") {
      this.i += 1;
      const inner = this.parseSum(depth + 1);
      this.expectClose(t);
      return inner;
    }
    if (t.kind === "ident") {
      this.i += 1;
      return this.parseName(t, depth);
    }
    throw this.unexpected(t);
  }

  private parseName(t: Token, depth: number): Node {
    const name = t.text;
    if (isForbiddenName(name)) throw forbiddenNameError(name, t.pos);
    const next = this.peek();
    const called = next !== undefined && next.kind === "lparen";
    if (isFunctionName(name)) {
      if (!called) {
        throw new ExpressionError(
          "syntax",
          `function "${name}" at position ${t.pos} must be followed by its argument in brackets, e.g. ${name}(x)`,
          name,
          t.pos,
        );
      }
      this.i += 1;
      const arg = this.parseSum(depth + 1);
      const after = this.peek();
      if (after !== undefined && after.kind === "comma") {
        throw new ExpressionError(
          "syntax",
          `function "${name}" takes one argument; unexpected "," at position ${after.pos}`,
          ",",
          after.pos,
        );
      }
      this.expectClose(next);
      return { kind: "call", fn: name, arg, pos: t.pos };
    }
    if (called) {
      if (name === "pi") {
        throw new ExpressionError(
          "syntax",
          `"pi" at position ${t.pos} is a constant, not a function: write pi*(...)`,
          name,
          t.pos,
        );
      }
      throw new ExpressionError(
        "unknown_function",
        `unknown function "${showToken(name)}" at position ${t.pos}; allowed functions: ${FUNCTIONS.join(", ")} (write ${showToken(name)}*(...) for a product)`,
        name,
        t.pos,
      );
    }
    if (name === "pi") return { kind: "const", name: "pi", pos: t.pos };
    return { kind: "sym", name, pos: t.pos };
  }

  private expectClose(open: Token): void {
    const t = this.peek();
    if (t !== undefined && t.kind === "rparen") {
      this.i += 1;
      return;
    }
    if (t === undefined) {
      throw new ExpressionError("unbalanced", `"(" at position ${open.pos} is never closed`, "(", open.pos);
    }
    throw this.unexpected(t);
  }

  private unexpected(t: Token): ExpressionError {
    const prev = this.tokens[this.i - 1];
    if (startsOperand(t) && prev !== undefined && (prev.kind === "number" || prev.kind === "ident" || prev.kind === "rparen")) {
      return new ExpressionError(
        "syntax",
        `missing operator between "${showToken(prev.text)}" and "${showToken(t.text)}" at position ${t.pos}: products need an explicit "*"`,
        t.text,
        t.pos,
      );
    }
    if (t.kind === "comma") {
      return new ExpressionError("syntax", `unexpected "," at position ${t.pos}`, ",", t.pos);
    }
    if (t.kind === "rparen") {
      return new ExpressionError("syntax", `unexpected ")" at position ${t.pos}: an operand is missing`, ")", t.pos);
    }
    return new ExpressionError(
      "syntax",
      `unexpected "${showToken(t.text)}" at position ${t.pos}`,
      t.text,
      t.pos,
    );
  }
}

/** Depth of a tree, iterative so that it is safe on any input. */
export function astDepth(root: Node): number {
  let max = 0;
  const stack: Array<[Node, number]> = [[root, 1]];
  while (stack.length > 0) {
    const [n, d] = stack.pop() as [Node, number];
    if (d > max) max = d;
    for (const c of children(n)) stack.push([c, d + 1]);
  }
  return max;
}

export function children(n: Node): Node[] {
  switch (n.kind) {
    case "num":
    case "sym":
    case "const":
      return [];
    case "neg":
    case "call":
      return [n.arg];
    case "add":
      return n.terms.map((t) => t.node);
    case "mul":
      return n.factors.map((f) => f.node);
    case "pow":
      return [n.base, n.exp];
  }
}

/** Symbols in order of first appearance, with the position of that appearance. */
export function collectSymbols(root: Node): Map<string, number> {
  const found = new Map<string, number>();
  const stack: Node[] = [root];
  const order: Array<{ name: string; pos: number }> = [];
  while (stack.length > 0) {
    const n = stack.pop() as Node;
    if (n.kind === "sym") order.push({ name: n.name, pos: n.pos });
    const cs = children(n);
    for (let k = cs.length - 1; k >= 0; k -= 1) stack.push(cs[k] as Node);
  }
  order.sort((a, b) => a.pos - b.pos);
  for (const { name, pos } of order) if (!found.has(name)) found.set(name, pos);
  return found;
}
