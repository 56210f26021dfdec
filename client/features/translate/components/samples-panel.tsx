import { useState, type ChangeEvent } from "react";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { SAMPLE_COLUMNS, samplesRequestSchema, type SamplesRequest, type SamplesResponse } from "../../../../common/convert-samples.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextArea } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useConvertSamples } from "../api/convert-samples.ts";
import { useTheoriesAtB } from "../api/theories-at-b.ts";
import { CautionList } from "./caution-list.tsx";
import { SamplesHistogram } from "./samples-panel-histogram.tsx";
import { bOfDeviation, DEFAULT_DEVIATION, DeviationFields, deviationRequest, useCheckedRequest, type DeviationValues, type TheoryOption } from "./samples-panel-fields.tsx";
import { SciNumber, unitText } from "./sci-number.tsx";

/** Invented example posterior (a 10 + 5 Msun black-hole binary, beta spread around 1e-3). */
export const EXAMPLE_SAMPLES_CSV = ["beta,m1,m2,chi1,chi2", "-8.1e-4,10.2,5.1,0.05,0", "3.2e-4,9.8,4.9,0,0.1", "-1.1e-3,10.5,5.3,0.1,0.02", "6.0e-4,10.1,5.0,0,0", "-2.4e-4,9.6,4.8,0.03,0.04"].join("\n");

/**
 * Reads a posterior CSV (header: beta, m1, m2, optional chi1, chi2, z) into columns. Numbers become
 * numbers, anything else stays text, so the shared schema names the column and the first bad row.
 */
export async function columnsFromCsv(text: string): Promise<{ columns: Record<string, unknown[]>; problem?: string }> {
  const { default: Papa } = await import("papaparse");
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: "greedy", transformHeader: (h) => h.trim().toLowerCase() });
  const headers = parsed.meta.fields ?? [];
  const missing = ["beta", "m1", "m2"].filter((c) => !headers.includes(c));
  if (missing.length > 0) return { columns: {}, problem: `The first line must name the columns beta, m1, m2; it lacks ${missing.join(", ")}.` };
  const unknown = headers.filter((h) => h !== "" && !(SAMPLE_COLUMNS as readonly string[]).includes(h));
  if (unknown.length > 0) return { columns: {}, problem: `Unknown column ${unknown[0]}: use ${SAMPLE_COLUMNS.join(", ")}.` };
  const columns: Record<string, unknown[]> = {};
  for (const h of headers) {
    columns[h] = parsed.data.map((r) => {
      const t = (r[h] ?? "").trim();
      const n = t === "" ? Number.NaN : Number(t);
      return Number.isFinite(n) ? n : t;
    });
  }
  return { columns };
}

/** "columns.m1.4" -> "column m1, row 4 (CSV line 6)". */
export function describeSampleIssue(path: string, message: string): string {
  const m = /^columns\.(\w+)\.(\d+)$/.exec(path);
  return m ? `${message} (CSV line ${Number(m[2]) + 2})` : `${path}: ${message}`;
}

interface FormProps {
  theories: readonly TheoryOption[];
  theoriesLoading: boolean;
  deviation: DeviationValues;
  onDeviation: (v: DeviationValues) => void;
  onSubmit: (request: SamplesRequest) => void;
  busy: boolean;
  serverFields: Record<string, string>;
}

