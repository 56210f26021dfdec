import { useMemo } from "react";
import type { z } from "zod";
import type { JobView } from "../../../../common/jobs.ts";
import { useCancelJob, useJob } from "./jobs.ts";

export interface JobViewState<T> {
  /** The job's record as last polled (undefined before the first answer, or without an id). */
  view: JobView | undefined;
  /** Queued or running: the page shows progress and offers to cancel. */
  running: boolean;
  /** The first poll of a new id is on its way. */
  loading: boolean;
  /** A done job's result, read with the page's schema (null until then, or if it does not parse). */
  result: T | null;
  /** A done job whose result the page's schema refuses (an older or newer server): said, not hidden. */
  unreadable: boolean;
  cancel: () => void;
  cancelling: boolean;
}

/**
 * One background job followed by a page: polled until it finishes (jobQuery), its state, its result
 * parsed with `schema`, and a cancel action. Used by every panel that starts a job.
 */
export function useJobView<S extends z.ZodType>(id: string | null | undefined, schema: S): JobViewState<z.output<S>> {
  const job = useJob(id ?? null);
  const cancelJob = useCancelJob();
  const view = job.data;
  const parsed = useMemo(() => (view?.status === "done" ? schema.safeParse(view.result) : null), [view, schema]);
  return {
    view,
    running: view !== undefined && (view.status === "queued" || view.status === "running"),
    loading: id !== null && id !== undefined && job.isPending,
    result: parsed?.success ? parsed.data : null,
    unreadable: parsed !== null && !parsed.success,
    cancel: () => {
      if (view) cancelJob.mutate(view.id);
    },
    cancelling: cancelJob.isPending,
  };
}
