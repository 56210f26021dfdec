import { DERIVED_LIMITS, isForbiddenName, isFunctionName, type Node } from "./ast.ts";
import { ExpressionError } from "./errors.ts";
import { guardExpression } from "./guard.ts";

/**
 * The only names generated code can reach: it is created with `new Function("M", ...)` and every
 * reference it makes is `M.<name>` or a local. Symbols never appear as identifiers in the code;
 * they are read by index.
 */
const MATH = Object.freeze({
  pow: Math.pow,
  sqrt: Math.sqrt,
  exp: Math.exp,
  log: Math.log,
  abs: Math.abs,
  sin: Math.sin,
  cos: Math.cos,
});

type Operand = { readonly code: string; readonly value?: number };

/** Straight-line code for one expression: shared sub-expressions are computed once. */
interface Program {
  readonly statements: readonly string[];
  readonly result: string;
}

/**
 * Compiles a guarded expression in the symbols `args` to a plain function of a value array
 * (values[k] is the value of args[k]). Exact JS semantics: exp(50) is e^50, 1/0 is Infinity, the
 * square root of a negative number is NaN.
 */
export function compileExpression(
  expression: string,
  args: readonly string[],
): (values: ArrayLike<number>) => number {
  return compileAst(guardForCompile(expression, args), args);
}

/**
 * Same expression evaluated over columns: columns[k][i] is args[k] at sample i. One tight loop,
 * writing into `out` when given (it must be at least as long as the columns).
 */
export function compileVectorized(
  expression: string,
  args: readonly string[],
): (columns: readonly Float64Array[], out?: Float64Array) => Float64Array {
  return compileAstVectorized(guardForCompile(expression, args), args);
}

function guardForCompile(expression: string, args: readonly string[]): Node {
  checkArgs(args);
  return guardExpression(expression, { symbols: args, limits: DERIVED_LIMITS }).ast;
}

function checkArgs(args: readonly string[]): void {
  const seen = new Set<string>();
  for (const a of args) {
    if (typeof a !== "string" || !/^[A-Za-z][A-Za-z0-9_]*$/.test(a) || isForbiddenName(a) || isFunctionName(a) || a === "pi") {
      throw new ExpressionError("bad_declaration", `"${String(a)}" cannot be used as an argument name`, String(a), 0);
    }
    if (seen.has(a)) {
      throw new ExpressionError("bad_declaration", `argument "${a}" is listed twice`, a, 0);
    }
    seen.add(a);
  }
}

/** Compiles an AST already checked against `args` (the checks use this on expanded trees). */
export function compileAst(ast: Node, args: readonly string[]): (values: ArrayLike<number>) => number {
  const program = generate(ast, args);
  const loads = args.map((_, k) => `a${k} = +v[${k}]`);
  const body = [
    '"use strict";',
    "return function compiled(v) {",
    loads.length > 0 ? `  const ${loads.join(", ")};` : "",
    ...program.statements.map((s) => `  ${s}`),
    `  return ${program.result};`,
    "};",
  ].join("\n");
  const inner = new Function("M", body)(MATH) as (v: ArrayLike<number>) => number;
  const n = args.length;
  return (values) => {
    if (values.length < n) {
      throw new RangeError(`expected ${n} values (${args.join(", ")}), got ${values.length}`);
    }
    return inner(values);
  };
}

export function compileAstVectorized(
  ast: Node,
  args: readonly string[],
): (columns: readonly Float64Array[], out?: Float64Array) => Float64Array {
  const program = generate(ast, args);
  const params = ["o", "n", ...args.map((_, k) => `c${k}`)];
  const loads = args.map((_, k) => `a${k} = c${k}[i]`);
  const body = [
    '"use strict";',
    `return function compiledColumns(${params.join(", ")}) {`,
    "  for (let i = 0; i < n; i++) {",
    loads.length > 0 ? `    const ${loads.join(", ")};` : "",
    ...program.statements.map((s) => `    ${s}`),
    `    o[i] = ${program.result};`,
    "  }",
    "};",
  ].join("\n");
  const inner = new Function("M", body)(MATH) as (o: Float64Array, n: number, ...cols: Float64Array[]) => void;
  const nargs = args.length;
  return (columns, out) => {
    if (columns.length !== nargs) {
      throw new RangeError(`expected ${nargs} columns (${args.join(", ")}), got ${columns.length}`);
    }
    const n = columns.length > 0 ? (columns[0] as Float64Array).length : (out?.length ?? 1);
    for (let k = 0; k < nargs; k += 1) {
      const col = columns[k];
      if (!(col instanceof Float64Array) || col.length !== n) {
        throw new RangeError(`column ${k} (${args[k]}) must be a Float64Array of length ${n}`);
      }
    }
    const o = out ?? new Float64Array(n);
    if (o.length < n) throw new RangeError(`output has length ${o.length}, needs ${n}`);
    inner(o, n, ...columns);
    return o;
  };
}

