import { ServiceUnavailableError, TooManyRequestsError } from "../../errors.ts";
import { fromJobError, runCheckJob, type CheckJob, type JobOutcome, type JobValue } from "../../physics/checks/check-job.ts";
import { CheckBusyError, type CheckPool, type JobRun } from "../../physics/checks/check-pool.ts";
import type { Derivation } from "../../physics/checks/derive.ts";
import type { CheckResult, DerivationInput, MappingInput, MappingReport } from "../../physics/checks/types.ts";
import type { ExpressionErrorCode } from "../../physics/expr/errors.ts";
import { getSymbolicPool } from "../../physics/expr/pool.ts";
import type { CouplingDeclaration, DefinitionDeclaration } from "../../physics/expr/symbols.ts";

/**
 * The routes' side of the check workers: jobs in, reports or the errors the routes already map to
 * 400s out. Busy workers become 429 (this client has enough in flight) or 503 (queue full), both
 * with Retry-After. A job stopped by its time limit is never a verdict: its unfinished checks come
 * back as one "inconclusive" check.
 */
export interface CheckRunner {
  /** The guard alone: field path -> message for each expression it refuses. */
  guard(client: string, fields: ReadonlyArray<readonly [string, string]>): Promise<Record<string, string>>;
  /** One mapping; guard errors with a code in `refuse` are thrown instead of reported. */
  mapping(client: string, input: MappingInput, refuse?: readonly ExpressionErrorCode[]): Promise<MappingReport>;
  /** Several mappings of one request (a theory entry); each gives its report or the error it threw. */
  mappings(client: string, inputs: readonly MappingInput[]): Promise<Array<MappingReport | Error>>;
  derive(
    client: string,
    input: DerivationInput,
    declarations: { couplings: readonly CouplingDeclaration[]; definitions: readonly DefinitionDeclaration[]; evaluate_at?: Readonly<Record<string, number>> },
  ): Promise<Derivation>;
}

export function createCheckRunner(pool: CheckPool): CheckRunner {
  async function runAll(client: string, jobs: readonly CheckJob[]): Promise<JobRun[]> {
    try {
      return await pool.run(client, jobs);
    } catch (err) {
      if (err instanceof CheckBusyError) {
        throw err.scope === "client" ? new TooManyRequestsError(err.message, err.retryAfterSeconds) : new ServiceUnavailableError(err.message, err.retryAfterSeconds);
      }
      throw err;
    }
  }

  const value = <K extends JobValue["kind"]>(outcome: JobOutcome, kind: K): Extract<JobValue, { kind: K }> => {
    if (!outcome.ok) throw fromJobError(outcome.error);
    if (outcome.value.kind !== kind) throw new Error(`check worker answered ${outcome.value.kind} to a ${kind} job`);
    return outcome.value as Extract<JobValue, { kind: K }>;
  };

  const stoppedWork = (what: string, run: Extract<JobRun, { kind: "stopped" }>) =>
    new ServiceUnavailableError(`The ${what} ${run.reason}; try again shortly.`, 5);

  const one = async (client: string, job: CheckJob): Promise<JobRun> => {
    const [run] = await runAll(client, [job]);
    if (run === undefined) throw new Error("the check pool returned no result");
    return run;
  };

  const mappingReport = (run: JobRun): MappingReport => (run.kind === "stopped" ? inconclusiveReport(run) : value(run.outcome, "mapping").report);

  return {
    async guard(client, fields) {
      if (fields.length === 0) return {};
      const run = await one(client, { kind: "guard", fields });
      if (run.kind === "stopped") throw stoppedWork("expression guard", run);
      return value(run.outcome, "guard").fields;
    },
    async mapping(client, input, refuse = []) {
      return mappingReport(await one(client, { kind: "mapping", input, refuse }));
    },
    async mappings(client, inputs) {
      if (inputs.length === 0) return [];
      const runs = await runAll(
        client,
        inputs.map((input) => ({ kind: "mapping", input })),
      );
      return runs.map((run) => {
        try {
          return mappingReport(run);
        } catch (err) {
          if (err instanceof Error) return err;
          throw err;
        }
      });
    },
    async derive(client, input, d) {
      const run = await one(client, { kind: "derive", input, couplings: d.couplings, definitions: d.definitions, ...(d.evaluate_at ? { evaluate_at: d.evaluate_at } : {}) });
      if (run.kind === "stopped") throw stoppedWork("derivation", run);
      return value(run.outcome, "derive").derivation;
    },
  };
}

/**
 * The checks that finished, and one inconclusive check for the rest. ok is false (nothing vouches
 * for the expression yet), and no check in it has failed.
 */
export function inconclusiveReport(run: Extract<JobRun, { kind: "stopped" }>): MappingReport {
  const done = run.checks.map((c) => c.name).join(", ");
  const stopped: CheckResult = {
    name: "evaluation",
    ok: false,
    severity: "inconclusive",
    message: `the checks ${done ? `after ${done} ` : ""}${run.reason}; inconclusive (not a failure): they run again on the next save`,
  };
  return { ok: false, checks: [...run.checks, stopped], latex: null };
}

/**
 * The same jobs on the calling thread, with no time limit and no admission: only for our own
 * content (the seed steps, which run before the server listens), never for a request.
 */
export function inProcessCheckRunner(): CheckRunner {
  const local = async (job: CheckJob): Promise<JobOutcome> => runCheckJob(job, { pool: getSymbolicPool() });
  const unwrap = <K extends JobValue["kind"]>(outcome: JobOutcome, kind: K): Extract<JobValue, { kind: K }> => {
    if (!outcome.ok) throw fromJobError(outcome.error);
    if (outcome.value.kind !== kind) throw new Error(`a ${kind} job answered ${outcome.value.kind}`);
    return outcome.value as Extract<JobValue, { kind: K }>;
  };
  const mapping = async (input: MappingInput, refuse: readonly ExpressionErrorCode[] = []) => unwrap(await local({ kind: "mapping", input, refuse }), "mapping").report;
  return {
    guard: async (_client, fields) => unwrap(await local({ kind: "guard", fields }), "guard").fields,
    mapping: async (_client, input, refuse) => mapping(input, refuse),
    mappings: async (_client, inputs) => Promise.all(inputs.map((input) => mapping(input).catch((err: unknown) => (err instanceof Error ? err : new Error(String(err)))))),
    derive: async (_client, input, d) =>
      unwrap(await local({ kind: "derive", input, couplings: d.couplings, definitions: d.definitions, ...(d.evaluate_at ? { evaluate_at: d.evaluate_at } : {}) }), "derive").derivation,
  };
}
