import { collectSymbols, DERIVED_LIMITS, type Node } from "../expr/ast.ts";
import { compileAst } from "../expr/compile.ts";
import { guardExpression } from "../expr/guard.ts";
import { expandAst, type SymbolTable } from "../expr/symbols.ts";
import { createRandom, samplePoint } from "./sampling.ts";

const POINTS = 6;
const SAME = 1e-8;

/** Named constant factors a hand-copied formula typically slips by. */
function namedFactors(alphaMd: number | undefined): Array<readonly [number, string]> {
  const out: Array<readonly [number, string]> = [
    [-1, "a factor -1: the sign is flipped (check the sign convention of the phase, exp(+i Psi) here)"],
    [Math.PI, "a factor pi: one power of pi too many (pi^2 written where pi is meant?)"],
    [1 / Math.PI, "a factor 1/pi: one power of pi missing (pi written for pi^2?)"],
    [Math.PI ** 2, "a factor pi^2: two powers of pi too many"],
    [1 / Math.PI ** 2, "a factor 1/pi^2: two powers of pi missing"],
    [2, "a factor 2"],
    [0.5, "a factor 1/2"],
    [4, "a factor 4"],
    [0.25, "a factor 1/4"],
  ];
  if (alphaMd !== undefined && alphaMd !== 1 && alphaMd !== 0 && alphaMd !== 2) {
    out.push([1 - alphaMd, `a factor (1 - alpha) = ${1 - alphaMd}: the group velocity dE/dp was used; the catalogue follows Mirshekari, Yunes & Will 2012, who use the particle speed p/E`]);
    out.push([alphaMd - 1, `a factor (alpha - 1) = ${alphaMd - 1}: the 1/(alpha - 1) of the integrated arrival-time delay is missing`]);
  }
  return out;
}

/**
 * Why two expressions that should be equal differ, when the reason is one of the usual slips:
 * a constant factor (sign, pi, 2) or a power of (1 + z) (a mass in the wrong frame). Returns
 * undefined when the ratio follows no such pattern.
 */
export function diagnoseRatio(typed: Node | string, derived: Node | string, table: SymbolTable, alphaMd?: number): string | undefined {
  const node = (e: Node | string): Node => (typeof e === "string" ? guardExpression(e, { symbols: table.names, limits: DERIVED_LIMITS }).ast : e);
  const ea = expandAst(node(typed), table);
  const eb = expandAst(node(derived), table);
  const used = new Set([...collectSymbols(ea).keys(), ...collectSymbols(eb).keys()]);
  const args = table.primitives.filter((p) => used.has(p));
  const fa = compileAst(ea, args);
  const fb = compileAst(eb, args);
  const zIndex = args.indexOf("z");
  const rng = createRandom(1234);
  const ratios: number[] = [];
  const zs: number[] = [];
  for (let attempt = 0; attempt < 30 && ratios.length < POINTS; attempt += 1) {
    const pt = samplePoint(args, table, rng);
    const r = fa(pt) / fb(pt);
    if (!Number.isFinite(r) || r === 0) continue;
    ratios.push(r);
    zs.push(zIndex >= 0 ? (pt[zIndex] as number) : 0);
  }
  if (ratios.length < 3) return undefined;
  const first = ratios[0] as number;
  if (ratios.every((r) => Math.abs(r / first - 1) < SAME)) {
    const named = namedFactors(alphaMd).find(([v]) => Math.abs(first / v - 1) < SAME);
    return named ? `the stated expression is the derived one times ${named[1]}` : `the stated expression is the derived one times a constant ${Number(first.toPrecision(8))}`;
  }
  if (zIndex >= 0 && ratios.every((r) => r > 0)) {
    const k = ratios.map((r, i) => Math.log(r) / Math.log(1 + (zs[i] as number)));
    const k0 = k[0] as number;
    if (Math.abs(k0) > 1e-6 && k.every((x) => Math.abs(x - k0) < 1e-6 * Math.max(1, Math.abs(k0)))) {
      const power = Number(k0.toFixed(6));
      return `the stated expression is the derived one times (1+z)^${power}: a source/detector-frame slip (the mappings take source-frame masses, Mc = Mc_z/(1+z); the distance measure already carries the redshift factors)`;
    }
  }
  return undefined;
}
