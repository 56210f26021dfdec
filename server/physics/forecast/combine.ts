/**
 * Combining Fisher matrices that an analyst computed elsewhere: one matrix per detector for the same
 * source and parameters, each checked (square, finite, symmetric, positive definite), aligned by
 * parameter name, summed per network, given the Gaussian priors once and inverted (linalg.ts).
 * Independent detectors add their Fisher matrices (Cutler & Flanagan 1994, Phys. Rev. D 49, 2658).
 */
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { PhysicsInputError } from "../input-error.ts";
import { invertFisher, type InversionStatus } from "./linalg.ts";
import type { PriorWidths } from "./forecast.ts";
import { boundMultiplier } from "./stats.ts";

export interface UploadedFisher {
  label: string;
  parameters: string[];
  matrix: (number[])[];
}

export interface CombineInput {
  matrices: UploadedFisher[];
  networks: (number[])[];
  /** Name of the parameter whose bound is wanted (default "beta"). */
  target: string;
  priors: PriorWidths;
  credibility: number;
  sides: "one" | "two";
}

export interface CombinedNetwork {
  detectors: number[];
  labels: string[];
  sigma: number | null;
  bound: number | null;
  condition_number: number | null;
  status: InversionStatus;
  note?: string;
  /** The summed matrix with priors, in the order of `parameters`. */
  fisher: (number[])[];
}

export interface CombineResult {
  parameters: string[];
  target: string;
  priors_applied: Readonly<Record<string, number>>;
  credibility: number;
  sides: "one" | "two";
  multiplier: number;
  networks: CombinedNetwork[];
}

/** Relative asymmetry allowed, |G_ij - G_ji| <= tol sqrt(G_ii G_jj): rounding in a text export. */
export const SYMMETRY_TOLERANCE = 1e-6;

export function checkFisher(m: UploadedFisher, field: string): void {
  const n = m.parameters.length;
  if (n === 0) throw new PhysicsInputError(`${field}.parameters`, `${field}.parameters must name at least one parameter`);
  const seen = new Set<string>();
  m.parameters.forEach((p, i) => {
    if (seen.has(p)) throw new PhysicsInputError(`${field}.parameters.${i}`, `${field}.parameters.${i}: "${p}" appears twice`);
    seen.add(p);
  });
  if (m.matrix.length !== n) throw new PhysicsInputError(`${field}.matrix`, `${field}.matrix must have ${n} rows (one per parameter), has ${m.matrix.length}`);
  m.matrix.forEach((row, i) => {
    if (row.length !== n) throw new PhysicsInputError(`${field}.matrix.${i}`, `${field}.matrix.${i} must have ${n} entries, has ${row.length}`);
    row.forEach((v, j) => {
      if (typeof v !== "number" || !Number.isFinite(v)) throw new PhysicsInputError(`${field}.matrix.${i}.${j}`, `${field}.matrix.${i}.${j} must be a finite number`);
    });
  });
  for (let i = 0; i < n; i++) {
    if (!(m.matrix[i]![i]! > 0)) {
      throw new PhysicsInputError(`${field}.matrix.${i}.${i}`, `${field}: the diagonal entry of ${m.parameters[i]} must be positive`);
    }
  }
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const a = m.matrix[i]![j]!;
      const b = m.matrix[j]![i]!;
      const scale = Math.sqrt(m.matrix[i]![i]! * m.matrix[j]![j]!);
      if (Math.abs(a - b) > SYMMETRY_TOLERANCE * scale) {
        throw new PhysicsInputError(
          `${field}.matrix.${i}.${j}`,
          `${field} is not symmetric: entry (${m.parameters[i]}, ${m.parameters[j]}) = ${a} but (${m.parameters[j]}, ${m.parameters[i]}) = ${b}`,
        );
      }
    }
  }
  const scaled = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = (0.5 * (m.matrix[i]![j]! + m.matrix[j]![i]!)) / Math.sqrt(m.matrix[i]![i]! * m.matrix[j]![j]!);
      scaled.set(i, j, i === j ? 1 : v);
    }
  }
  if (!new CholeskyDecomposition(scaled).isPositiveDefinite()) {
    throw new PhysicsInputError(`${field}.matrix`, `${field} (${m.label}) is not positive definite: it cannot be a Fisher matrix of an informative measurement`);
  }
}

