import type { Node } from "../expr/ast.ts";
import { SymbolicError, type SymbolicPool } from "../expr/pool.ts";
import type { SymbolTable } from "../expr/symbols.ts";
import type { Prepared } from "./evaluate.ts";
import { createRandom, describePoint, samplePoint } from "./sampling.ts";
import type { CheckResult, MappingTarget } from "./types.ts";

const POINTS = 3;
const SMALL = [1e-4, 1e-8, 1e-12] as const;
const LARGE = [1e4, 1e8, 1e12] as const;
/** Below this a value at zero coupling may be rounding residue; the CAS then decides. */
const RESIDUE = 1e-9;

function withCouplings(point: Float64Array, indices: readonly number[], scale: number): Float64Array {
  const out = Float64Array.from(point);
  for (const k of indices) out[k] = scale === 0 ? 0 : (out[k] as number) * scale;
  return out;
}

/** |f| shrinks along the sequence and ends well below where it started. */
function tendsToZero(values: readonly number[]): boolean {
  if (!values.every(Number.isFinite)) return false;
  const abs = values.map(Math.abs);
  for (let k = 1; k < abs.length; k += 1) if ((abs[k] as number) > (abs[k - 1] as number)) return false;
  const first = abs[0] as number;
  const last = abs[abs.length - 1] as number;
  return last === 0 || last <= 0.1 * first;
}

const fmt = (x: number): string => (Number.isFinite(x) ? Number(x.toPrecision(6)).toString() : String(x));

/** Where each coupling reaches GR, by name; couplings not listed are taken to reach it at zero. */
export type GrValues = Readonly<Record<string, "zero" | "infinity">>;

/**
 * Moves the couplings towards their GR values: those at zero are multiplied by `scale`, those at
 * infinity divided by it (scale -> 0 is the GR limit). `flip` sends every coupling the other way.
 */
function towardsGr(point: Float64Array, indices: readonly number[], atInfinity: readonly boolean[], scale: number, flip = false): Float64Array {
  const out = Float64Array.from(point);
  indices.forEach((k, j) => {
    const inverse = (atInfinity[j] === true) !== flip;
    out[k] = (out[k] as number) * (inverse ? 1 / scale : scale);
  });
  return out;
}

/** |f| grows along the sequence and ends well above where it started. */
function grows(values: readonly number[]): boolean {
  const abs = values.map(Math.abs);
  if (abs.some((v) => !Number.isFinite(v))) return true;
  for (let k = 1; k < abs.length; k += 1) if ((abs[k] as number) < (abs[k - 1] as number)) return false;
  return (abs[abs.length - 1] as number) >= 10 * (abs[0] as number);
}

/**
 * A correction must vanish when the theory's couplings take their GR values. Couplings declared
 * with `gr_value` are sent there (zero, or infinity for a graviton Compton wavelength or omega_BD);
 * an expression that vanishes only the other way round has its coupling upside down, an error.
 * Without any declaration the old reading holds: GR at zero, and an expression that vanishes
 * only at infinity passes with a warning asking for the declaration.
 */
