import { useCallback, useMemo, useState, type ReactNode } from "react";
import type { ConvertRequest, ConvertResponse, ConvertTableRequest, ConvertTableResponse } from "../../../../common/convert.ts";
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
import { catalogueVersionText } from "../../../../common/catalogue-version.ts";

/** Every theory the catalogue knows, at the b values it enters at, from whichever answer is at hand. */
export function theoryMarks(response: ConvertResponse | undefined, table: ConvertTableResponse | undefined): TheoryMark[] {
  const marks: TheoryMark[] = [];
  const add = (results: ConvertResponse["results"], na: ConvertResponse["not_applicable"]) => {
    for (const r of results) marks.push({ b: r.b, theory: r.theory });
    for (const n of na) for (const b of n.b) marks.push({ b, theory: n.theory });
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

interface Props {
  /** Shown under the results, with the request that produced them (the route puts "save to a sheet" here). */
  footer?: (request: ConvertRequest, response: ConvertResponse) => ReactNode;
}

/** The translate page's working area: the form, the results with their cautions, the plots, the table over b. */
export function TranslatePanel({ footer }: Props) {
  const [request, setRequest] = useState<ConvertRequest | undefined>();
  const [tableRequest, setTableRequest] = useState<ConvertTableRequest | undefined>();
  const convert = useConvert(request);
  const table = useConvertTable(tableRequest);
  const response = convert.data;

  const onConvention = useCallback((theory: string, convention: string) => {
    setRequest((r) => (r ? { ...r, conventions: { ...r.conventions, [theory]: convention } } : r));
  }, []);
  const marks = useMemo(() => theoryMarks(response, table.data), [response, table.data]);
  const points = useMemo(() => betaPoints(response, table.data), [response, table.data]);
  const withReferences = (response?.results ?? []).filter((r) => comparableQuantity(r) !== undefined);
  const fieldError = convert.error instanceof ApiError && Object.keys(convert.error.fields).length > 0;

  return (
    <div className="flex flex-col gap-10">
      <BoundForm onSubmit={(r) => setRequest({ ...r, ...(request?.conventions ? { conventions: request.conventions } : {}) })} serverError={convert.error} busy={convert.isFetching} />

      {convert.error && !fieldError && <ErrorNote error={convert.error} title="The bound could not be translated." />}

      {response && (
        <section aria-labelledby="results-title" className="flex flex-col gap-4" data-testid="results">
          <h2 id="results-title" className="text-2xl">
            Limits on the catalogued theories
          </h2>
          <p className="text-sm text-ink-soft">
            {response.bound.b === null ? "This bound has no single ppE exponent." : `At b = ${response.bound.b}, |β| ≤ ${response.bound.beta_max?.toPrecision(3)} in the exp(+iΨ) convention`}
            {`, ${Math.round(response.bound.credibility * 1000) / 10}% credibility; cosmology H₀ = ${response.cosmology.H0}, Ωₘ = ${response.cosmology.Omega_m}; catalogue of `}
            <span title={`catalogue version ${response.catalogue_revision}`} className="underline decoration-dotted">
              {catalogueVersionText(response.catalogue_revision)}
            </span>
            .
          </p>
          <CautionList cautions={response.cautions} testId="bound-cautions" />
          <ResultsTable results={response.results} onConvention={onConvention} />
          <NotApplicableList items={response.not_applicable} />
          {request && footer?.(request, response)}
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
