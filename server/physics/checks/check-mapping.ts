import type { Node } from "../expr/ast.ts";
import { ExpressionError, isExpressionError } from "../expr/errors.ts";
import { guardExpression } from "../expr/guard.ts";
import { toLatex } from "../expr/latex.ts";
import { getSymbolicPool, type SymbolicPool } from "../expr/pool.ts";
import { assertWithinBudget, createSymbolTable, type SymbolTable } from "../expr/symbols.ts";
import { compareBeta, type BetaComparison } from "./compare.ts";
import { DerivationError, deriveBeta } from "./derive.ts";
import { dimensionCheck } from "./dimension-check.ts";
import { prepare } from "./evaluate.ts";
import { diagnoseRatio } from "./diagnose.ts";
import { grLimitCheck, type GrValues } from "./gr-limit-check.ts";
import { phaseExponent, pnOrderCheck } from "./pn-order-check.ts";
import { propagationCheck } from "./propagation-check.ts";
import { isDipoleMapping, symmetryCheck } from "./symmetry-check.ts";
import { MAPPING_TARGETS, type CheckResult, type MappingInput, type MappingReport } from "./types.ts";

export interface CheckMappingOptions {
  /** Symbolic pool for the CAS steps (default: the shared pool). */
  readonly pool?: SymbolicPool;
  /** Called with each check as it is added (a check worker streams them to the main thread). */
  readonly onCheck?: (check: CheckResult) => void;
}

const fail = (name: CheckResult["name"], message: string): CheckResult => ({ name, ok: false, severity: "error", message });

/**
 * Runs every check on a contributed mapping and reports each separately. Never throws for a bad
 * expression (that is a failed check); throws ExpressionError only when the input is not a
 * mapping at all.
 */
export async function checkMapping(input: MappingInput, options: CheckMappingOptions = {}): Promise<MappingReport> {
  validateShape(input);
  const checks: CheckResult[] = [];
  const onCheck = options.onCheck;
  if (onCheck !== undefined) {
    // Every check below is added with push: observing push streams each one, however many there are.
    // Not enumerable, so the report still crosses a thread boundary as plain data.
    const push = checks.push.bind(checks);
    Object.defineProperty(checks, "push", {
      enumerable: false,
      value: (...items: CheckResult[]) => {
        for (const item of items) onCheck(item);
        return push(...items);
      },
    });
  }
  const report = (latex: string | null): MappingReport => ({ ok: checks.every((c) => c.ok), checks, latex });

  let ast: Node;
  try {
    ast = guardExpression(input.expression).ast;
    checks.push({ name: "parse", ok: true, message: "expression parses" });
  } catch (err) {
    if (!isExpressionError(err)) throw err;
    checks.push(fail("parse", err.message));
    return report(null);
  }
  const latex = toLatex(ast);

  let table: SymbolTable;
  try {
    table = createSymbolTable({ couplings: input.couplings, definitions: input.definitions ?? [] });
    guardExpression(input.expression, { symbols: table.names });
    checks.push({ name: "symbols", ok: true, message: "every symbol is declared" });
  } catch (err) {
    if (!isExpressionError(err)) throw err;
    checks.push(fail("symbols", err.message));
    return report(latex);
  }

  // The evaluation budget, before any work: throws (a 400 naming the field) when an expression
  // is over it once its definitions are substituted.
  assertBudget(input, ast, table);

  const pool = options.pool ?? getSymbolicPool();
  let prepared;
  try {
    prepared = prepare(ast, table);
  } catch (err) {
    if (!isExpressionError(err)) throw err;
    checks.push(fail("dimension", `expression could not be evaluated: ${err.message}`));
    return report(latex);
  }
  checks.push(dimensionCheck(ast, prepared, table, input.target));
  checks.push(await grLimitCheck(prepared, table, input.target, pool, grValuesOf(input)));
  const pn = pnOrderCheck(input);
  if (pn !== undefined) checks.push(pn);
  if (isDipoleMapping(input)) checks.push(symmetryCheck(prepared, table));
  const { propagation, ...balance } = input.derivation ?? {};
  if (balance.energy !== undefined || balance.flux !== undefined || balance.frequency_drift !== undefined || (input.derivation !== undefined && propagation === undefined)) {
    checks.push(await derivationCheck({ ...input, derivation: balance }, ast, table, pool));
  }
  if (propagation !== undefined) checks.push(await propagationCheck(input, propagation, ast, table, pool));
  return report(latex);
}

