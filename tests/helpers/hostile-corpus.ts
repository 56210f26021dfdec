/**
 * Generated hostile expressions for the front-door tests: prototype names, JavaScript, assignment
 * syntax, huge and deeply nested inputs, odd characters, and expansion bombs that pass the guard.
 */
export function hostileCorpus(size: number, seed = 7): string[] {
  let a = seed >>> 0;
  const rnd = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)] as T;
  const fixed = [
    ...Object.getOwnPropertyNames(Object.prototype),
    "prototype",
    "__proto__.polluted",
    "constructor.constructor('return process')()",
    "process.exit(1)",
    'require("fs")',
    "import('child_process')",
    "`alpha`",
    "alpha := 2",
    "f(x) := x^2",
    "alpha = 1",
    "alpha; 1",
    "x".repeat(100_000),
    "(".repeat(100_000) + "alpha" + ")".repeat(100_000),
    "(".repeat(50_000),
    "alpha\u0000",
    "al\u200bpha",
    "αλφα",
    "1e999999",
    "9^9^9^9",
    "1/0",
    "expand((alpha+m1+m2+chi1)^20)",
    "(alpha+m1+m2+chi1)^200",
    "sin(".repeat(60) + "alpha" + ")".repeat(60),
    "",
    "   ",
  ];
  const atoms = ["alpha", "m1", "m2", "M", "eta", "zeta", "pi", "chi1", "2", "1e-3", "constructor", "toString", "window", "process", "__proto__"];
  const ops = ["+", "-", "*", "/", "^", ":=", "=", ";", "**", "&&", "|", ".", ",", "%"];
  const funcs = ["sqrt", "exp", "log", "abs", "sin", "cos", "eval", "Function", "require", "simplify", "expand", "diff", "integrate"];
  const out = [...fixed];
  while (out.length < size) {
    const kind = rnd();
    if (kind < 0.4) {
      let e = pick(atoms);
      const n = 1 + Math.floor(rnd() * 6);
      for (let i = 0; i < n; i++) e = `${e}${pick(ops)}${pick(atoms)}`;
      out.push(e);
    } else if (kind < 0.7) {
      out.push(`${pick(funcs)}(${pick(atoms)}${pick(ops)}${pick(atoms)})`);
    } else if (kind < 0.85) {
      const depth = Math.floor(rnd() * 200);
      out.push("(".repeat(depth) + pick(atoms) + ")".repeat(depth));
    } else {
      const chars = Array.from({ length: 1 + Math.floor(rnd() * 30) }, () => String.fromCharCode(Math.floor(rnd() * 0x2fff)));
      out.push(chars.join(""));
    }
  }
  return out;
}

/** A mapping request body for POST /api/v1/expressions/check. */
export interface CraftedCheck {
  readonly label: string;
  readonly body: {
    expression: string;
    target: "ppe_phase" | "validity";
    b?: number;
    couplings: Array<{ symbol: string; dimension: number }>;
    definitions: Array<{ symbol: string; expression: string }>;
    derivation?: { flux: { order: number; coefficient: string } };
  };
}

/**
 * Definitions that each stay under the 20 000-node expansion cap (u expands to 19 863 nodes), and
 * expressions that use u hundreds of times: small bodies whose substituted trees have millions of
 * nodes. Every one of them is over the evaluation budget.
 */
export function craftedDefinitionChecks(): CraftedCheck[] {
  const sum = "m1+m2+chi1+chi2+s1+s2+sigma1+sigma2+z+alpha"; // 11 nodes
  const definitions = [
    { symbol: "w1", expression: sum },
    { symbol: "w2", expression: Array.from({ length: 30 }, () => "w1").join("*") }, // 1 + 30*11 = 331
    { symbol: "w3", expression: Array.from({ length: 30 }, () => "w2").join("*") }, // 1 + 30*331 = 9931
    { symbol: "u", expression: "w3+w3" }, // 1 + 2*9931 = 19863
  ];
  const couplings = [{ symbol: "alpha", dimension: 0 }];
  const times = (n: number, op: string) => Array.from({ length: n }, () => "u").join(op);
  const base = { target: "ppe_phase" as const, b: -7, couplings, definitions };
  return [
    { label: "u multiplied 600 times", body: { ...base, expression: times(600, "*") } },
    { label: "u added 600 times", body: { ...base, expression: times(600, "+") } },
    { label: "u divided 400 times inside sqrt", body: { ...base, expression: `sqrt(${times(400, "/")})` } },
    { label: "u to the power of u, 200 times", body: { ...base, expression: times(200, "^") } },
    { label: "validity using u 600 times", body: { ...base, target: "validity", expression: times(600, "*") } },
    {
      label: "derivation coefficient using u 600 times",
      body: { ...base, expression: "alpha", derivation: { flux: { order: -1, coefficient: times(600, "*") } } },
    },
  ];
}
