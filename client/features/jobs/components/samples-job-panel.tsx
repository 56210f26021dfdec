import { thresholdText } from "../../../../common/number-text.ts";
import { useState, type ChangeEvent } from "react";
import { COLUMN_ROLES, samplesJobResultSchema, type ColumnRoleName, type FilePreview } from "../../../../common/jobs.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useTheoriesAtB } from "../../translate/api/theories-at-b.ts";
import { bOfDeviation, DEFAULT_DEVIATION, DeviationFields, deviationRequest, type DeviationValues } from "../../translate/components/samples-panel-fields.tsx";
import { previewFile, startSamplesJob } from "../api/jobs.ts";
import { useJobView } from "../api/use-job-view.ts";
import { BodiesField, FrameField } from "./binary-fields.tsx";
import { JobStatus, Progress } from "./job-status.tsx";
import { SamplesJobResultView } from "./samples-job-result.tsx";

/**
 * "Posterior samples file": a CSV/TSV/text, JSON or HDF5 posterior of up to millions of rows is
 * uploaded (with a progress bar), its columns mapped with a preview, and translated by a background
 * job whose progress the page follows; the job can be cancelled.
 */

const ROLE_LABEL: Record<ColumnRoleName, string> = {
  deviation: "deviation (β or δφ_k)",
  m1: "m1",
  m2: "m2",
  mchirp: "chirp mass",
  q: "mass ratio q",
  mtotal: "total mass",
  chi1: "spin χ1",
  chi2: "spin χ2",
  z: "redshift z",
  distance_mpc: "luminosity distance (Mpc)",
};
export const GUESS: Record<ColumnRoleName, RegExp> = {
  deviation: /^(beta|dphi|delta_?phi|dchi)/i,
  m1: /^(m1|mass_?1)(_source|_detector)?$/i,
  m2: /^(m2|mass_?2)(_source|_detector)?$/i,
  mchirp: /^(mc|mchirp|chirp_?mass)/i,
  q: /^(q|mass_?ratio)$/i,
  mtotal: /^(mtot|mtotal|total_?mass)/i,
  chi1: /^(chi_?1|a_?1|spin_?1)/i,
  chi2: /^(chi_?2|a_?2|spin_?2)/i,
  z: /^(z|redshift)$/i,
  distance_mpc: /^(dl|d_l|distance|luminosity_distance)/i,
};

/** Column roles guessed from the columns' names (the user may change them). */
export function guessRoles(names: readonly string[]): Partial<Record<ColumnRoleName, string>> {
  const guessed: Partial<Record<ColumnRoleName, string>> = {};
  for (const role of COLUMN_ROLES) {
    const hit = names.find((n) => GUESS[role].test(n));
    if (hit) guessed[role] = hit;
  }
  if (guessed.m1 && guessed.m2) {
    delete guessed.mchirp;
    delete guessed.mtotal;
    delete guessed.q;
  }
  if (guessed.z) delete guessed.distance_mpc;
  return guessed;
}

