import { collectSymbols, type Node } from "../expr/ast.ts";
import { isExpressionError } from "../expr/errors.ts";
import { printExpression } from "../expr/print.ts";
import type { SymbolicPool } from "../expr/pool.ts";
import { expandAst, type SymbolTable } from "../expr/symbols.ts";
import { compareBeta } from "./compare.ts";
import { DerivationError } from "./derive-error.ts";
import { diagnoseRatio } from "./diagnose.ts";
import { phaseExponent } from "./pn-order-check.ts";
import { derivePropagation } from "./propagation.ts";
import type { CheckResult, MappingInput, PropagationInput } from "./types.ts";

const fail = (message: string): CheckResult => ({ name: "propagation", ok: false, severity: "error", message });

/**
 * Re-derives beta from the stated dispersion relation (Mirshekari, Yunes & Will 2012) and compares
 * it with the typed one. A mismatch is explained when it is a usual slip: pi for pi^2, a mass in the
 * detector frame ((1 + z) factors), the group velocity instead of p/E, the luminosity distance
 * instead of the propagation distance D_alpha.
 */
export async function propagationCheck(
  input: MappingInput,
  propagation: PropagationInput,
  ast: Node,
  table: SymbolTable,
  pool: SymbolicPool,
): Promise<CheckResult> {
  if (input.target !== "ppe_phase") {
    return { name: "propagation", ok: true, severity: "warning", message: "a propagation effect is derived as a ppE phase term; not compared for this target" };
  }
  const typedSymbols = new Set(collectSymbols(expandAst(ast, table, { builtins: false })).keys());
  const alphaZero = propagation.alpha_md === 0;
  // A massive graviton may be written with D_alpha at alpha = 0, which is D_0.
  const distance = alphaZero && typedSymbols.has("D_alpha") && !typedSymbols.has("D_0") ? "D_alpha" : alphaZero ? "D_0" : "D_alpha";
  let derived;
  try {
    derived = derivePropagation(propagation, table, { distance });
  } catch (err) {
    if (err instanceof DerivationError || isExpressionError(err)) return fail(err.message);
    throw err;
  }
  const notes = derived.notes.length > 0 ? ` (${derived.notes.join("; ")})` : "";
  const stated = input.b ?? (input.pn_order === undefined ? undefined : phaseExponent(input.pn_order));
  if (stated !== undefined && Math.abs(stated - derived.b) > 1e-9) {
    return fail(`a dispersion with alpha = ${propagation.alpha_md} enters at b = 3 (alpha - 1) = ${derived.b}, but b = ${stated} was stated`);
  }
  const text = printExpression(derived.beta);
  const r = await compareBeta(ast, derived.beta, table, { pool });
  if (r.equal) {
    return {
      name: "propagation",
      ok: true,
      message: `the stated beta equals ${text}, derived from E^2 = p^2 + A p^${propagation.alpha_md} with the particle speed p/E and source-frame Mc (Mirshekari, Yunes & Will 2012) [method: ${r.method}]${notes}`,
    };
  }
  const hints: string[] = [];
  const why = diagnoseRatio(ast, derived.beta, table, propagation.alpha_md);
  if (why !== undefined) hints.push(why);
  if (!typedSymbols.has(distance)) {
    const other = ["D", "D_0", "D_alpha"].filter((d) => d !== distance && typedSymbols.has(d));
    hints.push(`the effect accumulates over the distance measure ${distance}${other.length > 0 ? `, not ${other.join(" or ")}` : ", which the stated beta does not use"}`);
  }
  return fail(`the stated beta differs from ${text}, derived from E^2 = p^2 + A p^${propagation.alpha_md} (Mirshekari, Yunes & Will 2012): ${hints.length > 0 ? `${hints.join("; ")}; ` : ""}${r.message}${notes}`);
}
