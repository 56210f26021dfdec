import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from "react";
import { useSearchParams } from "react-router-dom";
import type { ConvertRequest, ConvertResponse, ConvertTableRequest, ConvertTableResponse } from "../../../../common/convert.ts";
import { announce } from "../../../components/ui/live-region.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useConvert } from "../api/convert-bound.ts";
import { useConvertTable } from "../api/convert-table.ts";
import { BetaPlot, type BetaPoint, type TheoryMark } from "./beta-plot.tsx";
import { BoundForm } from "./bound-form.tsx";
import { CautionList } from "./caution-list.tsx";
import { comparableQuantity, CouplingPlot } from "./coupling-plot.tsx";
import { NotApplicableList } from "./not-applicable-list.tsx";
import { ResultsTable } from "./results-table.tsx";
import { TableOverB } from "./table-over-b.tsx";
import { RequestSummary } from "./request-summary.tsx";
import { shortTheoryName } from "../../../../common/theory-name.ts";
import { formInitial, formSnapshot, readRequestParam, rememberedRequest, rememberRequest, REQUEST_PARAM, requestParam } from "../lib/request-url.ts";

/** Every theory the catalogue knows, at the b values it enters at, from whichever answer is at hand. */
export function theoryMarks(response: ConvertResponse | undefined, table: ConvertTableResponse | undefined): TheoryMark[] {
  const marks: TheoryMark[] = [];
  const add = (results: ConvertResponse["results"], na: ConvertResponse["not_applicable"]) => {
    // The plot is over the phase exponent b: amplitude results (alpha at a) have no place on it.
    for (const r of results) if (r.channel === "phase") marks.push({ b: r.b, theory: r.theory, name: shortTheoryName(r.theory_name, r.theory), state: r.verdict });
    for (const n of na) for (const b of n.b) marks.push({ b, theory: n.theory, name: shortTheoryName(n.theory_name, n.theory), state: "not_constrained" });
  };
  if (response) add(response.results, response.not_applicable);
  for (const row of table?.rows ?? []) add(row.results, row.not_applicable);
  return marks;
}

export function betaPoints(response: ConvertResponse | undefined, table: ConvertTableResponse | undefined): BetaPoint[] {
  if (table && table.rows.length > 0) {
    return table.rows.flatMap((r) => (r.b !== null && r.beta_max !== null ? [{ b: r.b, beta_max: r.beta_max, label: r.label ?? `row ${r.index + 1}` }] : []));
  }
  if (response && response.bound.b !== null && response.bound.beta_max !== null) {
    return [{ b: response.bound.b, beta_max: response.bound.beta_max, label: "this bound" }];
  }
  return [];
}

const end = (x: number | null, open: string) => (x === null ? open : Number(x.toPrecision(3)).toString());

/** The bound as the translator read it, in one sentence. */
export function translatedWords(bound: ConvertResponse["bound"]): string {
  const alpha = bound.deviation_interval;
  if (bound.channel === "distance_ratio" && alpha) {
    return `As translated: a distance ratio at z = ${bound.z ?? "?"} is the amplitude term at a = 0, α = 1/r − 1, so α ∈ [${end(alpha[0], "−∞")}, ${end(alpha[1], "∞")}].`;
  }
  if (bound.channel === "amplitude" && alpha) return `As translated: α ∈ [${end(alpha[0], "−∞")}, ${end(alpha[1], "∞")}] at a = ${bound.a ?? "?"} (the amplitude; no phase convention).`;
  if (bound.b === null) return "This bound has no single ppE exponent.";
  return `As translated: |β| ≤ ${bound.beta_max?.toPrecision(3)} at b = ${bound.b} in the exp(+iΨ) convention.`;
}

interface Props {
  /** Shown under the results, with the request that produced them (the route puts "save to a sheet" here). */
  footer?: (request: ConvertRequest, response: ConvertResponse) => ReactNode;
}

