import { useCallback, useEffect, useState } from "react";
import { useSearchParams } from "react-router-dom";
import {
  consistencyRequestSchema,
  couplingExclusionRequestSchema,
  type ConsistencyRequest,
  type ConsistencyResult,
  type CouplingExclusionRequest,
  type CouplingExclusionResponse,
} from "../../../common/consistency.ts";
import { shortTheoryName } from "../../../common/theory-name.ts";
import { sciText } from "../../../common/number-text.ts";
import { readJsonParam } from "../../lib/json-param.ts";
import { texText } from "../../../common/symbol-text.ts";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { ApiError } from "../../lib/api-client.ts";
import { useConsistency } from "../../features/consistency/api/run-consistency.ts";
import { ConsistencyResultView, type DeviationTrack } from "../../features/consistency/components/consistency-result.tsx";
import { ExclusionPanel, type TestWidths } from "../../features/consistency/components/exclusion-panel.tsx";
import { SamplesForm } from "../../features/consistency/components/samples-form.tsx";
import { SummariesForm } from "../../features/consistency/components/summaries-form.tsx";
import { SaveToSheet } from "../../features/sheets/components/save-to-sheet.tsx";

/** The coupling question's answer as the plot draws it: the track, and each side's excluded coupling in symbols with its verdict. */
function deviationTrack(e: CouplingExclusionResponse): DeviationTrack {
  const symbol = e.coupling.latex ? texText(e.coupling.latex) : e.coupling.symbol;
  return {
    theory: shortTheoryName(e.theory.name, e.theory.slug),
    track: e.track,
    marks: e.sides.flatMap((s) => (s.x === null ? [] : [{ x: s.x, label: `${symbol} = ${sciText(s.x, 3).replace("-", "−")}`, verdict: s.verdict }])),
    cautions: e.cautions,
  };
}

/** The inspiral-merger-ringdown consistency test: two remnant estimates in, the deviation plane and the GR quantile out. */
/** Address parameters: the summaries test (q) and the coupling question (c), each the request as JSON; a samples job by its id (job). */
const TEST_PARAM = "q";
const COUPLING_PARAM = "c";
const JOB_PARAM = "job";

