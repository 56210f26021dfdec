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
