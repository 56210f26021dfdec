/**
 * Compiles a catalogue entry's ringdown mapping (a fractional QNM frequency or damping-time shift as
 * a function of one coupling, in the remnant's M_f and chi_f and the binary's variables) into a plain
 * function, with its validity conditions. Ringdown mappings have no ppE exponent, so they do not pass
 * through the inspiral compiler.
 */
import { thresholdText } from "../../../common/number-text.ts";
import { lengthPower } from "../catalogue-mapping.ts";
import { compileExpression } from "../expr/compile.ts";
import { guardExpression } from "../expr/guard.ts";
import { createSymbolTable, expandDefinitions, type SymbolTable } from "../expr/symbols.ts";
import { PhysicsInputError } from "../input-error.ts";
import { isQnmMode, type QnmMode } from "./qnm.ts";

export type RingdownKind = "ringdown_frequency" | "ringdown_damping";
/** Fractional shift of the remnant's mass (dM_f/M_f) or spin (dchi_f/chi_f) the theory causes. */
export type RemnantKind = "remnant_mass" | "remnant_spin";
export type CouplingRange = "positive" | "non_negative" | "any_sign";

export interface RingdownEntry {
  readonly slug: string;
  readonly couplings: readonly {
    readonly symbol: string;
    readonly latex: string;
    /** Power of length (2 for length^2), or the "L^2" notation. */
    readonly dimension: number | string;
    readonly unit: string;
    readonly range?: CouplingRange | undefined;
  }[];
  readonly definitions?: readonly { readonly symbol: string; readonly expression: string }[];
  readonly mappings: readonly {
    readonly kind: string;
    readonly mode?: { readonly l: number; readonly m: number; readonly n: number } | undefined;
    readonly expression: string;
    readonly latex?: string | undefined;
    readonly coupling?: string | undefined;
    readonly held_fixed?: Readonly<Record<string, number>> | undefined;
    readonly validity?: readonly { readonly expression: string; readonly max: number; readonly label: string; readonly kind?: "hard" | "rule_of_thumb" }[];
    readonly source_status?: "confirmed" | "derived" | "memory";
    readonly notes?: string | undefined;
  }[];
}

export interface RingdownValidity {
  readonly label: string;
  readonly condition: string;
  readonly max: number;
  readonly kind: "hard" | "rule_of_thumb";
  /** Symbols the condition needs beyond the coupling. */
  readonly uses: readonly string[];
  readonly evaluate: (x: number, env: Readonly<Record<string, number>>) => number;
}

export interface CompiledRingdownMapping {
  readonly slug: string;
  readonly index: number;
  readonly kind: RingdownKind;
  readonly mode: QnmMode;
  readonly coupling: { readonly symbol: string; readonly latex: string; readonly unit: string; readonly dimension: number; readonly range: CouplingRange };
  readonly expression: string;
  readonly latex?: string;
  readonly sourceStatus: "confirmed" | "derived" | "memory";
  /** Symbols the shift needs beyond the coupling (M_f, chi_f, m1 ...). */
  readonly uses: readonly string[];
  readonly evaluate: (x: number, env: Readonly<Record<string, number>>) => number;
  readonly validity: readonly RingdownValidity[];
  readonly notes?: string;
}

export function modeKey(mode: { l: number; m: number; n: number } | undefined): QnmMode {
  const key = mode ? `${mode.l}${mode.m}${mode.n}` : "220";
  if (!isQnmMode(key)) throw new PhysicsInputError("mode", `mode (${mode?.l},${mode?.m},${mode?.n}) has no Kerr fit here; fits exist for 220, 221, 330, 210, 440`);
  return key;
}

