import { afterAll, describe, expect, it } from "vitest";
import { checkMapping } from "../../server/physics/checks/check-mapping.ts";
import type { MappingInput } from "../../server/physics/checks/types.ts";
import { ExpressionError } from "../../server/physics/expr/errors.ts";
import { guardExpression } from "../../server/physics/expr/guard.ts";
import { closeSymbolicPool, getSymbolicPool } from "../../server/physics/expr/pool.ts";

afterAll(async () => {
  await closeSymbolicPool();
});

const BASE: MappingInput = {
  expression: "",
  target: "ppe_phase",
  b: -7,
  pn_order: -1,
  couplings: [{ symbol: "alpha", dimension: 2 }],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
};

function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const PROTOTYPE_NAMES = [
  ...Object.getOwnPropertyNames(Object.prototype),
  ...Object.getOwnPropertyNames(Function.prototype),
  "prototype",
  "__proto__",
  "constructor",
];

const JS_CODE = [
  "process.exit(1)",
  'require("fs")',
  "require('child_process').execSync('id')",
  "this.constructor.constructor('return process')()",
  "constructor.constructor('return this')()",
  "`x`",
  "${x}",
  "x;1",
  "eval(1)",
  "Function(1)",
  "exit(1)",
  "globalThis",
  "import('fs')",
  "new Function('return 1')",
  "() => 1",
  "[].constructor",
  "x => x",
  "a ? b : c",
  "x || y",
  "x && y",
  "!x",
  "x % 2",
  "x ** 2",
  "x == 1",
  "x != 1",
  "x := 2",
  "f(x) := x^2",
  "sin(x) := x",
  "x = 1",
  "y; z",
  "a\\b",
  "'x'",
  '"x"',
  "x.y",
  "{x}",
  "[x]",
  "x@y",
  "#x",
  "$x",
  "x&y",
  "x|y",
  "~x",
  "<x>",
  "Math.PI",
  "nerdamer('x')",
  "clearVars()",
  "setFunction(f, x)",
  "__defineGetter__('x', f)",
  "Object.prototype.polluted = 1",
];

const UNICODE = [
  "α + β",
  "x\u200b+1",
  "x\u200c",
  "x\u200d",
  "\ufeffx",
  "x\u2060",
  "\u202ex+1",
  "x\u0000",
  "x\u0301",
  "１+２",
  "x\u00a0+ 1",
  "😀",
  "m\u2081",
  "\ud800",
  "x\u2028y",
  "ℏ*x",
  "∞",
  "−x",
  "x × y",
  "√x",
];

const BOMBS_THAT_PASS = [
  "(m1 + m2 + alpha + s1)^20",
  "(alpha + 1)^200",
  "exp(exp(exp(exp(m1))))",
  "alpha^1e300",
  "(alpha - alpha)^(-1)",
  "log(0*alpha)",
  "(-alpha)^0.5",
  "sqrt(-alpha)",
  "0^0*alpha",
  "1e308*1e308*alpha",
  "alpha/0",
  "sin(1e300*alpha)",
  `alpha${"*alpha".repeat(300)}`,
  `alpha${"+alpha".repeat(600)}`,
  `${"sqrt(".repeat(60)}alpha${")".repeat(60)}`,
  `${"(".repeat(64)}alpha${")".repeat(64)}`,
];

function generated(count: number, seed: number): string[] {
  const r = rng(seed);
  const atoms = ["alpha", "zeta", "m1", "m2", "M", "eta", "pi", "1", "2.5", "1e-3", "s1", "chi1", "x", "constructor", "toString"];
  const ops = ["+", "-", "*", "/", "^", "(", ")", ",", " ", "sqrt(", "exp(", "log(", "foo(", "=", ";", ":", ".", "'", "\u200b"];
  const out: string[] = [];
  for (let i = 0; i < count; i += 1) {
    const len = 1 + Math.floor(r() * 25);
    let s = "";
    for (let k = 0; k < len; k += 1) {
      const pick = r();
      s += pick < 0.5 ? atoms[Math.floor(r() * atoms.length)] : ops[Math.floor(r() * ops.length)];
    }
    out.push(s);
  }
  return out;
}

function corpus(): string[] {
  const items: string[] = [];
  for (const name of PROTOTYPE_NAMES) items.push(name, `alpha*${name}`, `${name}(1)`, `${name}.x`, `zeta + ${name}^2`);
  items.push(...JS_CODE, ...UNICODE, ...BOMBS_THAT_PASS);
  items.push("", " ", "\t\n", "x".repeat(100_000), "1+".repeat(50_000), "alpha".repeat(20_000));
  items.push("(".repeat(100_000), `${"(".repeat(100_000)}x${")".repeat(100_000)}`, ")".repeat(1000), "-".repeat(100_000));
  items.push(`${"(".repeat(65)}alpha${")".repeat(65)}`, `${"-".repeat(1000)}alpha`, `alpha${"^alpha".repeat(1000)}`);
  for (let cp = 0; cp < 128; cp += 1) items.push(`alpha${String.fromCharCode(cp)}1`);
  items.push(...generated(700, 4242));
  return items;
}