export function SamplesForm({ theories, theoriesLoading, deviation, onDeviation, onSubmit, busy, serverFields }: FormProps) {
  const [csv, setCsv] = useState(EXAMPLE_SAMPLES_CSV);
  const [frame, setFrame] = useState<"source" | "detector">("source");
  const [bodies, setBodies] = useState("bh,bh");
  const { errors: all, listed, fail, submit } = useCheckedRequest(samplesRequestSchema, serverFields, onSubmit);

  const upload = async (e: ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    if (file) setCsv(await file.text());
  };
  const run = async () => {
    const { columns, problem } = await columnsFromCsv(csv);
    if (problem) {
      fail("file", problem);
      return;
    }
    submit({ ...deviationRequest(deviation), columns, frame, bodies: bodies.split(",") });
  };

  return (
    <div className="flex flex-col gap-4">
      <DeviationFields idPrefix="samples" value={deviation} onChange={onDeviation} theories={theories} theoriesLoading={theoriesLoading} errors={all} />
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <Field label="Posterior samples (CSV)" hint="Header row: beta (or δφ_k), m1, m2, and optionally chi1, chi2, z; one sample per line, up to 20 000 here; larger posteriors go to “Posterior files” below, as a background job.">
          {(c) => <TextArea {...c} rows={7} value={csv} onChange={(e) => setCsv(e.target.value)} data-testid="samples-csv" />}
        </Field>
        <div className="flex flex-col gap-3">
          <label className="text-sm font-semibold">
            or upload a .csv file
            <input type="file" accept=".csv,text/csv" className="mt-1 block text-sm" onChange={(e) => void upload(e)} data-testid="samples-file" />
          </label>
          <Field label="Sample masses are">
            {(c) => (
              <Select {...c} value={frame} onChange={(e) => setFrame(e.target.value === "detector" ? "detector" : "source")} data-testid="samples-frame">
                <option value="source">source frame</option>
                <option value="detector">detector frame (needs z)</option>
              </Select>
            )}
          </Field>
          <Field label="Bodies of every sample">
            {(c) => (
              <Select {...c} value={bodies} onChange={(e) => setBodies(e.target.value)} data-testid="samples-bodies">
                <option value="bh,bh">two black holes</option>
                <option value="bh,ns">black hole + neutron star</option>
                <option value="ns,ns">two neutron stars</option>
              </Select>
            )}
          </Field>
          <Button kind="primary" onClick={() => void run()} busy={busy} data-testid="run-samples">
            Translate the samples
          </Button>
        </div>
      </div>
      {listed.length > 0 && (
        <ul role="alert" className="text-sm text-brick" data-testid="samples-problems">
          {listed.map(([path, message]) => (
            <li key={path}>{describeSampleIssue(path, message)}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

export function SamplesResult({ data }: { data: SamplesResponse }) {
  const pct = (x: number) => `${(Math.round(x * 1000) / 10).toString()}%`;
  return (
    <div className="flex flex-col gap-4" data-testid="samples-result">
      <div className="grid gap-4 rounded border border-paper-edge bg-white/40 p-4 sm:grid-cols-[1fr_1.4fr]">
        <div>
          <p className="text-sm text-ink-soft">
            {data.theory_name}, b = {data.b}, {pct(data.credibility)} credibility
          </p>
          <p className="mt-1 text-2xl" data-testid="samples-bound">
            {symbolText(data.coupling.symbol, data.coupling.latex)} {data.coupling.side === "upper" ? "≤" : "≥"} <SciNumber value={data.coupling.value} className="font-semibold" /> {unitText(data.coupling.unit)}
          </p>
          <p className="mt-1 text-sm text-ink-soft" data-testid="samples-count">
            {data.samples.used} of {data.samples.total} samples translated{data.samples.dropped > 0 ? `; ${data.samples.dropped} dropped` : ""}.
          </p>
          <p className="mt-2 text-xs text-ink-faint">{data.meaning}</p>
        </div>
        <CautionList cautions={data.cautions} testId="samples-cautions" />
      </div>
      {data.validity.length > 0 && (
        <table className="w-full border-collapse text-sm" data-testid="samples-validity">
          <caption className="mb-1 text-left text-sm font-semibold">Samples inside each condition of validity</caption>
          <thead className="bg-paper-deep text-left">
            <tr>
              <th scope="col" className="px-3 py-1.5">Condition</th>
              <th scope="col" className="px-3 py-1.5">Kind</th>
              <th scope="col" className="px-3 py-1.5">Samples that pass</th>
            </tr>
          </thead>
          <tbody>
            {data.validity.map((v) => (
              <tr key={v.label} className="border-b border-paper-edge/70">
                <td className="px-3 py-1.5">
                  {conditionText(v.label)} <code className="text-xs text-ink-faint">{v.condition}</code>
                </td>
                <td className="px-3 py-1.5">{v.kind === "hard" ? "hard" : "rule of thumb"}</td>
                <td className={`px-3 py-1.5 font-semibold ${v.fraction_ok < 1 ? "text-brick" : "text-moss"}`}>{pct(v.fraction_ok)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <SamplesHistogram data={data} />
    </div>
  );
}

/** The "Posterior samples" panel: a posterior translated sample by sample for one theory. */
export function SamplesPanel() {
  const [deviation, setDeviation] = useState<DeviationValues>(DEFAULT_DEVIATION);
  const b = bOfDeviation(deviation);
  const theories = useTheoriesAtB(b);
  const convert = useConvertSamples();
  const serverFields = convert.error instanceof ApiError ? convert.error.fields : {};
  return (
    <section aria-labelledby="samples-title" className="flex flex-col gap-4">
      <h2 id="samples-title" className="text-2xl">
        Posterior samples
      </h2>
      <p className="max-w-3xl text-sm text-ink-soft">
        Each sample's deviation is translated at that sample's own masses and spins, and the bound is the credible quantile of the translated samples. Translating
        samples is better than translating a summary bound, but it is still the posterior under a change of variables: it is not reweighted for the prior.
      </p>
      <SamplesForm
        theories={(theories.data?.theories ?? []).map((t) => ({ slug: t.slug, name: t.name }))}
        theoriesLoading={theories.isFetching}
        deviation={deviation}
        onDeviation={setDeviation}
        onSubmit={(r) => convert.mutate(r)}
        busy={convert.isPending}
        serverFields={serverFields}
      />
      {convert.error && Object.keys(serverFields).length === 0 && <ErrorNote error={convert.error} title="The samples could not be translated." />}
      {convert.data && <SamplesResult data={convert.data} />}
    </section>
  );
}
