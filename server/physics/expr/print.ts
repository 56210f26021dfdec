import type { Node } from "./ast.ts";

export interface PrintOptions {
  /** Rename symbols on output (e.g. to neutral names before a CAS sees them). */
  readonly rename?: (name: string) => string;
  /** Print numbers as exact rationals (p/q) instead of their source text. */
  readonly exactNumbers?: boolean;
  /** Parenthesize every compound sub-expression (for a CAS whose precedence we do not control). */
  readonly fullParens?: boolean;
}

/** Prints an AST back to the infix syntax the guard accepts; parse(print(ast)) gives the same tree. */
export function printExpression(node: Node, options: PrintOptions = {}): string {
  return new Printer(options).print(node);
}

const isCompound = (n: Node): boolean =>
  n.kind === "add" || n.kind === "mul" || n.kind === "neg" || n.kind === "pow";

class Printer {
  constructor(private readonly options: PrintOptions) {}

  print(n: Node): string {
    switch (n.kind) {
      case "num":
        return this.number(n.value, n.text);
      case "sym":
        return this.options.rename ? this.options.rename(n.name) : n.name;
      case "const":
        return "pi";
      case "call":
        return `${n.fn}(${this.print(n.arg)})`;
      case "neg": {
        const wrap = n.arg.kind === "add" || n.arg.kind === "mul" || n.arg.kind === "neg" || this.full(n.arg);
        return `-${this.wrapIf(n.arg, wrap)}`;
      }
      case "add":
        return n.terms
          .map((t, k) => {
            const wrap = t.node.kind === "add" || (k > 0 && t.node.kind === "neg") || this.full(t.node);
            const body = this.wrapIf(t.node, wrap);
            if (k === 0 && t.neg) {
              const k0 = t.node.kind;
              return `-${this.wrapIf(t.node, wrap || k0 === "add" || k0 === "mul" || k0 === "neg")}`;
            }
            if (k === 0) return body;
            return `${t.neg ? "-" : "+"}${body}`;
          })
          .join("");
      case "mul":
        return n.factors
          .map((f, k) => {
            const wrap =
              f.node.kind === "add" ||
              f.node.kind === "mul" ||
              (k > 0 && f.node.kind === "neg") ||
              this.full(f.node);
            const body = this.wrapIf(f.node, wrap);
            if (k === 0) return f.div ? `1/${body}` : body;
            return `${f.div ? "/" : "*"}${body}`;
          })
          .join("");
      case "pow": {
        const base = this.wrapIf(n.base, isCompound(n.base) || (n.base.kind === "num" && n.base.value < 0));
        const expWrap = n.exp.kind === "add" || n.exp.kind === "mul" || n.exp.kind === "neg" || this.full(n.exp);
        return `${base}^${this.wrapIf(n.exp, expWrap)}`;
      }
    }
  }

  private full(n: Node): boolean {
    return this.options.fullParens === true && isCompound(n);
  }

  private wrapIf(n: Node, wrap: boolean): string {
    const s = this.print(n);
    return wrap ? `(${s})` : s;
  }

  private number(value: number, text: string): string {
    if (this.options.exactNumbers) return exactDecimal(text, value);
    if (text !== "") return text;
    return formatNumber(value);
  }
}

/** Shortest round-trip text of a double in the guard's syntax (no "Infinity", no "1e+21"). */
export function formatNumber(value: number): string {
  const s = String(value);
  return s.replace("e+", "e");
}

/**
 * The exact rational written by a decimal literal: "1.5e-3" -> "(15/10000)". Numbers that only
 * exist as doubles (no source text) use their shortest decimal form.
 */
export function exactDecimal(text: string, value: number): string {
  const src = text !== "" ? text : formatNumber(Math.abs(value));
  const m = /^(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(src);
  if (m === null) return `(${src})`;
  const intPart = m[1] ?? "";
  const frac = m[2] ?? "";
  const exp = Number(m[3] ?? "0") - frac.length;
  const digits = (intPart + frac).replace(/^0+(?=\d)/, "") || "0";
  const sign = text === "" && value < 0 ? "-" : "";
  if (digits === "0") return "0";
  let out: string;
  if (exp >= 0) out = exp <= 30 ? digits + "0".repeat(exp) : `${digits}*10^${exp}`;
  else out = -exp <= 30 ? `${digits}/1${"0".repeat(-exp)}` : `${digits}/10^${-exp}`;
  return sign === "" && exp === 0 ? out : `(${sign}${out})`;
}