function compileIn(expression: string, table: SymbolTable, args: readonly string[], heldFixed: Readonly<Record<string, number>>, couplingSymbol: string) {
  const expanded = expandDefinitions(expression, table);
  const used = [...guardExpression(expanded, { symbols: args }).symbols.keys()];
  const fn = compileExpression(expanded, args);
  const couplingIndex = args.indexOf(couplingSymbol);
  const fixed = Object.entries(heldFixed).map(([k, v]) => [args.indexOf(k), v] as const);
  const evaluate = (x: number, env: Readonly<Record<string, number>>) => {
    const values = new Float64Array(args.length);
    args.forEach((name, k) => (values[k] = env[name] ?? Number.NaN));
    for (const [k, v] of fixed) if (k >= 0) values[k] = v;
    values[couplingIndex] = x;
    return fn(values);
  };
  return { evaluate, uses: used.filter((s) => s !== couplingSymbol && !(s in heldFixed)) };
}

/** Compiles mapping `index` of the entry, which must be a ringdown mapping. */
export function compileRingdownMapping(entry: RingdownEntry, index: number): CompiledRingdownMapping {
  const m = entry.mappings[index];
  if (!m) throw new RangeError(`${entry.slug} has no mapping ${index}`);
  if (m.kind !== "ringdown_frequency" && m.kind !== "ringdown_damping") throw new PhysicsInputError("kind", `mapping ${index} of ${entry.slug} is not a ringdown mapping`);
  return { ...compileShift(entry, index), kind: m.kind, mode: modeKey(m.mode) };
}

/** The shift a remnant mapping gives, as a function of the coupling, like a ringdown mapping but with no mode. */
export type CompiledRemnantMapping = Omit<CompiledRingdownMapping, "kind" | "mode"> & { readonly kind: RemnantKind };

/** Compiles mapping `index` of the entry, which must be a remnant mapping (remnant_mass or remnant_spin). */
export function compileRemnantMapping(entry: RingdownEntry, index: number): CompiledRemnantMapping {
  const m = entry.mappings[index];
  if (!m) throw new RangeError(`${entry.slug} has no mapping ${index}`);
  if (m.kind !== "remnant_mass" && m.kind !== "remnant_spin") throw new PhysicsInputError("kind", `mapping ${index} of ${entry.slug} is not a remnant mapping`);
  return { ...compileShift(entry, index), kind: m.kind };
}

function compileShift(entry: RingdownEntry, index: number): Omit<CompiledRingdownMapping, "kind" | "mode"> {
  const m = entry.mappings[index]!;
  const symbol = m.coupling ?? entry.couplings[0]?.symbol;
  const c = entry.couplings.find((k) => k.symbol === symbol);
  if (!c || symbol === undefined) throw new PhysicsInputError("coupling", `${entry.slug}: mapping ${index} names no declared coupling`);
  const dimension = typeof c.dimension === "number" ? c.dimension : lengthPower(c.dimension);
  const table = createSymbolTable({
    couplings: entry.couplings.map((k) => ({ symbol: k.symbol, dimension: typeof k.dimension === "number" ? k.dimension : lengthPower(k.dimension) })),
    definitions: entry.definitions ?? [],
  });
  const args = table.primitives;
  const held = m.held_fixed ?? {};
  const main = compileIn(m.expression, table, args, held, symbol);
  const others = main.uses.filter((s) => table.couplings.includes(s));
  if (others.length > 0) throw new PhysicsInputError("held_fixed", `${entry.slug}: the ringdown expression also uses ${others.join(", ")}; hold them fixed`);
  return {
    slug: entry.slug,
    index,
    coupling: { symbol, latex: c.latex, unit: c.unit, dimension, range: c.range ?? "any_sign" },
    expression: m.expression,
    ...(m.latex ? { latex: m.latex } : {}),
    sourceStatus: m.source_status ?? "confirmed",
    uses: main.uses,
    evaluate: main.evaluate,
    validity: (m.validity ?? []).map((v) => {
      const k = compileIn(v.expression, table, args, held, symbol);
      return { label: v.label, condition: `${v.expression} <= ${thresholdText(v.max)}`, max: v.max, kind: v.kind ?? "rule_of_thumb", uses: k.uses, evaluate: k.evaluate };
    }),
    ...(m.notes ? { notes: m.notes } : {}),
  };
}
