import type { CheckResult, MappingInput } from "./types.ts";

const EPS = 1e-9;
const same = (x: number, y: number): boolean => Math.abs(x - y) <= EPS;
const isNum = (x: unknown): x is number => typeof x === "number" && Number.isFinite(x);
const pn = (n: number): string => `${Number(n.toFixed(6))}PN`;

/** Source: Yunes & Pretorius 2009, PRD 80 122003 (arXiv:0909.3328): b = 2n - 5, a = 2n. */
export function phaseExponent(n: number): number {
  return 2 * n - 5;
}

export function degeneracyNote(b: number): string | undefined {
  if (same(b, 0)) return "b = 0 (2.5PN) is degenerate with the coalescence phase: no bound exists there";
  if (same(b, 3)) return "b = 3 (4PN) is degenerate with the coalescence time: no bound exists there";
  return undefined;
}

/**
 * The stated exponent and PN order must agree: b = 2n - 5 for the phase, a = 2n for the
 * amplitude. Returns undefined for targets that have no PN order (ringdown, validity).
 */
export function pnOrderCheck(input: MappingInput): CheckResult | undefined {
  if (input.target !== "ppe_phase" && input.target !== "ppe_amplitude") return undefined;
  const phase = input.target === "ppe_phase";
  const letter = phase ? "b" : "a";
  const stated = phase ? input.b : input.a;
  const n = input.pn_order;
  for (const [label, v] of [[letter, stated], ["pn_order", n]] as const) {
    if (v !== undefined && !isNum(v)) {
      return { name: "pn_order", ok: false, severity: "error", message: `${label} must be a finite number` };
    }
  }
  const fromN = (order: number): number => (phase ? phaseExponent(order) : 2 * order);
  const toN = (exp: number): number => (phase ? (exp + 5) / 2 : exp / 2);
  const rule = phase ? "b = 2n - 5" : "a = 2n";
  let exponent: number;
  let message: string;
  if (stated !== undefined && n !== undefined) {
    if (!same(fromN(n), stated)) {
      return {
        name: "pn_order",
        ok: false,
        severity: "error",
        message: `${letter} = ${stated} is a ${pn(toN(stated))} correction (${rule}), but pn_order = ${n} was stated, which gives ${letter} = ${fromN(n)}`,
      };
    }
    exponent = stated;
    message = `${letter} = ${stated} matches pn_order = ${n} (${rule})`;
  } else if (stated !== undefined) {
    exponent = stated;
    message = `${letter} = ${stated} is a ${pn(toN(stated))} correction (${rule})`;
  } else if (n !== undefined) {
    exponent = fromN(n);
    message = `pn_order = ${n} gives ${letter} = ${exponent} (${rule})`;
  } else {
    return { name: "pn_order", ok: false, severity: "error", message: `state ${letter} or pn_order (${rule})` };
  }
  const degenerate = phase ? degeneracyNote(exponent) : undefined;
  if (degenerate !== undefined) return { name: "pn_order", ok: true, severity: "warning", message: `${message}; ${degenerate}` };
  return { name: "pn_order", ok: true, message };
}
