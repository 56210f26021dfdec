import type { CheckResult, ChecksReport, Mapping, MappingKind, TheoryEntry } from "../../../common/catalogue.ts";
import { ValidationError, type FieldErrors } from "../../errors.ts";
import type { DerivationInput, MappingInput, MappingReport, MappingTarget } from "../../physics/checks/types.ts";
import { isExpressionError } from "../../physics/expr/errors.ts";
import { budgetMessage, ExpressionBudgetError } from "../../physics/expr/symbols.ts";

/** The check workers, as the catalogue needs them (injected, so the catalogue does not pick the engine's internals). */
export interface EntryCheckRunner {
  guard(client: string, fields: ReadonlyArray<readonly [string, string]>): Promise<Record<string, string>>;
  mappings(client: string, inputs: readonly MappingInput[]): Promise<Array<MappingReport | Error>>;
}

const TARGETS: Record<MappingKind, MappingTarget> = {
  inspiral_phase: "ppe_phase",
  inspiral_amplitude: "ppe_amplitude",
  ringdown_frequency: "ringdown_frequency",
  ringdown_damping: "ringdown_damping",
  remnant_mass: "remnant_mass",
  remnant_spin: "remnant_spin",
};

/** Every expression of the entry with its field path, for the guard. */
function expressionFields(entry: TheoryEntry): [string, string][] {
  const out: [string, string][] = [];
  entry.definitions.forEach((d, i) => out.push([`definitions.${i}.expression`, d.expression]));
  entry.mappings.forEach((m, i) => {
    out.push([`mappings.${i}.expression`, m.expression]);
    m.validity.forEach((v, j) => out.push([`mappings.${i}.validity.${j}.expression`, v.expression]));
    for (const k of ["A", "B", "gamma"] as const) {
      const e = m.derivation?.[k];
      if (e !== undefined) out.push([`mappings.${i}.derivation.${k}`, e]);
    }
    if (m.gimr_equivalent) out.push([`mappings.${i}.gimr_equivalent.expression`, m.gimr_equivalent.expression]);
  });
  return out;
}

/**
 * Expressions the guard refuses (forbidden syntax, unknown functions, too long or deep) are not
 * saved at all: 400 naming each field, under `prefix` ("theory." for a submission body). Expressions
 * that parse are saved even when later checks fail, so a theorist can keep a draft.
 */
export async function guardEntryExpressions(entry: TheoryEntry, runner: EntryCheckRunner, client: string, prefix = "theory."): Promise<void> {
  const refused = await runner.guard(client, expressionFields(entry));
  const fields: FieldErrors = {};
  for (const [path, message] of Object.entries(refused)) fields[`${prefix}${path}`] = message;
  const first = Object.entries(fields)[0];
  if (first) throw new ValidationError(`Invalid request body: ${first[0]}: ${first[1]}`, fields);
}

/** The engine's derivation input from the entry's: E / flux change at one order, or a frequency-drift change. */
export function derivationInput(m: Mapping): DerivationInput | undefined {
  const d = m.derivation;
  if (!d) return undefined;
  if (d.kind === "energy_flux") {
    const out: { energy?: { order: number; coefficient: string }; flux?: { order: number; coefficient: string } } = {};
    if (d.A !== undefined) out.energy = { order: d.order, coefficient: d.A };
    if (d.B !== undefined) out.flux = { order: d.order, coefficient: d.B };
    return out.energy || out.flux ? out : undefined;
  }
  if (d.kind === "frequency_drift" && d.gamma !== undefined) return { frequency_drift: { order: d.order, coefficient: d.gamma } };
  // Propagation: A is the dispersion coefficient (E^2 = p^2 + A p^alpha_md, as a power of length);
  // alpha_md is the mapping's, or follows from the order (n = (3 alpha_md + 2) / 2).
  if (d.kind === "propagation" && d.A !== undefined) {
    const alpha = m.alpha_md ?? (2 * d.order - 2) / 3;
    return { propagation: { alpha_md: alpha, coefficient: d.A, order: d.order } };
  }
  return undefined;
}

