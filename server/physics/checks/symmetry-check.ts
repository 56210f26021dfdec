import type { SymbolTable } from "../expr/symbols.ts";
import type { Prepared } from "./evaluate.ts";
import { phaseExponent } from "./pn-order-check.ts";
import { createRandom, describePoint, samplePoint } from "./sampling.ts";
import type { CheckResult, MappingInput } from "./types.ts";

const POINTS = 3;
/** Relative size below which the value for identical bodies counts as rounding residue. */
const RESIDUE = 1e-9;

/** Per-body inputs and their partner: identical bodies have equal masses, spins, charges and sensitivities. */
const PAIRS: ReadonlyArray<readonly [string, string]> = [
  ["m1", "m2"],
  ["chi1", "chi2"],
  ["s1", "s2"],
  ["sigma1", "sigma2"],
];
/** Inputs that describe one body beyond its mass. */
const BODY_PROPERTIES = new Set(["chi1", "chi2", "s1", "s2", "sigma1", "sigma2"]);

/**
 * Is this a dipole-type mapping? Dipole radiation enters at -1PN: a phase term at b = -7, an
 * amplitude term at a = -2, or a derivation from a flux change at order -1 (common practice:
 * a dipole flux scales as v^8 against the quadrupole's v^10).
 */
export function isDipoleMapping(input: MappingInput): boolean {
  const near = (x: number | undefined, y: number): boolean => x !== undefined && Math.abs(x - y) < 1e-9;
  if (input.derivation?.flux !== undefined && near(input.derivation.flux.order, -1)) return true;
  if (input.target === "ppe_phase") return near(input.b ?? (input.pn_order === undefined ? undefined : phaseExponent(input.pn_order)), -7);
  if (input.target === "ppe_amplitude") return near(input.a ?? (input.pn_order === undefined ? undefined : 2 * input.pn_order), -2);
  return false;
}

function index(p: Prepared, name: string): number {
  return p.args.indexOf(name);
}

/** The point with body 2 made identical to body 1. */
function identical(p: Prepared, point: Float64Array): Float64Array {
  const out = Float64Array.from(point);
  for (const [one, two] of PAIRS) {
    const i = index(p, one);
    const j = index(p, two);
    if (i >= 0 && j >= 0) out[j] = out[i] as number;
  }
  return out;
}

/** The point with the bodies' labels exchanged. */
function swapped(p: Prepared, point: Float64Array): Float64Array {
  const out = Float64Array.from(point);
  for (const [one, two] of PAIRS) {
    const i = index(p, one);
    const j = index(p, two);
    if (i >= 0 && j >= 0) {
      out[i] = point[j] as number;
      out[j] = point[i] as number;
    }
  }
  return out;
}

/**
 * Identical bodies carry identical charges, so their dipole moment about the centre of mass
 * vanishes and they emit no dipole radiation: a dipole-type beta must be 0 for equal masses,
 * spins, charges and sensitivities (and so equal body types). An expression that depends on the
 * individual bodies and does not vanish there is an error (a difference of charges written as a
 * sum, a charge forgotten on one body). One that depends only on M and eta and the couplings
 * cannot vanish for identical bodies: right for a phenomenological per-binary dipole
 * coefficient, wrong if the bodies' charges were left out, so it passes with a warning.
 */
export function symmetryCheck(p: Prepared, table: SymbolTable): CheckResult {
  const rng = createRandom(4242);
  const points = Array.from({ length: POINTS }, () => samplePoint(p.args, table, rng));
  const generic = points.map((pt) => p.f(pt));
  const same = points.map((pt) => p.f(identical(p, pt)));
  const residue = same.map((v, k) => Math.abs(v) / Math.max(Math.abs(generic[k] as number), Number.MIN_VALUE));
  const vanishes = same.every((v, k) => v === 0 || (Number.isFinite(v) && (residue[k] as number) < RESIDUE));
  if (vanishes) {
    return { name: "symmetry", ok: true, message: "dipole term: it vanishes for identical bodies (equal masses, spins, charges), as a dipole must" };
  }
  const worst = same.reduce((w, v, k) => (Math.abs(v) > Math.abs(same[w] as number) ? k : w), 0);
  const at = describePoint(p.args, identical(p, points[worst] as Float64Array));
  const value = same[worst] as number;
  const shown = Number.isFinite(value) ? Number(value.toPrecision(6)).toString() : String(value);
  const bodyProperties = p.args.filter((a) => BODY_PROPERTIES.has(a));
  const asymmetric = points.some((pt) => {
    const x = p.f(pt);
    const y = p.f(swapped(p, pt));
    return Math.abs(x - y) > 1e-9 * Math.max(Math.abs(x), Math.abs(y));
  });
  if (bodyProperties.length > 0 || asymmetric) {
    return {
      name: "symmetry",
      ok: false,
      severity: "error",
      message: `dipole term: for identical bodies (${at}) it equals ${shown}, but identical bodies carry equal charges and emit no dipole radiation; a dipole term goes with the square of a difference of the bodies' charges (is a difference written as a sum, or a charge left off one body?)`,
    };
  }
  return {
    name: "symmetry",
    ok: true,
    severity: "warning",
    message: `dipole term: it depends on no property of the individual bodies (only on M, eta and the couplings), so it does not vanish for identical bodies (${shown} at ${at}); right for a per-binary dipole coefficient, wrong if the bodies' charges were left out`,
  };
}