export function Component() {
  const [params, setParams] = useSearchParams();
  const fromUrl = readJsonParam(consistencyRequestSchema, params.get(TEST_PARAM), "test");
  const couplingFromUrl = readJsonParam(couplingExclusionRequestSchema, params.get(COUPLING_PARAM), "coupling question");
  const request = fromUrl.kind === "ok" ? fromUrl.value : undefined;
  const couplingRequest = couplingFromUrl.kind === "ok" ? couplingFromUrl.value : undefined;
  const setParam = useCallback(
    (key: string, value: unknown) =>
      setParams((prev) => {
        const next = new URLSearchParams(prev);
        next.set(key, JSON.stringify(value));
        return next;
      }),
    [setParams],
  );
  const setRequest = useCallback((r: ConsistencyRequest) => setParam(TEST_PARAM, r), [setParam]);
  const setCouplingRequest = useCallback((r: CouplingExclusionRequest) => setParam(COUPLING_PARAM, r), [setParam]);
  const jobFromUrl = params.get(JOB_PARAM) ?? undefined;
  const setJob = useCallback(
    (id: string) =>
      setParams((prev) => {
        const next = new URLSearchParams(prev);
        next.set(JOB_PARAM, id);
        return next;
      }),
    [setParams],
  );
  // A link to a samples job opens on the samples mode.
  const [input, setInput] = useState<"summaries" | "samples">(jobFromUrl !== undefined ? "samples" : "summaries");
  const [exclusion, setExclusion] = useState<CouplingExclusionResponse | undefined>();
  // The coupling question takes the widths of whichever test is shown: the summaries', or the sample files' moments.
  const [samplesWidths, setSamplesWidths] = useState<TestWidths | undefined>();
  const testWidths: TestWidths | undefined = input === "samples" ? samplesWidths : request ? { from: "summaries", inspiral: request.inspiral, merger_ringdown: request.merger_ringdown } : undefined;
  const result = useConsistency(request);
  const fields = result.error instanceof ApiError ? result.error.fields : {};
  const track = exclusion ? deviationTrack(exclusion) : undefined;
  return (
    <article className="flex flex-col gap-6">
      <header className="max-w-3xl">
        <h1 className="text-4xl leading-tight">Inspiral–merger–ringdown consistency</h1>
        <p className="mt-3 text-lg leading-relaxed text-ink-soft">
          Compare the remnant mass and spin inferred from the inspiral with those inferred from the merger-ringdown. The deviations are normalised by the mean of the two
          estimates; the GR quantile is the credible level of the contour through (0, 0).
        </p>
      </header>
      <div role="radiogroup" aria-label="Input" className="flex flex-wrap gap-4">
        {(
          [
            ["summaries", "Two Gaussian summaries"],
            ["samples", "Two sample files"],
          ] as const
        ).map(([value, label]) => (
          <label key={value} className="flex items-center gap-2">
            <input type="radio" name="consistency-input" value={value} checked={input === value} onChange={() => setInput(value)} data-testid={`input-${value}`} />
            {label}
          </label>
        ))}
      </div>
      {input === "summaries" ? (
        <>
          {fromUrl.kind === "bad" && (
            <p role="alert" className="text-brick" data-testid="bad-link">
              This link's test could not be read ({fromUrl.message}); the form shows the example values.
            </p>
          )}
          <SummariesForm key={fromUrl.kind === "ok" ? fromUrl.text : "demo"} onSubmit={setRequest} serverErrors={fields} initial={request} />
          {result.isFetching && <Loading what="the test" />}
          {result.error && Object.keys(fields).length === 0 && <ErrorNote error={result.error} title="The test could not be run." />}
          {result.error && Object.keys(fields).length > 0 && (
            <p role="alert" className="text-brick">
              {result.error.message}
            </p>
          )}
          {result.data && <ConsistencyResultView result={result.data} track={track} />}
          {result.data && request && <SaveToSheet what="this consistency result" payload={{ kind: "consistency", summaries: request }} defaults={{ analysis_method: "IMR consistency, Gaussian remnant estimates" }} />}
        </>
      ) : (
        <SamplesForm jobId={jobFromUrl} onJob={setJob}>
          {(r, jobId) => (
            <>
              <ConsistencyResultView result={r} track={track} />
              <ReportWidths result={r} onWidths={setSamplesWidths} />
              <SaveToSheet what="this consistency result" payload={{ kind: "consistency", job: jobId }} defaults={{ analysis_method: "IMR consistency, posterior samples" }} />
            </>
          )}
        </SamplesForm>
      )}
      {couplingFromUrl.kind === "bad" && (
        <p role="alert" className="text-brick">
          This link's coupling question could not be read ({couplingFromUrl.message}).
        </p>
      )}
      <ExclusionPanel key={couplingFromUrl.kind === "ok" ? couplingFromUrl.text : "demo"} test={testWidths} onTrack={setExclusion} request={couplingRequest} onRequest={setCouplingRequest} />
    </article>
  );
}

/** Hands a samples job's per-estimate widths up to the page (the coupling question uses them); draws nothing. */
function ReportWidths({ result, onWidths }: { result: ConsistencyResult; onWidths: (w: TestWidths | undefined) => void }) {
  // Keyed by value: the job view may hand a freshly parsed result on each render, and a new object
  // each time would set the page's state in a loop.
  const key = result.estimates ? JSON.stringify(result.estimates) : "";
  useEffect(() => {
    const e = key ? (JSON.parse(key) as NonNullable<ConsistencyResult["estimates"]>) : undefined;
    onWidths(e ? { from: "samples", inspiral: e.inspiral, merger_ringdown: e.merger_ringdown } : undefined);
  }, [key, onWidths]);
  return null;
}
