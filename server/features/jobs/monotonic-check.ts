import { DEFAULT_COSMOLOGY } from "../../../common/convert.ts";
import type { SamplesJobRequest } from "../../../common/jobs.ts";
import { symbolText } from "../../../common/symbol-text.ts";
import { ValidationError } from "../../errors.ts";
import { makeBinary, type BinaryInput } from "../../physics/binary.ts";
import { createConversionContext } from "../../physics/convert.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { detectPowerLaw } from "../../physics/invert.ts";
import { quotedValueOf } from "../../physics/quoted-forms.ts";
import { invertColumns, NotMonotonicError, scanGrid } from "../../physics/samples/invert-columns.ts";
import type { Target } from "../convert/samples-common.ts";

/**
 * Before a samples job is queued: a mapping that is not a power law is inverted sample by sample,
 * which needs beta monotonic in the coupling for each sample's binary (the job checks every row,
 * server/physics/samples/invert-columns.ts). The binaries are in the file, which is the job's to read;
 * but when beta turns for every plausible binary of the request's kinds, no file can pass, and the
 * caller gets a 400 naming the mapping and where it turns instead of a failed job. When it turns for
 * some binaries only, the job decides on the file's own rows.
 */

type Body = "bh" | "ns";

/** Component masses (solar masses, source frame) and spins of the probes, per body kind. */
const PLAUSIBLE: Record<Body, { readonly m: readonly number[]; readonly chi: readonly number[] }> = {
  // Stellar-mass black holes as ground-based detectors see them; aligned spins of either sign.
  bh: { m: [10, 36, 85, 7], chi: [0, 0.6, -0.4, 0.2] },
  // Neutron stars: 1.2-2.1 M☉, small spins.
  ns: { m: [1.4, 2.0, 1.2, 1.7], chi: [0, 0.02, 0, -0.01] },
};
/** The second body's mass as a fraction of the first's (within its kind's range). */
const PARTNER: Record<Body, readonly number[]> = { bh: [0.5, 0.8, 0.78, 0.9], ns: [0.93, 0.6, 0.95, 0.8] };
/** Redshift of the probes, for mappings that need one (propagation effects). */
const PROBE_Z = 0.1;

function probeBinaries(bodies: readonly [Body, Body]): BinaryInput[] {
  const [k1, k2] = bodies;
  return PLAUSIBLE[k1].m.map((m1, i) => {
    const m2 = k1 === k2 ? m1 * PARTNER[k1][i]! : PLAUSIBLE[k2].m[i]!;
    return { m1, m2: Number(m2.toPrecision(3)), chi1: PLAUSIBLE[k1].chi[i]!, chi2: PLAUSIBLE[k2].chi[(i + 1) % 4]!, bodies: [k1, k2], frame: "source" };
  });
}

/** Where beta turns, refined from the scan's cell: the extremum of F between the grid points around it (golden section). */
function turningPoint(F: (x: number) => number, grid: readonly number[], between: readonly [number, number]): number {
  const k = grid.indexOf(between[0]);
  const lo = grid[Math.max(0, k - 1)]!;
  const hi = between[1];
  const before = Math.sign(F(grid[k]!) - F(lo)) || 1;
  const logScale = lo * hi > 0;
  const sign = lo < 0 ? -1 : 1;
  const to = (t: number) => (logScale ? sign * Math.exp(t) : t);
  let a = logScale ? Math.log(Math.abs(lo)) : lo;
  let b = logScale ? Math.log(Math.abs(hi)) : hi;
  if (a > b) [a, b] = [b, a];
  const r = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 200 && b - a > 1e-12 * Math.max(1, Math.abs(a), Math.abs(b)); i++) {
    const c = b - r * (b - a);
    const d = a + r * (b - a);
    if (before * F(to(c)) > before * F(to(d))) b = d;
    else a = c;
  }
  return to((a + b) / 2);
}

interface Probe {
  binary: BinaryInput;
  turnsAt: number | null;
}

/** A 400 when beta is not monotonic in the coupling for any plausible binary; null otherwise (or when it cannot tell). */
export function nonMonotonicRefusal(target: Target, request: Pick<SamplesJobRequest, "bodies" | "cosmology" | "f_low">): ValidationError | null {
  const mapping = target.ready.compiled;
  const symbol = mapping.coupling.symbol;
  const range = target.theory.theory.entry.couplings.find((c) => c.symbol === symbol)?.range ?? "non_negative";
  const grid = scanGrid(range === "any_sign");
  const probes: Probe[] = [];
  for (const input of probeBinaries(request.bodies)) {
    let F: (x: number) => number;
    try {
      const binary = makeBinary(mapping.distance ? { ...input, z: PROBE_Z } : input);
      const env = createConversionContext(binary, { cosmology: request.cosmology ?? { ...DEFAULT_COSMOLOGY }, fLowHz: request.f_low }).envFor(mapping);
      F = mapping.bind ? mapping.bind(env) : (x: number) => mapping.evaluate(x, env);
    } catch (err) {
      if (err instanceof PhysicsInputError) continue; // this kind of binary needs inputs a probe lacks (e.g. neutron-star sensitivities)
      throw err;
    }
    // A binary for which the mapping vanishes (equal charges emit no dipole) says nothing.
    if ([1e-6, 1, 1e6].every((x) => F(x) === 0 || !Number.isFinite(F(x)))) continue;
    if (probes.length === 0) {
      const law = detectPowerLaw(F);
      if (law && law.power !== 0) return null; // a power law is monotonic; the job inverts it in closed form
    }
    try {
      invertColumns((xs, out) => {
        out[0] = F(xs[0]!);
        return out;
      }, new Float64Array(1), new Uint8Array(1), range === "any_sign");
      probes.push({ binary: input, turnsAt: null });
    } catch (err) {
      if (!(err instanceof NotMonotonicError)) throw err;
      probes.push({ binary: input, turnsAt: turningPoint(F, grid, err.between) });
    }
  }
  const first = probes[0];
  if (!first || first.turnsAt === null || probes.some((p) => p.turnsAt === null)) return null;
  const name = symbolText(symbol, mapping.coupling.latex);
  const quoted = mapping.coupling.quoted;
  const at = first.turnsAt;
  const inQuoted = quoted.form === "identity" ? "" : ` (${symbolText(quoted.symbol, quoted.latex)} ≈ ${quotedValueOf(quoted.form, Math.abs(at)).toPrecision(3)} ${quoted.unit})`;
  const kinds = request.bodies.join("-");
  const where = `${name} ≈ ${at.toPrecision(3)} ${mapping.coupling.unit}${inQuoted}`;
  const message =
    `the ${target.theory.theory.slug} mapping at b = ${target.b} is not monotonic in ${name}: for a ${first.binary.m1} + ${first.binary.m2} M☉ ${kinds} binary, beta turns at ${where}, ` +
    `and it turns for every one of the ${probes.length} plausible ${kinds} binaries tried (${probes.map((p) => `${p.binary.m1} + ${p.binary.m2} M☉`).join(", ")}). ` +
    `A bound on beta then allows disjoint ranges of ${name}, and no single bound follows; nothing was queued.`;
  return new ValidationError(`Invalid theory: ${message}`, { theory: message });
}