function toResult(path: string, r: MappingReport["checks"][number]): CheckResult {
  return { path, name: r.name, ok: r.ok, severity: r.severity ?? (r.ok ? "info" : "error"), message: r.message };
}

/** The engine's field names inside a mapping, as paths in the entry. */
const ENTRY_FIELDS: Record<string, string> = {
  expression: "expression",
  "derivation.energy.coefficient": "derivation.A",
  "derivation.flux.coefficient": "derivation.B",
  "derivation.frequency_drift.coefficient": "derivation.gamma",
  "derivation.propagation.coefficient": "derivation.A",
};

/** An expression over the evaluation budget: nothing is saved, the 400 names it. */
interface OverBudget {
  readonly field: string;
  readonly message: string;
}

/** One engine result; declarations it cannot use at all (a bad coupling or definition) become a failed check. */
function resultOf(r: MappingReport | Error, path: string): CheckResult[] | OverBudget {
  if (!(r instanceof Error)) return r.checks.map((c) => toResult(path, c));
  if (r instanceof ExpressionBudgetError) {
    const field = `${path}.${ENTRY_FIELDS[r.field] ?? r.field}`;
    return { field, message: budgetMessage(field, r.size, r.cap) };
  }
  if (!isExpressionError(r)) throw r;
  return [{ path, name: "declarations", ok: false, severity: "error", message: r.message }];
}

/**
 * Runs the engine on every mapping and every validity condition of the entry. The report is stored
 * with the submission (and, once accepted, with the revision and on each mapping row).
 */
export async function checkEntry(entry: TheoryEntry, runner: EntryCheckRunner, client: string, now: Date, prefix = "theory."): Promise<ChecksReport> {
  const couplings = entry.couplings.map((c) => ({
    symbol: c.symbol,
    dimension: c.dimension,
    ...(c.description ? { description: c.description } : {}),
    ...(c.gr_value ? { gr_value: c.gr_value } : {}),
    ...(c.range ? { range: c.range } : {}),
  }));
  const definitions = entry.definitions.map((d) => ({ symbol: d.symbol, expression: d.expression }));
  const jobs: Array<{ input: MappingInput; path: string }> = [];
  entry.mappings.forEach((m, i) => {
    const input: MappingInput = {
      expression: m.expression,
      target: TARGETS[m.kind],
      couplings,
      definitions,
      ...(m.b === undefined ? {} : { b: m.b }),
      ...(m.a === undefined ? {} : { a: m.a }),
      ...(m.pn_order === undefined ? {} : { pn_order: m.pn_order }),
    };
    const derivation = derivationInput(m);
    jobs.push({ input: derivation ? { ...input, derivation } : input, path: `mappings.${i}` });
    m.validity.forEach((v, j) => jobs.push({ input: { expression: v.expression, target: "validity", couplings, definitions }, path: `mappings.${i}.validity.${j}` }));
  });
  const reports = await runner.mappings(
    client,
    jobs.map((j) => j.input),
  );
  const settled = reports.map((r, k) => resultOf(r, jobs[k]?.path ?? ""));
  const fields: FieldErrors = {};
  const results: CheckResult[] = [];
  for (const r of settled) {
    if (Array.isArray(r)) results.push(...r);
    else fields[`${prefix}${r.field}`] = `${prefix}${r.message}`;
  }
  const first = Object.entries(fields)[0];
  if (first) throw new ValidationError(`Invalid request body: ${first[1]}`, fields);
  const failures = results.filter((r) => !r.ok && r.severity === "error").length;
  const warnings = results.filter((r) => r.severity === "warning").length;
  const inconclusive = results.filter((r) => r.severity === "inconclusive").length;
  return { ok: failures === 0 && inconclusive === 0, failures, warnings, inconclusive, results, checked_at: now.toISOString() };
}
