import { useQueryClient, type QueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { jobViewSchema, samplesJobResultSchema, stackJobResultSchema, type JobView } from "../../../../common/jobs.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { apiRequest, ApiError } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { useTheoriesAtB } from "../../translate/api/theories-at-b.ts";
import { bOfDeviation, DEFAULT_DEVIATION, DeviationFields, deviationRequest, type DeviationValues } from "../../translate/components/samples-panel-fields.tsx";
import { previewFile, startSamplesJob, startStackJob } from "../api/jobs.ts";
import { useJobView } from "../api/use-job-view.ts";
import { BodiesField, FrameField } from "./binary-fields.tsx";
import { JobStatus, Progress } from "./job-status.tsx";
import { guessRoles } from "./samples-job-panel.tsx";
import { StackResultView } from "./stack-result.tsx";

/**
 * "Combine several events": finished samples jobs of this page (or their ids), per-event files
 * uploaded here (columns guessed from their names), or summaries as a quick estimate, combined by a
 * background stacking job (POST /jobs/stack) whose progress the page follows and which can be cancelled.
 */

type Source = "job" | "file" | "summary";
interface EventRow {
  label: string;
  source: Source;
  job: string;
  file: File | null;
  centre: string;
  width: string;
  m1: string;
  m2: string;
  z: string;
}

const emptyRow = (n: number, source: Source = "job"): EventRow => ({ label: `event ${n}`, source, job: "", file: null, centre: "", width: "", m1: "", m2: "", z: "" });

interface FinishedJob {
  id: string;
  name: string;
  theory: string;
  b: number;
}

/** The samples jobs that finished on this page (read from the query cache, which the samples panel fills). */
function readFinished(qc: QueryClient): FinishedJob[] {
  return qc.getQueriesData<JobView>({ queryKey: ["jobs"] }).flatMap(([, v]) => {
    if (!v || v.kind !== "samples" || v.status !== "done") return [];
    const r = samplesJobResultSchema.safeParse(v.result);
    return r.success ? [{ id: v.id, name: r.data.file.name, theory: r.data.theory, b: r.data.b }] : [];
  });
}

function useFinishedSamplesJobs(): FinishedJob[] {
  const qc = useQueryClient();
  const [list, setList] = useState<FinishedJob[]>(() => readFinished(qc));
  useEffect(
    () =>
      qc.getQueryCache().subscribe(() => {
        const next = readFinished(qc);
        setList((prev) => (JSON.stringify(prev) === JSON.stringify(next) ? prev : next));
      }),
    [qc],
  );
  return list;
}

const num = (s: string): unknown => {
  const t = s.trim();
  if (t === "") return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
};
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export function StackPanel() {
  const [deviation, setDeviation] = useState<DeviationValues>(DEFAULT_DEVIATION);
  const theories = useTheoriesAtB(bOfDeviation(deviation));
  const finished = useFinishedSamplesJobs();
  const [rows, setRows] = useState<EventRow[]>([emptyRow(1), emptyRow(2)]);
  const [prior, setPrior] = useState<"uniform" | "log_uniform">("uniform");
  const [range, setRange] = useState({ lo: "", hi: "" });
  const [frame, setFrame] = useState<"source" | "detector">("source");
  const [bodies, setBodies] = useState("bh,bh");
  const [includeOutside, setIncludeOutside] = useState(false);
  const [step, setStep] = useState<{ what: string; value: number } | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [stackId, setStackId] = useState<string | null>(null);
  const job = useJobView(stackId, stackJobResultSchema);
  const setCell = <K extends keyof EventRow>(i: number, key: K, value: EventRow[K]) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, [key]: value } : r)));

  /** A per-event file: preview, guessed columns, a samples job with the stack's settings, followed until done. */
  const translateFile = async (row: EventRow, i: number): Promise<string> => {
    const file = row.file!;
    const label = `${row.label}: ${file.name}`;
    setStep({ what: `Reading ${label}`, value: 0 });
    const preview = await previewFile(file, (v) => setStep({ what: `Reading ${label}`, value: v }));
    const t = preview.tables[0];
    const roles = guessRoles(t?.columns.map((c) => c.name) ?? []);
    if (!roles.deviation || !((roles.m1 && roles.m2) || (roles.q && (roles.mchirp || roles.mtotal)))) {
      throw new Error(`${row.label}: the columns of ${file.name} (${t?.columns.map((c) => c.name).join(", ") ?? "none"}) could not be matched to the deviation and the masses by their names; translate it in the posterior-files panel above, then pick its job here (event ${i + 1}).`);
    }
    const request = {
      ...deviationRequest(deviation),
      ...(t?.path ? { table: t.path } : {}),
      columns: roles,
      frame,
      bodies: bodies.split(","),
      prior: { kind: "as_translated" },
    };
    setStep({ what: `Uploading ${label}`, value: 0 });
    const created = await startSamplesJob(file, request, (v) => setStep({ what: `Uploading ${label}`, value: v }));
    for (;;) {
      const view = await apiRequest(apiPaths.job(created.job.id), jobViewSchema);
      if (view.status === "done") return view.id;
      if (view.status === "failed" || view.status === "cancelled") throw new Error(`${row.label}: ${view.error?.message ?? `the job for ${file.name} was ${view.status}`}`);
      setStep({ what: `Translating ${label}`, value: view.progress });
      await sleep(500);
    }
  };

  const run = async () => {
    setError(null);
    setStackId(null);
    try {
      const events: object[] = [];
      for (const [i, r] of rows.entries()) {
        if (r.source === "summary") {
          events.push({ label: r.label, summary: { centre: num(r.centre), width: num(r.width) }, binary: { m1: num(r.m1), m2: num(r.m2), ...(r.z.trim() === "" ? {} : { z: num(r.z) }) } });
        } else if (r.source === "file") {
          if (!r.file) throw new Error(`${r.label}: choose a samples file (event ${i + 1}).`);
          events.push({ label: r.label, job: await translateFile(r, i) });
        } else {
          events.push({ label: r.label, job: r.job.trim() });
        }
      }
      const lo = range.lo.trim();
      const hi = range.hi.trim();
      const request = {
        ...deviationRequest(deviation),
        bodies: bodies.split(","),
        prior: { kind: prior, ...(lo !== "" && hi !== "" ? { range: [num(lo), num(hi)] } : {}) },
        include_outside_validity: includeOutside,
        events,
      };
      setStep({ what: "Starting the combination", value: 0 });
      const created = await startStackJob(request);
      setStackId(created.job.id);
    } catch (err) {
      setError(err);
    } finally {
      setStep(null);
    }
  };

  const fields = error instanceof ApiError ? error.fields : {};
  const fieldList = Object.entries(fields);

  return (
    <section aria-labelledby="stack-title" className="flex flex-col gap-4" data-testid="stack-panel">
      <h2 id="stack-title" className="text-2xl">
        Stack events' coupling posteriors
      </h2>
      <p className="max-w-3xl text-sm text-ink-soft">
        Each event's posterior of the coupling, with its own prior divided out, is multiplied on a common grid under the prior you choose. Events can be samples jobs already done on this
        page, files uploaded here (their columns are matched by name), or a centre and width as a labelled quick estimate. Upper bounds, lower bounds and signed intervals follow the
        coupling.
      </p>
      <DeviationFields idPrefix="stack" value={deviation} onChange={setDeviation} theories={(theories.data?.theories ?? []).map((t) => ({ slug: t.slug, name: t.name }))} theoriesLoading={theories.isFetching} errors={fields} />
      <ol className="flex flex-col gap-3" data-testid="stack-events-input">
        {rows.map((r, i) => (
          <li key={i} className="rounded border border-paper-edge bg-white/40 p-3">
            <div className="flex flex-wrap items-end gap-3">
              <Field label={`Event ${i + 1}`} error={fields[`events.${i}.label`]}>
                {(c) => <TextInput {...c} className="w-36" value={r.label} onChange={(e) => setCell(i, "label", e.target.value)} data-testid={`stack-${i}-label`} />}
              </Field>
              <Field label="From">
                {(c) => (
                  <Select {...c} value={r.source} onChange={(e) => setCell(i, "source", e.target.value === "file" ? "file" : e.target.value === "summary" ? "summary" : "job")} data-testid={`stack-${i}-source`}>
                    <option value="job">a finished samples job</option>
                    <option value="file">a samples file (upload)</option>
                    <option value="summary">a summary (quick estimate)</option>
                  </Select>
                )}
              </Field>
              {r.source === "job" && (
                <>
                  <Field label="Job on this page" error={fields[`events.${i}.job`]}>
                    {(c) => (
                      <Select {...c} value={finished.some((f) => f.id === r.job) ? r.job : ""} onChange={(e) => setCell(i, "job", e.target.value)} data-testid={`stack-${i}-job`}>
                        <option value="">{finished.length === 0 ? "none finished yet" : "choose…"}</option>
                        {finished.map((f) => (
                          <option key={f.id} value={f.id}>
                            {f.name} ({f.theory}, b = {f.b})
                          </option>
                        ))}
                      </Select>
                    )}
                  </Field>
                  <Field label="or its id">{(c) => <TextInput {...c} className="w-64 font-mono" value={r.job} onChange={(e) => setCell(i, "job", e.target.value)} data-testid={`stack-${i}-job-id`} />}</Field>
                </>
              )}
              {r.source === "file" && (
                <label className="text-sm font-semibold">
                  Samples file
                  <input type="file" accept=".csv,.tsv,.txt,.dat,.json,.h5,.hdf5,.hdf" className="mt-1 block text-sm" onChange={(e) => setCell(i, "file", e.target.files?.[0] ?? null)} data-testid={`stack-${i}-file`} />
                </label>
              )}
              {r.source === "summary" &&
                (
                  [
                    ["centre", deviation.parameter === "ppe_beta" ? "centre of β" : "centre of δφ"],
                    ["width", "width (1σ)"],
                    ["m1", "m₁ (M☉)"],
                    ["m2", "m₂ (M☉)"],
                    ["z", "z"],
                  ] as const
                ).map(([key, label]) => (
                  <Field key={key} label={label} error={fields[`events.${i}.summary.${key}`] ?? fields[`events.${i}.binary.${key}`]}>
                    {(c) => <TextInput {...c} className="w-24" value={r[key]} onChange={(e) => setCell(i, key, e.target.value)} data-testid={`stack-${i}-${key}`} />}
                  </Field>
                ))}
              <Button kind="quiet" onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))} disabled={rows.length === 1} aria-label={`Remove event ${i + 1} from the combination`}>
                remove
              </Button>
            </div>
          </li>
        ))}
      </ol>
      <div className="grid gap-3 sm:grid-cols-5">
        <Field label="Prior on the coupling">
          {(c) => (
            <Select {...c} value={prior} onChange={(e) => setPrior(e.target.value === "log_uniform" ? "log_uniform" : "uniform")} data-testid="stack-prior">
              <option value="uniform">uniform in the coupling</option>
              <option value="log_uniform">log-uniform in the coupling</option>
            </Select>
          )}
        </Field>
        <Field label="Prior range: low" error={fields["prior.range"]} hint="a lower bound needs a high end">
          {(c) => <TextInput {...c} value={range.lo} onChange={(e) => setRange({ ...range, lo: e.target.value })} placeholder="optional" data-testid="stack-range-lo" />}
        </Field>
        <Field label="high">{(c) => <TextInput {...c} value={range.hi} onChange={(e) => setRange({ ...range, hi: e.target.value })} placeholder="optional" data-testid="stack-range-hi" />}</Field>
        <FrameField label="Uploaded files' masses are in the" value={frame} onChange={setFrame} />
        <BodiesField value={bodies} onChange={setBodies} />
      </div>
      <div className="flex flex-wrap items-center gap-4">
        <Button onClick={() => setRows((rs) => [...rs, emptyRow(rs.length + 1)])} disabled={rows.length >= 50} data-testid="stack-add">
          Add an event
        </Button>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={includeOutside} onChange={(e) => setIncludeOutside(e.target.checked)} />
          keep events whose own bound is outside validity
        </label>
        <Button kind="primary" onClick={() => void run()} busy={step !== null} disabled={job.running} data-testid="stack-run">
          Combine
        </Button>
      </div>
      {step && <Progress label={step.what} value={step.value} testId="stack-step-progress" />}
      {error !== null && (fieldList.length > 0 ? (
        <ul role="alert" className="text-sm text-brick" data-testid="stack-problems">
          {fieldList.map(([path, message]) => (
            <li key={path}>
              {path}: {message}
            </li>
          ))}
        </ul>
      ) : (
        <ErrorNote error={error} title="The events could not be combined." />
      ))}
      <JobStatus job={job} testIdPrefix="stack" working="Combining" cancelled="The combination was cancelled." failed="The combination failed." />
      {job.view && job.result && <StackResultView id={job.view.id} data={job.result} />}
    </section>
  );
}