export function SamplesJobPanel() {
  const [deviation, setDeviation] = useState<DeviationValues>(DEFAULT_DEVIATION);
  const theories = useTheoriesAtB(bOfDeviation(deviation));
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<FilePreview | null>(null);
  const [table, setTable] = useState(0);
  const [roles, setRoles] = useState<Partial<Record<ColumnRoleName, string>>>({});
  const [frame, setFrame] = useState<"source" | "detector">("source");
  const [bodies, setBodies] = useState("bh,bh");
  const [prior, setPrior] = useState<"as_translated" | "uniform" | "log_uniform">("as_translated");
  const [range, setRange] = useState({ lo: "", hi: "" });
  const [upload, setUpload] = useState<{ what: string; value: number } | null>(null);
  const [error, setError] = useState<unknown>(null);
  const [jobId, setJobId] = useState<string | null>(null);
  const job = useJobView(jobId, samplesJobResultSchema);

  const columns = preview?.tables[table]?.columns ?? [];
  const choose = async (e: ChangeEvent<HTMLInputElement>) => {
    const f = e.target.files?.[0] ?? null;
    setFile(f);
    setPreview(null);
    setJobId(null);
    setError(null);
    if (!f) return;
    try {
      setUpload({ what: "Reading the file", value: 0 });
      const p = await previewFile(f, (v) => setUpload({ what: "Reading the file", value: v }));
      setPreview(p);
      setTable(0);
      setRoles(guessRoles(p.tables[0]?.columns.map((c) => c.name) ?? []));
    } catch (err) {
      setError(err);
    } finally {
      setUpload(null);
    }
  };

  const run = async () => {
    if (!file) return;
    setError(null);
    const lo = Number(range.lo);
    const hi = Number(range.hi);
    const request = {
      ...deviationRequest(deviation),
      ...(preview?.tables[table]?.path ? { table: preview.tables[table].path } : {}),
      columns: Object.fromEntries(Object.entries(roles).filter(([, v]) => v)),
      frame,
      bodies: bodies.split(","),
      prior: { kind: prior, ...(range.lo.trim() !== "" && range.hi.trim() !== "" ? { range: [lo, hi] } : {}) },
    };
    try {
      setUpload({ what: "Uploading", value: 0 });
      const created = await startSamplesJob(file, request, (v) => setUpload({ what: "Uploading", value: v }));
      setJobId(created.job.id);
    } catch (err) {
      setError(err);
    } finally {
      setUpload(null);
    }
  };

  const fields = error instanceof ApiError ? error.fields : {};

  return (
    <section aria-labelledby="samples-job-title" className="flex flex-col gap-4" data-testid="samples-job-panel">
      <h2 id="samples-job-title" className="text-2xl">
        Posterior files (background jobs)
      </h2>
      <p className="max-w-3xl text-sm text-ink-soft">
        A posterior file (CSV, TSV or whitespace text, JSON, or HDF5; up to 512 MB and 10 million samples when signed in) is translated by a background job: each sample's
        deviation at that sample's own binary, under the prior you choose, with the effective sample size and the validity of the bound for the posterior's binaries.
      </p>
      <DeviationFields idPrefix="job" value={deviation} onChange={setDeviation} theories={(theories.data?.theories ?? []).map((t) => ({ slug: t.slug, name: t.name }))} theoriesLoading={theories.isFetching} errors={fields} />
      <label className="text-sm font-semibold">
        Samples file
        <input type="file" accept=".csv,.tsv,.txt,.dat,.json,.h5,.hdf5,.hdf" className="mt-1 block text-sm" onChange={(e) => void choose(e)} data-testid="job-file" />
      </label>
      {upload && <Progress label={upload.what} value={upload.value} testId="upload-progress" />}
      {preview && (
        <div className="flex flex-col gap-3" data-testid="job-preview">
          {preview.tables.length > 1 && (
            <Field label="Table (HDF5 path)">
              {(c) => (
                <Select {...c} value={String(table)} onChange={(e) => setTable(Number(e.target.value))} data-testid="job-table">
                  {preview.tables.map((t, i) => (
                    <option key={t.path ?? i} value={i}>
                      {t.path ?? "(file)"} — {t.columns.length} columns{t.rows === null ? "" : `, ${t.rows} rows`}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          )}
          {preview.note && <p className="text-xs text-ink-faint">{preview.note}</p>}
          <table className="w-full border-collapse text-xs">
            <caption className="mb-1 text-left text-sm font-semibold">
              Columns of {preview.file.name}
              {preview.tables[table]?.path ? ` at ${preview.tables[table].path}` : ""}
            </caption>
            <thead className="bg-paper-deep text-left">
              <tr>
                <th className="px-2 py-1">column</th>
                <th className="px-2 py-1">first rows</th>
                <th className="px-2 py-1">min</th>
                <th className="px-2 py-1">mean</th>
                <th className="px-2 py-1">max</th>
              </tr>
            </thead>
            <tbody>
              {columns.map((c) => (
                <tr key={c.name} className="border-b border-paper-edge/70">
                  <td className="px-2 py-1 font-semibold">{c.name}</td>
                  <td className="px-2 py-1 font-mono">{c.first.map((v) => (v === null ? "–" : v.toPrecision(4))).join(", ")}</td>
                  <td className="px-2 py-1">{c.min?.toPrecision(4) ?? "–"}</td>
                  <td className="px-2 py-1">{c.mean?.toPrecision(4) ?? "–"}</td>
                  <td className="px-2 py-1">{c.max === null || c.max === undefined ? "–" : thresholdText(c.max)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="grid gap-3 sm:grid-cols-4">
            {COLUMN_ROLES.map((role) => (
              <Field key={role} label={ROLE_LABEL[role]} error={fields[`columns.${role}`]}>
                {(c) => (
                  <Select {...c} value={roles[role] ?? ""} onChange={(e) => setRoles({ ...roles, [role]: e.target.value || undefined })} data-testid={`job-role-${role}`}>
                    <option value="">—</option>
                    {columns.map((col) => (
                      <option key={col.name} value={col.name}>
                        {col.name}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
            ))}
          </div>
          <div className="grid gap-3 sm:grid-cols-5">
            <FrameField label="Masses are in the" value={frame} onChange={setFrame} testId="job-frame" />
            <BodiesField value={bodies} onChange={setBodies} testId="job-bodies" />
            <Field label="Prior on the coupling">
              {(c) => (
                <Select {...c} value={prior} onChange={(e) => setPrior(e.target.value === "uniform" ? "uniform" : e.target.value === "log_uniform" ? "log_uniform" : "as_translated")} data-testid="job-prior">
                  <option value="as_translated">as translated (the analysis prior)</option>
                  <option value="uniform">uniform in the coupling</option>
                  <option value="log_uniform">log-uniform in the coupling</option>
                </Select>
              )}
            </Field>
            <Field label="Prior range: low" error={fields["prior.range"]}>
              {(c) => <TextInput {...c} value={range.lo} onChange={(e) => setRange({ ...range, lo: e.target.value })} placeholder="optional" />}
            </Field>
            <Field label="high">{(c) => <TextInput {...c} value={range.hi} onChange={(e) => setRange({ ...range, hi: e.target.value })} placeholder="optional" />}</Field>
          </div>
          <div>
            <Button kind="primary" onClick={() => void run()} busy={upload !== null} disabled={job.running} data-testid="job-run">
              Translate the file
            </Button>
          </div>
        </div>
      )}
      {error !== null && <ErrorNote error={error} title="The file could not be used." />}
      <JobStatus job={job} testIdPrefix="job" working="Translating" cancelled="The job was cancelled; nothing of it was kept but its record." failed="The job failed." />
      {job.view && job.result && <SamplesJobResultView id={job.view.id} data={job.result} />}
    </section>
  );
}