export function combineFisher(input: CombineInput): CombineResult {
  if (input.matrices.length === 0) throw new PhysicsInputError("matrices", "matrices must hold at least one Fisher matrix");
  input.matrices.forEach((m, i) => checkFisher(m, `matrices.${i}`));
  const parameters = [...input.matrices[0]!.parameters];
  const reference = new Set(parameters);
  input.matrices.forEach((m, i) => {
    const names = new Set(m.parameters);
    const missing = parameters.filter((p) => !names.has(p));
    const extra = m.parameters.filter((p) => !reference.has(p));
    if (missing.length || extra.length) {
      throw new PhysicsInputError(
        `matrices.${i}.parameters`,
        `matrices.${i}.parameters do not match matrices.0: ${missing.length ? `missing ${missing.join(", ")}` : ""}${missing.length && extra.length ? "; " : ""}${extra.length ? `unexpected ${extra.join(", ")}` : ""}`,
      );
    }
  });
  const target = parameters.indexOf(input.target);
  if (target < 0) throw new PhysicsInputError("target", `target: no parameter named "${input.target}" in the matrices (${parameters.join(", ")})`);
  const priorsApplied: Record<string, number> = {};
  for (const key of ["phi_c", "chi_s", "chi_a"] as const) {
    const width = input.priors[key];
    if (width !== null && parameters.includes(key)) priorsApplied[key] = width;
  }
  const multiplier = boundMultiplier(input.credibility, input.sides);
  if (input.networks.length === 0) throw new PhysicsInputError("networks", "networks must list at least one network");
  const networks = input.networks.map((net, ni): CombinedNetwork => {
    if (net.length === 0) throw new PhysicsInputError(`networks.${ni}`, `networks.${ni} must name at least one matrix`);
    net.forEach((d, k) => {
      if (!Number.isInteger(d) || d < 0 || d >= input.matrices.length) {
        throw new PhysicsInputError(`networks.${ni}.${k}`, `networks.${ni}.${k} must be the index of a matrix (0..${input.matrices.length - 1})`);
      }
    });
    if (new Set(net).size !== net.length) throw new PhysicsInputError(`networks.${ni}`, `networks.${ni} lists a matrix twice`);
    const n = parameters.length;
    const sum = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (const d of net) {
      const m = input.matrices[d]!;
      const order = parameters.map((p) => m.parameters.indexOf(p));
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) sum[i]![j]! += 0.5 * (m.matrix[order[i]!]![order[j]!]! + m.matrix[order[j]!]![order[i]!]!);
      }
    }
    for (const [key, width] of Object.entries(priorsApplied)) {
      const i = parameters.indexOf(key);
      sum[i]![i]! += 1 / width ** 2;
    }
    const inv = invertFisher(sum, parameters);
    const condition = Number.isFinite(inv.condition) ? inv.condition : null;
    const labels = net.map((d) => input.matrices[d]!.label);
    if (!inv.covariance) {
      return { detectors: [...net], labels, sigma: null, bound: null, condition_number: condition, status: "no_constraint", note: inv.reason ?? "no constraint", fisher: sum };
    }
    const sigma = Math.sqrt(inv.covariance[target]![target]!);
    const base = { detectors: [...net], labels, sigma, bound: multiplier * sigma, condition_number: condition, status: inv.status, fisher: sum };
    return inv.reason ? { ...base, note: inv.reason } : base;
  });
  return { parameters, target: input.target, priors_applied: priorsApplied, credibility: input.credibility, sides: input.sides, multiplier, networks };
}