function generate(ast: Node, args: readonly string[]): Program {
  const index = new Map<string, number>();
  args.forEach((a, k) => index.set(a, k));
  const g = new Generator(index);
  const result = g.emit(ast);
  return { statements: g.statements, result: result.code };
}

/** A double as JS source text that reproduces it exactly, without naming any global. */
function literal(value: number): string {
  if (Number.isNaN(value)) return "(0/0)";
  if (value === Infinity) return "(1/0)";
  if (value === -Infinity) return "(-1/0)";
  if (Object.is(value, -0)) return "(-0)";
  return value < 0 ? `(${String(value)})` : String(value);
}

const constant = (value: number): Operand => ({ code: literal(value), value });

class Generator {
  readonly statements: string[] = [];
  private readonly cache = new Map<string, string>();

  constructor(private readonly index: ReadonlyMap<string, number>) {}

  emit(n: Node): Operand {
    switch (n.kind) {
      case "num":
        return constant(n.value);
      case "const":
        return constant(Math.PI);
      case "sym": {
        const k = this.index.get(n.name);
        if (k === undefined) throw new ExpressionError("undeclared_symbol", `unknown symbol "${n.name}"`, n.name, n.pos);
        return { code: `a${k}` };
      }
      case "neg": {
        const a = this.emit(n.arg);
        if (a.value !== undefined) return constant(-a.value);
        return this.temp(`-${a.code}`);
      }
      case "call": {
        const a = this.emit(n.arg);
        if (a.value !== undefined) return constant(MATH[n.fn](a.value));
        return this.temp(`M.${n.fn}(${a.code})`);
      }
      case "add": {
        const parts = n.terms.map((t) => ({ neg: t.neg, op: this.emit(t.node) }));
        if (parts.every((p) => p.op.value !== undefined)) {
          let acc = 0;
          parts.forEach((p, k) => {
            const v = p.op.value as number;
            acc = k === 0 ? (p.neg ? -v : v) : p.neg ? acc - v : acc + v;
          });
          return constant(acc);
        }
        const code = parts
          .map((p, k) => (k === 0 ? (p.neg ? `-${p.op.code}` : p.op.code) : `${p.neg ? " - " : " + "}${p.op.code}`))
          .join("");
        return this.temp(code);
      }
      case "mul": {
        const parts = n.factors.map((f) => ({ div: f.div, op: this.emit(f.node) }));
        if (parts.every((p) => p.op.value !== undefined)) {
          let acc = 1;
          parts.forEach((p, k) => {
            const v = p.op.value as number;
            acc = k === 0 ? (p.div ? 1 / v : v) : p.div ? acc / v : acc * v;
          });
          return constant(acc);
        }
        const code = parts
          .map((p, k) => (k === 0 ? (p.div ? `1 / ${p.op.code}` : p.op.code) : `${p.div ? " / " : " * "}${p.op.code}`))
          .join("");
        return this.temp(code);
      }
      case "pow":
        return this.power(this.emit(n.base), this.emit(n.exp));
    }
  }

  private power(base: Operand, exp: Operand): Operand {
    if (base.value !== undefined && exp.value !== undefined) return constant(Math.pow(base.value, exp.value));
    if (exp.value === undefined) return this.temp(`M.pow(${base.code}, ${exp.code})`);
    const e = exp.value;
    if (e === 1) return base;
    if (e === 0.5) return this.temp(`M.sqrt(${base.code})`);
    if (e === -0.5) return this.temp(`1 / M.sqrt(${base.code})`);
    if (Number.isInteger(e) && Math.abs(e) <= 8 && e !== 0) {
      // Small integer powers by repeated squaring: several times faster than Math.pow.
      let result: Operand | undefined;
      let square = base;
      let k = Math.abs(e);
      while (k > 0) {
        if (k & 1) result = result === undefined ? square : this.temp(`${result.code} * ${square.code}`);
        k >>= 1;
        if (k > 0) square = this.temp(`${square.code} * ${square.code}`);
      }
      const r = result as Operand;
      return e < 0 ? this.temp(`1 / ${r.code}`) : r;
    }
    if (Number.isInteger(e)) return this.temp(`M.pow(${base.code}, ${literal(e)})`);
    // A non-integer constant power only exists for base >= 0 (NaN otherwise, as with Math.pow).
    // V8's Math.pow costs ~70 ns there; exp(e*log(x)) costs ~33 ns and stays within ~2e-13
    // relative over the whole double range (the error is |e log x| ulps, and |e log x| < 710
    // wherever the result is finite and non-zero). 0, Infinity and NaN come out as with Math.pow.
    return this.temp(`M.exp(${literal(e)} * M.log(${base.code}))`);
  }

  /** Names a computed value, reusing an earlier identical computation. */
  private temp(code: string): Operand {
    const hit = this.cache.get(code);
    if (hit !== undefined) return { code: hit };
    const name = `t${this.cache.size}`;
    this.cache.set(code, name);
    this.statements.push(`const ${name} = ${code};`);
    return { code: name };
  }
}
