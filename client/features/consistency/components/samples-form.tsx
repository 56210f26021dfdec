import { useState, type FormEvent, type ReactNode } from "react";
import { consistencyJobRequestSchema, consistencyResultSchema, type ConsistencyResult } from "../../../../common/consistency.ts";
import { jobIdSchema } from "../../../../common/jobs.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useJob, useSubmitConsistencyJob } from "../api/consistency-job.ts";

interface Props {
  children: (result: ConsistencyResult, jobId: string) => ReactNode;
  /** The job to show (the page keeps it in the address, ?job=<id>, so a link reopens the result). */
  jobId?: string | undefined;
  /** Called with a new job's id once the server has taken the files. */
  onJob?: (id: string) => void;
}

/**
 * Two posterior-samples files, run as a background job: text tables with a header naming M_f and
 * chi_f, or m1 and m2 (chi1, chi2 optional) to go through the remnant fit.
 */
export function SamplesForm({ children, jobId: shownJob, onJob }: Props) {
  const [files, setFiles] = useState<{ inspiral?: File; merger_ringdown?: File }>({});
  const [frame, setFrame] = useState<"detector" | "source">("detector");
  const [z, setZ] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const submit = useSubmitConsistencyJob();
  // A job id from a link is checked before it is asked for: a mangled link says so instead of failing.
  const linkProblem = shownJob !== undefined && !jobIdSchema.safeParse(shownJob).success ? "the job id in this link is not a job id" : null;
  const jobId = linkProblem ? undefined : (shownJob ?? submit.data?.job.id);
  const job = useJob(jobId);
  const serverFields = submit.error instanceof ApiError ? submit.error.fields : {};
  const shown = { ...serverFields, ...errors };

  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    const next: Record<string, string> = {};
    if (!files.inspiral) next.inspiral = "choose the inspiral samples file";
    if (!files.merger_ringdown) next.merger_ringdown = "choose the merger-ringdown samples file";
    const parsed = consistencyJobRequestSchema.safeParse({ frame, ...(z.trim() === "" ? {} : { z: Number(z) }) });
    if (!parsed.success) for (const issue of parsed.error.issues) next[issue.path.join(".")] ??= issue.message;
    setErrors(next);
    if (Object.keys(next).length > 0 || !parsed.success || !files.inspiral || !files.merger_ringdown) return;
    submit.mutate({ inspiral: files.inspiral, merger_ringdown: files.merger_ringdown, request: parsed.data }, { onSuccess: (created) => onJob?.(created.job.id) });
  };

  const view = job.data;
  const result = view?.status === "done" && view.kind === "consistency" ? consistencyResultSchema.safeParse(view.result) : undefined;

  return (
    <div className="flex flex-col gap-4">
      <form onSubmit={onSubmit} className="flex flex-col gap-3" data-testid="samples-form" noValidate>
        <p className="max-w-3xl text-sm text-ink-soft">
          Text tables (comma, tab or space separated) with one header line naming <code>M_f</code> and <code>chi_f</code>, or <code>m1</code> and <code>m2</code> (and optionally{" "}
          <code>chi1</code>, <code>chi2</code>), which are pushed through the Husa et al. 2016 remnant fits sample by sample. The test runs as a background job.
        </p>
        <div className="grid gap-3 sm:grid-cols-2">
          {(["inspiral", "merger_ringdown"] as const).map((name) => (
            <Field key={name} label={name === "inspiral" ? "Inspiral samples" : "Merger-ringdown samples"} error={shown[name]}>
              {(control) => (
                <input
                  {...control}
                  type="file"
                  name={name}
                  accept=".csv,.tsv,.txt,.dat,text/plain,text/csv"
                  className="text-sm"
                  onChange={(e) => {
                    const file = e.target.files?.[0];
                    setFiles((f) => ({ ...f, [name]: file }));
                  }}
                />
              )}
            </Field>
          ))}
        </div>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          <Field label="Mass frame" error={shown.frame}>
            {(control) => (
              <Select {...control} name="samples-frame" value={frame} onChange={(e) => setFrame(e.target.value === "source" ? "source" : "detector")}>
                <option value="detector">detector (redshifted)</option>
                <option value="source">source</option>
              </Select>
            )}
          </Field>
          <Field label="Redshift z" error={shown.z} hint="optional">
            {(control) => <TextInput {...control} name="samples-z" inputMode="decimal" value={z} onChange={(e) => setZ(e.target.value)} />}
          </Field>
        </div>
        <div>
          <Button kind="primary" type="submit" busy={submit.isPending} data-testid="run-samples-consistency">
            Run the test on the samples
          </Button>
        </div>
      </form>
      {submit.error && Object.keys(serverFields).length === 0 && <ErrorNote error={submit.error} title="The job could not be started." />}
      {view && (view.status === "queued" || view.status === "running") && (
        <p className="text-sm text-ink-soft" role="status" data-testid="samples-job-status">
          Job {view.status}
          {view.status === "running" ? `: ${Math.round(view.progress * 100)} %` : ""}
        </p>
      )}
      {job.isPending && jobId && <Loading what="the job" />}
      {(linkProblem || job.error) && (
        <p role="alert" className="text-brick" data-testid="samples-job-unavailable">
          This job's result cannot be shown: {linkProblem ?? (job.error instanceof ApiError && job.error.status === 404 ? job.error.message : `the job could not be read (${job.error?.message ?? "unknown error"})`)}. Run
          the test on the files again.
        </p>
      )}
      {view && view.kind !== "consistency" && (
        <p role="alert" className="text-brick" data-testid="samples-job-unavailable">
          This job's result cannot be shown here: job {view.id} is a {view.kind} job, not a consistency test.
        </p>
      )}
      {view?.status === "failed" && (
        <p role="alert" className="text-brick" data-testid="samples-job-error">
          The job failed: {view.error?.message}
        </p>
      )}
      {result?.success && view && children(result.data, view.id)}
    </div>
  );
}