export async function grLimitCheck(
  p: Prepared,
  table: SymbolTable,
  target: MappingTarget,
  pool: SymbolicPool | undefined,
  grValues: GrValues = {},
): Promise<CheckResult> {
  const failSeverity = target === "validity" ? "warning" : "error";
  if (p.couplingIndices.length === 0) {
    const declared = table.couplings.length > 0 ? ` (declared: ${table.couplings.join(", ")})` : "";
    return {
      name: "gr_limit",
      ok: target === "validity",
      severity: failSeverity,
      message: `the expression uses no coupling${declared}, so it cannot vanish in the GR limit`,
    };
  }
  const rng = createRandom(7321);
  const points = Array.from({ length: POINTS }, () => samplePoint(p.args, table, rng));
  const couplingNames = p.couplingIndices.map((k) => p.args[k] as string);
  const atInfinity = couplingNames.map((n) => grValues[n] === "infinity");
  const declared = couplingNames.some((n) => grValues[n] !== undefined);
  const names = couplingNames.join(", ");
  const limitText = couplingNames.map((n, j) => `${n} -> ${atInfinity[j] ? "infinity" : "0"}`).join(", ");
  const oppositeText = couplingNames.map((n, j) => `${n} -> ${atInfinity[j] ? "0" : "infinity"}`).join(", ");
  const along = (pt: Float64Array, flip = false): number[] => SMALL.map((s) => p.f(towardsGr(pt, p.couplingIndices, atInfinity, s, flip)));

  if (!atInfinity.some(Boolean)) {
    // Every coupling reaches GR at zero: evaluate there exactly first.
    const atZero = points.map((pt) => p.f(withCouplings(pt, p.couplingIndices, 0)));
    const worst = atZero.reduce((w, v, k) => (Math.abs(v) > Math.abs(atZero[w] as number) ? k : w), 0);
    const value = atZero[worst] as number;
    if (atZero.every(Number.isFinite)) {
      if (value === 0) return { name: "gr_limit", ok: true, message: `the expression vanishes when ${names} = 0` };
      if (Math.abs(value) < RESIDUE && pool !== undefined) {
        const cas = await vanishesSymbolically(p.expanded, table, pool);
        if (cas === "zero") return { name: "gr_limit", ok: true, message: `the expression vanishes when ${names} = 0 (confirmed symbolically)` };
        if (cas === "timeout") {
          // A residue this small is rounding or a real remainder: only the CAS can tell, and it ran out of time.
          return {
            name: "gr_limit",
            ok: false,
            severity: "inconclusive",
            message: `with ${names} = 0 the expression is ${fmt(value)}, within rounding of 0, and the symbolic check that decides whether it is exactly 0 did not finish in time; inconclusive, it runs again on the next save`,
          };
        }
      }
    } else if (points.every((pt) => tendsToZero(along(pt)))) {
      return { name: "gr_limit", ok: true, message: `the expression is undefined at ${names} = 0 but tends to 0 as ${names} -> 0` };
    }
    const upsideDown = points.every((pt) => tendsToZero(LARGE.map((s) => p.f(withCouplings(pt, p.couplingIndices, s)))));
    if (upsideDown && !declared) {
      return {
        name: "gr_limit",
        ok: true,
        severity: "warning",
        message: `the expression vanishes as ${names} -> infinity, not as ${names} -> 0: GR is recovered at infinite ${names} (like a graviton Compton wavelength, or omega_BD in Brans-Dicke); declare the coupling's GR value as infinity if that is intended, or check whether it is written upside down`,
      };
    }
    if (upsideDown) {
      const blowsUp = points.some((pt) => grows(along(pt)));
      return {
        name: "gr_limit",
        ok: false,
        severity: failSeverity,
        message: `${names} ${couplingNames.length > 1 ? "are" : "is"} declared to reach GR at 0, but the expression vanishes only as ${oppositeText}${blowsUp ? ` and diverges as ${limitText}` : ""}: the coupling is written upside down (1/x where x is meant), or its GR value is infinity`,
      };
    }
    if (atZero.every(Number.isFinite)) {
      const at = describePoint(p.args, withCouplings(points[worst] as Float64Array, p.couplingIndices, 0));
      return {
        name: "gr_limit",
        ok: false,
        severity: failSeverity,
        message: `with ${names} = 0 the expression equals ${fmt(value)} (at ${at}); a correction to GR must vanish there (is there a constant term?)`,
      };
    }
    const tiny = p.f(withCouplings(points[0] as Float64Array, p.couplingIndices, 1e-12));
    return {
      name: "gr_limit",
      ok: false,
      severity: failSeverity,
      message: `the expression does not vanish as ${names} -> 0 (with ${names} scaled by 1e-12 it is ${fmt(tiny)}; at ${names} = 0 it is ${fmt(atZero.find((v) => !Number.isFinite(v)) ?? Number.NaN)}), nor as ${names} -> infinity`,
    };
  }

  // At least one coupling reaches GR at infinity: approach the limit along a sequence.
  if (points.every((pt) => tendsToZero(along(pt)))) {
    return { name: "gr_limit", ok: true, message: `the expression vanishes in the GR limit ${limitText}` };
  }
  if (points.every((pt) => tendsToZero(along(pt, true)))) {
    const blowsUp = points.some((pt) => grows(along(pt)));
    return {
      name: "gr_limit",
      ok: false,
      severity: failSeverity,
      message: `GR is declared at ${limitText}, but the expression vanishes only as ${oppositeText}${blowsUp ? ` and diverges as ${limitText}` : ""}: the coupling is written upside down (x where 1/x is meant), or its GR value is zero`,
    };
  }
  const last = p.f(towardsGr(points[0] as Float64Array, p.couplingIndices, atInfinity, SMALL[SMALL.length - 1] as number));
  return {
    name: "gr_limit",
    ok: false,
    severity: failSeverity,
    message: `the expression does not vanish in the GR limit ${limitText} (with the couplings moved by a factor 1e12 towards it, it is ${fmt(last)})`,
  };
}

/**
 * Substitutes 0 for every coupling and asks the CAS whether what is left is identically 0. A CAS that
 * ran out of time (or whose queue was full) has decided nothing: "timeout", never "not zero".
 */
async function vanishesSymbolically(ast: Node, table: SymbolTable, pool: SymbolicPool): Promise<"zero" | "not_shown" | "timeout"> {
  const couplings = new Set(table.couplings);
  const zero = (n: Node): Node => {
    switch (n.kind) {
      case "sym":
        return couplings.has(n.name) ? { kind: "num", value: 0, text: "0", pos: n.pos } : n;
      case "num":
      case "const":
        return n;
      case "neg":
      case "call":
        return { ...n, arg: zero(n.arg) };
      case "add":
        return { ...n, terms: n.terms.map((t) => ({ neg: t.neg, node: zero(t.node) })) };
      case "mul":
        return { ...n, factors: n.factors.map((f) => ({ div: f.div, node: zero(f.node) })) };
      case "pow":
        return { ...n, base: zero(n.base), exp: zero(n.exp) };
    }
  };
  try {
    const { zero: isZero } = await pool.isZero([zero(ast)]);
    return isZero ? "zero" : "not_shown";
  } catch (err) {
    if (err instanceof SymbolicError && (err.code === "timeout" || err.code === "busy" || err.code === "worker_lost")) return "timeout";
    return "not_shown";
  }
}
