import { ExpressionError, isExpressionError, type ExpressionErrorCode } from "../expr/errors.ts";
import { guardExpression } from "../expr/guard.ts";
import type { SymbolicPool } from "../expr/pool.ts";
import { createSymbolTable, ExpressionBudgetError, type CouplingDeclaration, type DefinitionDeclaration } from "../expr/symbols.ts";
import { checkMapping } from "./check-mapping.ts";
import { DerivationError, deriveBeta, type Derivation, type DerivationErrorCode } from "./derive.ts";
import type { CheckResult, DerivationInput, MappingInput, MappingReport } from "./types.ts";

/**
 * The work a check worker does (check-worker-main.ts runs it; check-pool.ts sends it). Everything
 * that reads untrusted expression text happens here: the guard, the symbol table, the budget, the
 * expansion, compilation and the checks. Results and errors cross the thread boundary as plain data.
 */
export type CheckJob =
  /** The guard alone on several expressions: [field path, text] in, field path -> message out. */
  | { readonly kind: "guard"; readonly fields: ReadonlyArray<readonly [string, string]> }
  /** checkMapping; with `refuse`, guard errors of those codes come back as errors, not as a report. */
  | { readonly kind: "mapping"; readonly input: MappingInput; readonly refuse?: readonly ExpressionErrorCode[] }
  | {
      readonly kind: "derive";
      readonly input: DerivationInput;
      readonly couplings: readonly CouplingDeclaration[];
      readonly definitions: readonly DefinitionDeclaration[];
      readonly evaluate_at?: Readonly<Record<string, number>>;
    };

export type JobError =
  | {
      readonly type: "expression";
      readonly code: ExpressionErrorCode;
      readonly message: string;
      readonly token: string;
      readonly position: number;
      readonly definition?: string;
      readonly budget?: { readonly field: string; readonly size: number; readonly cap: number };
    }
  | { readonly type: "derivation"; readonly code: DerivationErrorCode; readonly message: string; readonly field: string };

export type JobValue =
  | { readonly kind: "guard"; readonly fields: Readonly<Record<string, string>> }
  | { readonly kind: "mapping"; readonly report: MappingReport }
  | { readonly kind: "derive"; readonly derivation: Derivation };

export type JobOutcome = { readonly ok: true; readonly value: JobValue } | { readonly ok: false; readonly error: JobError };

export interface JobContext {
  /** The CAS (in a worker: the main thread's pool, through a transport). */
  readonly pool: SymbolicPool;
  /** Each check as soon as it is known, so a job stopped by its time limit still reports what finished. */
  readonly onCheck?: (check: CheckResult) => void;
}

export async function runCheckJob(job: CheckJob, ctx: JobContext): Promise<JobOutcome> {
  try {
    return { ok: true, value: await run(job, ctx) };
  } catch (err) {
    const error = toJobError(err);
    if (error === undefined) throw err;
    return { ok: false, error };
  }
}

async function run(job: CheckJob, ctx: JobContext): Promise<JobValue> {
  switch (job.kind) {
    case "guard": {
      const fields: Record<string, string> = {};
      for (const [path, source] of job.fields) {
        try {
          guardExpression(source);
        } catch (err) {
          if (!isExpressionError(err)) throw err;
          fields[path] = err.message;
        }
      }
      return { kind: "guard", fields };
    }
    case "mapping": {
      if (job.refuse !== undefined && job.refuse.length > 0) {
        try {
          guardExpression(job.input.expression);
        } catch (err) {
          if (isExpressionError(err) && job.refuse.includes(err.code)) throw err;
          if (!isExpressionError(err)) throw err;
        }
      }
      const report = await checkMapping(job.input, { pool: ctx.pool, ...(ctx.onCheck ? { onCheck: ctx.onCheck } : {}) });
      return { kind: "mapping", report };
    }
    case "derive": {
      const table = createSymbolTable({ couplings: job.couplings, definitions: job.definitions });
      const derivation = deriveBeta(job.input, table, job.evaluate_at ? { evaluate_at: job.evaluate_at } : {});
      return { kind: "derive", derivation };
    }
  }
}

function toJobError(err: unknown): JobError | undefined {
  if (err instanceof DerivationError) return { type: "derivation", code: err.code, message: err.message, field: err.field };
  if (!isExpressionError(err)) return undefined;
  return {
    type: "expression",
    code: err.code,
    message: err.message,
    token: err.token,
    position: err.position,
    ...(err.definition !== undefined ? { definition: err.definition } : {}),
    ...(err instanceof ExpressionBudgetError ? { budget: { field: err.field, size: err.size, cap: err.cap } } : {}),
  };
}

/** The error again, on the calling side, as the class the routes already map to a 400. */
export function fromJobError(e: JobError): Error {
  if (e.type === "derivation") return new DerivationError(e.code, e.message, e.field);
  if (e.budget !== undefined) return new ExpressionBudgetError(e.budget.field, e.budget.size, e.budget.cap);
  return new ExpressionError(e.code, e.message, e.token, e.position, e.definition);
}