async function derivationCheck(input: MappingInput, ast: Node, table: SymbolTable, pool: SymbolicPool): Promise<CheckResult> {
  if (input.target !== "ppe_phase" && input.target !== "ppe_amplitude") {
    return { name: "derivation", ok: true, severity: "warning", message: "a derivation from energy and flux applies to ppE targets only; not compared" };
  }
  let derivation;
  try {
    derivation = deriveBeta(input.derivation ?? {}, table);
  } catch (err) {
    if (err instanceof DerivationError || isExpressionError(err)) return fail("derivation", err.message);
    throw err;
  }
  const notes = derivation.notes.length > 0 ? ` (${derivation.notes.join("; ")})` : "";
  const phase = input.target === "ppe_phase";
  const stated = phase
    ? (input.b ?? (input.pn_order === undefined ? undefined : phaseExponent(input.pn_order)))
    : (input.a ?? (input.pn_order === undefined ? undefined : 2 * input.pn_order));
  const candidates = phase
    ? derivation.terms.map((t) => ({ exponent: t.b, expression: t.beta }))
    : (derivation.amplitude ?? []).map((t) => ({ exponent: t.a, expression: t.alpha, note: t.note }));
  const letter = phase ? "b" : "a";
  if (candidates.length === 0) {
    const why = phase ? "the derivation gives no phase term" : "an amplitude correction is derived from an energy and flux change or a frequency drift (its drift piece), not from a propagation effect";
    return fail("derivation", `${why}${notes}`);
  }
  const matching = stated === undefined ? candidates : candidates.filter((c) => Math.abs(c.exponent - stated) < 1e-9);
  if (matching.length === 0 || (stated === undefined && candidates.length > 1)) {
    const found = candidates.map((c) => `${letter} = ${c.exponent}`).join(", ");
    const message =
      stated === undefined
        ? `the derivation gives terms at ${found}; state ${letter} to choose one`
        : `the derivation gives ${found}, but ${letter} = ${stated} was stated`;
    return fail("derivation", message + notes);
  }
  const verdicts: Array<{ c: (typeof matching)[number]; r: BetaComparison }> = [];
  for (const c of matching) verdicts.push({ c, r: await compareBeta(ast, c.expression, table, { pool }) });
  const bad = verdicts.find((v) => !v.r.equal);
  const quantity = phase ? "beta" : "alpha";
  if (bad !== undefined) {
    const why = diagnoseRatio(ast, bad.c.expression, table);
    return fail("derivation", `the stated ${quantity} differs from the derived ${bad.c.expression} at ${letter} = ${bad.c.exponent}: ${why !== undefined ? `${why}; ` : ""}${bad.r.message} [method: ${bad.r.method}]${notes}`);
  }
  const method = (r: BetaComparison): string =>
    r.method === "numeric" && r.symbolic === "timeout" ? "numeric (the CAS timed out)" : r.method;
  const methods = [...new Set(verdicts.map((v) => method(v.r)))].join(" and ");
  const first = verdicts[0];
  const pieceNote = first && "note" in first.c && first.c.note ? ` (${first.c.note})` : "";
  return {
    name: "derivation",
    ok: true,
    message: `the stated ${quantity} equals the derived ${first?.c.expression} at ${letter} = ${first?.c.exponent} [method: ${methods}]${notes}${pieceNote}`,
  };
}

/** The declared GR value of each coupling, by symbol (only well-formed declarations). */
function grValuesOf(input: MappingInput): GrValues {
  const out: Record<string, "zero" | "infinity"> = {};
  for (const c of input.couplings) {
    if (c !== null && typeof c === "object" && typeof c.symbol === "string" && (c.gr_value === "zero" || c.gr_value === "infinity")) out[c.symbol] = c.gr_value;
  }
  return out;
}

const DERIVATION_FIELDS = ["energy", "flux", "frequency_drift"] as const;

function assertBudget(input: MappingInput, ast: Node, table: SymbolTable): void {
  assertWithinBudget(ast, table, "expression");
  for (const key of DERIVATION_FIELDS) {
    const coefficient = input.derivation?.[key]?.coefficient;
    if (typeof coefficient !== "string") continue;
    let parsed: Node;
    try {
      parsed = guardExpression(coefficient, { symbols: table.names }).ast;
    } catch (err) {
      if (isExpressionError(err)) continue; // the derivation check reports it
      throw err;
    }
    assertWithinBudget(parsed, table, `derivation.${key}.coefficient`);
  }
  const dispersion = input.derivation?.propagation?.coefficient;
  if (typeof dispersion === "string") {
    try {
      assertWithinBudget(guardExpression(dispersion, { symbols: table.names }).ast, table, "derivation.propagation.coefficient");
    } catch (err) {
      if (!isExpressionError(err)) throw err; // the propagation check reports it
    }
  }
}

function validateShape(input: MappingInput): void {
  if (input === null || typeof input !== "object") throw new ExpressionError("bad_input", "a mapping must be an object");
  if (typeof input.expression !== "string") throw new ExpressionError("bad_input", "expression must be a string");
  if (!MAPPING_TARGETS.includes(input.target)) {
    throw new ExpressionError("bad_input", `target must be one of ${MAPPING_TARGETS.join(", ")}`);
  }
  if (!Array.isArray(input.couplings)) throw new ExpressionError("bad_input", "couplings must be a list");
  if (input.definitions !== undefined && !Array.isArray(input.definitions)) {
    throw new ExpressionError("bad_input", "definitions must be a list");
  }
  if (input.derivation !== undefined && (input.derivation === null || typeof input.derivation !== "object")) {
    throw new ExpressionError("bad_input", "derivation must be an object");
  }
}
