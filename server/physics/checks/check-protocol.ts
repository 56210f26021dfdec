import type { SymbolicErrorCode } from "../expr/pool.ts";
import type { SymbolicOp, SymbolicResult } from "../expr/symbolic-protocol.ts";
import type { CheckJob, JobOutcome } from "./check-job.ts";
import type { CheckResult } from "./types.ts";

/** Messages between check-pool.ts (main thread) and check-worker-main.ts. */
export type ToWorker =
  | { readonly type: "job"; readonly id: number; readonly job: CheckJob }
  | { readonly type: "cas_result"; readonly callId: number; readonly ok: true; readonly result: SymbolicResult }
  | { readonly type: "cas_result"; readonly callId: number; readonly ok: false; readonly code: SymbolicErrorCode; readonly message: string; readonly timeoutMs?: number };

export type FromWorker =
  | { readonly type: "ready" }
  | { readonly type: "check"; readonly id: number; readonly check: CheckResult }
  | { readonly type: "done"; readonly id: number; readonly outcome: JobOutcome }
  | { readonly type: "crashed"; readonly id: number; readonly message: string }
  | { readonly type: "cas"; readonly id: number; readonly callId: number; readonly op: SymbolicOp; readonly timeoutMs?: number };