function mappings(): MappingInput[] {
  const extra: MappingInput[] = [];
  const hostileNames = ["constructor", "__proto__", "toString", "m1", "sqrt", "pi", "", "a b", "x\u200b", "x".repeat(100)];
  for (const symbol of hostileNames) {
    extra.push({ ...BASE, expression: "alpha", couplings: [{ symbol, dimension: 1 }] });
    extra.push({ ...BASE, expression: "zeta", definitions: [{ symbol, expression: "alpha" }] });
  }
  extra.push({ ...BASE, expression: "alpha", couplings: [{ symbol: "alpha", dimension: Number.NaN }] });
  extra.push({ ...BASE, expression: "alpha", couplings: [{ symbol: "alpha", dimension: 1e308 }] });
  extra.push({ ...BASE, expression: "u1", definitions: [{ symbol: "u1", expression: "u2" }, { symbol: "u2", expression: "u1" }] });
  extra.push({ ...BASE, expression: "d19", definitions: Array.from({ length: 20 }, (_, k) => ({ symbol: `d${k}`, expression: k === 0 ? "alpha" : `d${k - 1}*d${k - 1}` })) });
  extra.push({ ...BASE, expression: "alpha", definitions: Array.from({ length: 1000 }, (_, k) => ({ symbol: `d${k}`, expression: "alpha" })) });
  extra.push({ ...BASE, expression: "alpha", definitions: [{ symbol: "f", expression: "f(x):=x^2" }] });
  extra.push({ ...BASE, expression: "alpha", b: Number.NaN, pn_order: Infinity });
  // Bombs that reach the CAS through the derivation comparison.
  for (const e of ["(m1 + m2 + alpha + s1)^20", "(alpha + m1)^200", "exp(exp(exp(alpha)))"]) {
    extra.push({ ...BASE, expression: e, derivation: { flux: { order: -1, coefficient: e } } });
  }
  // Equal in value, so the comparison does go to the CAS, written so that it must work for it.
  for (const [typed, coefficient] of [
    ["-(3/224)*eta^(2/5)*(m1 + m2 + alpha + s1)^20", "((s1 + alpha + m2 + m1)^10)^2"],
    ["-(3/224)*eta^(2/5)*((alpha + m1)^2 - alpha^2 - 2*alpha*m1)^30", "m1^60"],
    ["-(3/224)*eta^(2/5)*(1 + zeta)^40", "(zeta + 1)^40"],
    // These two run the CAS into its 2 s deadline; the numeric comparison then decides.
    ["-(3/224)*eta^(2/5)*sqrt(m1*m2/(m1+m2)^2)^2*(m1/M + s1 + zeta)^12", "eta*(zeta + s1 + m1/M)^12"],
    ["-(3/224)*eta^(2/5)*sqrt(m1*m2/(m1+m2)^2)^2*(m1/M + s1 + zeta + chi1)^20", "eta*(zeta + s1 + m1/M + chi1)^20"],
  ] as const) {
    extra.push({ ...BASE, expression: typed, derivation: { flux: { order: -1, coefficient } } });
  }
  extra.push({ ...BASE, expression: "zeta", derivation: { flux: { order: Number.NaN, coefficient: "zeta" } } });
  extra.push({ ...BASE, expression: "zeta", derivation: { energy: { order: 1, coefficient: "constructor" } } });
  extra.push({ ...BASE, expression: "zeta", derivation: { frequency_drift: { order: 1e300, coefficient: "x".repeat(5000) } } });
  return extra;
}

/** Runs f; returns "ok", "rejected" (ExpressionError) or rethrows anything else (a crash). */
async function outcome(f: () => unknown): Promise<"ok" | "rejected"> {
  try {
    await f();
    return "ok";
  } catch (err) {
    if (err instanceof ExpressionError) return "rejected";
    throw err;
  }
}

describe("hostile input through guard and checkMapping", () => {
  it(
    "never crashes, never hangs (each input within 3 s), never pollutes prototypes",
    async () => {
      const inputs = corpus();
      const extra = mappings();
      expect(inputs.length + extra.length).toBeGreaterThanOrEqual(1000);
      const symbols = ["alpha", "zeta", "m1", "m2", "M", "eta", "s1", "chi1", "x"];
      const counts = { ok: 0, rejected: 0 };
      let slowest = 0;
      const run = async (label: string, f: () => Promise<unknown>): Promise<void> => {
        const t0 = performance.now();
        const o = await outcome(f).catch((err: unknown) => {
          throw new Error(`crash on ${JSON.stringify(label.slice(0, 80))}: ${String(err)}`);
        });
        const ms = performance.now() - t0;
        slowest = Math.max(slowest, ms);
        expect(ms, `time for ${JSON.stringify(label.slice(0, 80))}`).toBeLessThan(3000);
        counts[o] += 1;
      };
      for (const input of inputs) {
        await run(input, async () => guardExpression(input, { symbols }));
        await run(input, async () => {
          const report = await checkMapping({ ...BASE, expression: input });
          expect(Array.isArray(report.checks)).toBe(true);
          expect(report.checks.every((c) => typeof c.message === "string" && c.message.length > 0)).toBe(true);
        });
      }
      for (const m of extra) await run(m.expression, async () => checkMapping(m));
      // Non-string and malformed requests are rejected as ExpressionError, not crashes.
      for (const bad of [null, 42, {}, [], { expression: 1 }, { ...BASE, couplings: null }, { ...BASE, definitions: "x" }, { ...BASE, derivation: 5 }]) {
        const o = await outcome(() => checkMapping(bad as unknown as MappingInput));
        expect(o).toBe("rejected");
      }
      expect(counts.rejected).toBeGreaterThan(500);
      expect(counts.ok).toBeGreaterThan(100);
      expect(({} as Record<string, unknown>)["polluted"]).toBeUndefined();
      expect(Object.prototype.toString.call([])).toBe("[object Array]");
      // The CAS pool survived the bombs.
      expect(await getSymbolicPool().simplify("(x^2-1)/(x-1)", ["x"])).toBe("1+x");
      console.info(`hostile corpus: ${inputs.length * 2 + extra.length} runs, ${counts.ok} reports, ${counts.rejected} rejections, slowest ${slowest.toFixed(0)} ms`);
    },
    120_000,
  );
});