/** The translate page's working area: the form, the results with their cautions, the plots, the table over b. */
export function TranslatePanel({ footer }: Props) {
  // The request lives in the address (?q=…): a link reproduces the result, back and forward walk
  // through earlier ones, and the tab remembers the last one for when the person comes back.
  const [searchParams, setSearchParams] = useSearchParams();
  const fromUrl = useMemo(() => readRequestParam(searchParams.get(REQUEST_PARAM)), [searchParams]);
  const request = fromUrl.kind === "ok" ? fromUrl.request : undefined;
  const urlText = fromUrl.kind === "ok" ? fromUrl.text : null;
  useEffect(() => {
    if (fromUrl.kind === "none") {
      const remembered = rememberedRequest();
      if (remembered && readRequestParam(remembered).kind === "ok") setSearchParams({ [REQUEST_PARAM]: remembered }, { replace: true });
    } else if (urlText) rememberRequest(urlText);
  }, [fromUrl.kind, urlText, setSearchParams]);
  const setRequest = useCallback(
    (next: ConvertRequest, how: { replace?: boolean } = {}) => setSearchParams({ [REQUEST_PARAM]: requestParam(next) }, { replace: how.replace ?? false }),
    [setSearchParams],
  );

  const [tableRequest, setTableRequest] = useState<ConvertTableRequest | undefined>();
  const convert = useConvert(request);
  const table = useConvertTable(tableRequest);

  // A result is stale once the form no longer shows the inputs it was made from; a submit the
  // form refuses (a field error) withdraws the result, so an error never sits above an old number.
  const formBox = useRef<HTMLDivElement>(null);
  const madeFrom = useRef<string | null>(null);
  // Staleness belongs to the result of one address: a new request starts fresh.
  const [staleFor, setStaleFor] = useState<string | null>(null);
  const stale = staleFor !== null && staleFor === urlText;
  const [refused, setRefused] = useState(false);
  const resultsHeading = useRef<HTMLHeadingElement>(null);
  const focusResults = useRef(false);
  const currentForm = () => formBox.current?.querySelector("form");
  useEffect(() => {
    // After the form shows the request of the address (a submit, a link, back/forward), it is the reference.
    madeFrom.current = formSnapshot(currentForm());
  }, [urlText]);
  const onFormEdit = () => {
    if (madeFrom.current !== null) setStaleFor(formSnapshot(currentForm()) !== madeFrom.current ? urlText : null);
  };

  const response = convert.error || refused ? undefined : convert.data;
  const shownFor = response && !convert.isPlaceholderData ? response : undefined;
  useEffect(() => {
    if (!shownFor) return;
    announce(`${shownFor.results.length} ${shownFor.results.length === 1 ? "limit" : "limits"} translated; ${shownFor.not_applicable.length} theories not constrained by this bound.`);
    if (focusResults.current) {
      focusResults.current = false;
      resultsHeading.current?.focus();
    }
  }, [shownFor]);
  useEffect(() => {
    if (convert.error) announce(`The bound could not be translated: ${convert.error.message}`);
  }, [convert.error]);

  const onConvention = useCallback(
    (theory: string, convention: string) => {
      if (request) setRequest({ ...request, conventions: { ...request.conventions, [theory]: convention } }, { replace: true });
    },
    [request, setRequest],
  );
  const marks = useMemo(() => theoryMarks(response, table.data), [response, table.data]);
  const points = useMemo(() => betaPoints(response, table.data), [response, table.data]);
  const withReferences = (response?.results ?? []).filter((r) => comparableQuantity(r) !== undefined);
  const fieldError = convert.error instanceof ApiError && Object.keys(convert.error.fields).length > 0;

  return (
    <div className="flex flex-col gap-10">
      {fromUrl.kind === "bad" && (
        <p role="alert" className="rounded border border-brick/40 bg-brick-wash px-3 py-2 text-sm text-brick">
          This link's inputs could not be used ({fromUrl.message}); the form shows the worked example instead.
        </p>
      )}
      <div
        ref={formBox}
        onInput={onFormEdit}
        onChange={onFormEdit}
        onSubmitCapture={() => {
          setRefused(true);
          focusResults.current = true;
        }}
      >
        <BoundForm
          key={urlText ?? "example"}
          {...(request ? { initial: formInitial(request) } : {})}
          onSubmit={(r) => {
            setRefused(false);
            const next = { ...r, ...(request?.conventions ? { conventions: request.conventions } : {}) };
            if (urlText === requestParam(next)) {
              // The same inputs again: the address does not change, so re-run and clear the marks here.
              setStaleFor(null);
              void convert.refetch();
            } else setRequest(next);
          }}
          serverError={convert.error}
          busy={convert.isFetching}
        />
      </div>

      {convert.error && !fieldError && <ErrorNote error={convert.error} title="The bound could not be translated." />}
      {refused && !convert.error && convert.data && <p className="text-sm text-brick">The form holds an error (marked above); the previous result was withdrawn.</p>}

      {response && (
        <section aria-labelledby="results-title" className="flex flex-col gap-4" data-testid="results" data-stale={stale}>
          <h2 id="results-title" ref={resultsHeading} tabIndex={-1} className="text-2xl focus:outline-none">
            Limits on the catalogued theories
          </h2>
          {stale && (
            <p role="status" className="rounded border border-amber/50 bg-amber-wash px-3 py-2 text-sm font-semibold text-amber" data-testid="stale-note">
              Out of date: the inputs above changed after this result was made. Translate again to update it.
            </p>
          )}
          {/* An out-of-date result stays readable but visibly faded, under the note that says why. */}
          <div className={`flex flex-col gap-4 ${stale ? "opacity-50" : ""}`}>
          {request && <RequestSummary request={request} cosmology={response.cosmology} catalogueVersion={response.catalogue_revision} />}
          <p className="text-sm text-ink-soft">
            {translatedWords(response.bound)}
          </p>
          <CautionList cautions={response.cautions} testId="bound-cautions" />
          <ResultsTable results={response.results} onConvention={onConvention} />
          <NotApplicableList items={response.not_applicable} />
          {request && footer?.(request, response)}
          </div>
        </section>
      )}

      {(response || table.data) && (
        <section aria-labelledby="plots-title" className="flex flex-col gap-4">
          <h2 id="plots-title" className="text-2xl">
            Plots
          </h2>
          <BetaPlot points={points} theories={marks} />
          {withReferences.map((r) => (
            <CouplingPlot key={`${r.theory}-${r.convention}`} result={r} />
          ))}
          {response && withReferences.length === 0 && <p className="text-sm text-ink-faint">No translated limit has a published bound in the same quantity to plot against.</p>}
        </section>
      )}

      <TableOverB base={request} onRequest={setTableRequest} data={table.data} error={table.error} busy={table.isFetching} />
    </div>
  );
}
