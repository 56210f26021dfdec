import type { Node } from "./ast.ts";
import { guardExpression } from "./guard.ts";

/**
 * KaTeX-ready LaTeX from our own AST: deterministic, and independent of any CAS's rewriting, so
 * what the contributor typed is what the reviewer reads.
 */
export function toLatex(expression: string | Node): string {
  const ast = typeof expression === "string" ? guardExpression(expression).ast : expression;
  return latex(ast);
}

const GREEK = new Set([
  "alpha", "beta", "gamma", "delta", "epsilon", "varepsilon", "zeta", "eta", "theta", "vartheta", "iota", "kappa",
  "lambda", "mu", "nu", "xi", "rho", "sigma", "tau", "upsilon", "phi", "varphi", "chi", "psi", "omega",
  "Gamma", "Delta", "Theta", "Lambda", "Xi", "Pi", "Sigma", "Upsilon", "Phi", "Psi", "Omega",
]);

/** Names with a conventional typeset form. */
const SPECIAL: ReadonlyMap<string, string> = new Map([
  ["Mc", "\\mathcal{M}"],
  ["dm", "\\delta m"],
  ["Gdot_G", "(\\dot{G}/G)"],
  ["Mdot", "\\dot{M}"],
]);

function part(text: string): string {
  if (GREEK.has(text)) return `\\${text}`;
  if (/^\d+$/.test(text) || text.length === 1) return text;
  if (text.length > 3 && text.endsWith("dot")) return `\\dot{${part(text.slice(0, -3))}}`;
  return `\\mathrm{${text}}`;
}

/** chi1 -> \chi_{1}, chi_s -> \chi_{s}, D_alpha -> D_{\alpha}, omega_BD -> \omega_{\mathrm{BD}}. */
export function symbolLatex(name: string): string {
  const special = SPECIAL.get(name);
  if (special !== undefined) return special;
  const [rawHead = "", ...rest] = name.split("_").filter((p) => p !== "");
  const m = /^(.*?[A-Za-z])(\d+)$/.exec(rawHead);
  const head = m !== null ? (m[1] as string) : rawHead;
  const subs = [...(m !== null ? [m[2] as string] : []), ...rest];
  const base = part(head);
  return subs.length === 0 ? base : `${base}_{${subs.map(part).join(",")}}`;
}

function numberLatex(text: string): string {
  const m = /^(\d*\.?\d*)[eE]([+-]?\d+)$/.exec(text);
  if (m === null) return text;
  const mantissa = m[1] as string;
  const exp = String(Number(m[2]));
  return mantissa === "1" ? `10^{${exp}}` : `${mantissa} \\times 10^{${exp}}`;
}

const paren = (s: string): string => `\\left(${s}\\right)`;

function latex(n: Node): string {
  switch (n.kind) {
    case "num":
      return numberLatex(n.text);
    case "const":
      return "\\pi";
    case "sym":
      return symbolLatex(n.name);
    case "neg":
      return `-${n.arg.kind === "add" || n.arg.kind === "neg" ? paren(latex(n.arg)) : latex(n.arg)}`;
    case "add":
      return n.terms
        .map((t, k) => {
          const body = t.node.kind === "add" || (k > 0 && t.node.kind === "neg") ? paren(latex(t.node)) : latex(t.node);
          if (k === 0) return t.neg ? `-${t.node.kind === "mul" || t.node.kind === "pow" ? body : paren(body)}` : body;
          return `${t.neg ? " - " : " + "}${body}`;
        })
        .join("");
    case "mul":
      return productLatex(n);
    case "pow":
      return powerLatex(n.base, n.exp);
    case "call": {
      const arg = latex(n.arg);
      switch (n.fn) {
        case "sqrt":
          return `\\sqrt{${arg}}`;
        case "abs":
          return `\\left|${arg}\\right|`;
        case "log":
          return `\\ln${paren(arg)}`;
        default:
          return `\\${n.fn}${paren(arg)}`;
      }
    }
  }
}

function powerLatex(base: Node, exp: Node): string {
  const atomic = base.kind === "sym" || base.kind === "const" || (base.kind === "num" && !/[eE]/.test(base.text));
  const b = atomic && !(base.kind === "sym" && base.name === "Gdot_G") ? latex(base) : paren(latex(base));
  return `${b}^{${inlineFraction(exp) ?? latex(exp)}}`;
}

/** 18/5 -> "18/5" and -2/5 -> "-2/5": exponents read better without stacked fractions. */
function inlineFraction(n: Node): string | undefined {
  if (n.kind === "neg") {
    const inner = inlineFraction(n.arg);
    return inner === undefined ? undefined : `-${inner}`;
  }
  const isNumber = (m: Node): boolean => m.kind === "num" || (m.kind === "neg" && m.arg.kind === "num");
  if (n.kind === "mul" && n.factors.length === 2 && n.factors.every((f) => isNumber(f.node))) {
    const [a, b] = n.factors as [{ div: boolean; node: Node }, { div: boolean; node: Node }];
    if (!a.div && b.div) return `${latex(a.node)}/${latex(b.node)}`;
  }
  return undefined;
}

interface Flat {
  num: Node[];
  den: Node[];
  negative: boolean;
}

function flatten(n: Node, flat: Flat, inverted: boolean): void {
  if (n.kind === "mul") {
    for (const f of n.factors) flatten(f.node, flat, inverted !== f.div);
    return;
  }
  if (n.kind === "neg") {
    flat.negative = !flat.negative;
    flatten(n.arg, flat, inverted);
    return;
  }
  (inverted ? flat.den : flat.num).push(n);
}

function productLatex(n: Node): string {
  const flat: Flat = { num: [], den: [], negative: false };
  flatten(n, flat, false);
  const sign = flat.negative ? "-" : "";
  if (flat.den.length === 0) return sign + juxtapose(flat.num);
  const numericNum = flat.num.filter((f) => f.kind === "num");
  const numericDen = flat.den.filter((f) => f.kind === "num");
  const restNum = flat.num.filter((f) => f.kind !== "num");
  const restDen = flat.den.filter((f) => f.kind !== "num");
  if (numericDen.length > 0 && restNum.length > 0) {
    // A rational coefficient in front, as papers print it: (5/7168) zeta ... / (M^4 eta^(18/5)).
    const coefficient = `\\frac{${juxtapose(numericNum)}}{${juxtapose(numericDen)}}`;
    const rest = restDen.length === 0 ? juxtapose(restNum) : `\\frac{${juxtapose(restNum)}}{${juxtapose(restDen)}}`;
    return `${sign}${coefficient} ${rest}`;
  }
  return `${sign}\\frac{${juxtapose(flat.num)}}{${juxtapose(flat.den)}}`;
}

/** Factors side by side; a sum among several factors gets brackets, a number after another factor a \cdot. */
function juxtapose(factors: readonly Node[]): string {
  if (factors.length === 0) return "1";
  if (factors.length === 1) return latex(factors[0] as Node);
  return factors
    .map((f, k) => {
      const body = f.kind === "add" ? paren(latex(f)) : latex(f);
      return k > 0 && (f.kind === "num" || /^\d/.test(body)) ? `\\cdot ${body}` : body;
    })
    .join(" ");
}
