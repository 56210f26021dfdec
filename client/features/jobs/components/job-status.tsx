import { Button } from "../../../components/ui/button.tsx";
import type { JobViewState } from "../api/use-job-view.ts";

export function Progress({ label, value, testId }: { label: string; value: number; testId: string }) {
  return (
    <div className="flex items-center gap-3 text-sm">
      <span className="w-40 text-ink-soft">{label}</span>
      <progress className="h-3 w-64" max={1} value={value} data-testid={testId} aria-label={label} />
      <span>{Math.round(value * 100)}%</span>
    </div>
  );
}

/**
 * A followed job's state between start and result: progress with a cancel button while it is queued
 * or running, then what became of it if it did not finish. Test ids are `<testIdPrefix>-running`,
 * `-progress`, `-cancel`, `-cancelled`, `-error`.
 */
export function JobStatus<T>({ job, testIdPrefix, working, cancelled, failed }: { job: JobViewState<T>; testIdPrefix: string; working: string; cancelled: string; failed: string }) {
  const { view } = job;
  if (!view) return null;
  return (
    <>
      {job.running && (
        <div className="flex flex-wrap items-center gap-4" data-testid={`${testIdPrefix}-running`}>
          <Progress label={view.status === "queued" ? "Waiting for a worker" : working} value={view.progress} testId={`${testIdPrefix}-progress`} />
          <Button kind="danger" onClick={job.cancel} busy={job.cancelling} data-testid={`${testIdPrefix}-cancel`}>
            Cancel
          </Button>
        </div>
      )}
      {view.status === "cancelled" && (
        <p className="text-sm text-ink-soft" data-testid={`${testIdPrefix}-cancelled`}>
          {cancelled}
        </p>
      )}
      {view.status === "failed" && (
        <p role="alert" className="text-sm text-brick" data-testid={`${testIdPrefix}-error`}>
          {view.error?.message ?? failed}
        </p>
      )}
      {job.unreadable && (
        <p role="alert" className="text-sm text-brick" data-testid={`${testIdPrefix}-error`}>
          The job finished, but this page cannot read its result (the server may have been updated meanwhile): reload the page.
        </p>
      )}
    </>
  );
}
