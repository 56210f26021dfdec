import { useMemo, useState } from "react";
import { useSearchParams } from "react-router-dom";
import { useQueryClient } from "@tanstack/react-query";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { forecastKeys, useCurves, useForecast, type JobProgress } from "../../features/forecast/api/forecasts.ts";
import { CurveUpload } from "../../features/forecast/components/curve-upload.tsx";
import { ForecastForm, presetState, stateFromRequest, toRequest, type FormState } from "../../features/forecast/components/forecast-form.tsx";
import { ForecastGrid } from "../../features/forecast/components/forecast-grid.tsx";
import { BoundPlot, CouplingPlot } from "../../features/forecast/components/forecast-plots.tsx";
import { ForecastAssumptions, ForecastTable, TranslationTable } from "../../features/forecast/components/forecast-results.tsx";
import { SaveForecast } from "../../features/forecast/components/save-forecast.tsx";
import { FORECAST_PARAM, JOB_PARAM, readForecastParam, requestFieldErrors, runsAsJob } from "../../features/forecast/lib/forecast-url.ts";
import { Button } from "../../components/ui/button.tsx";
import { Field, Select } from "../../components/ui/field.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";

/**
 * The forecast page: a binary and a set of detectors in, the bound on β per network and what it means
 * for each theory out. The request lives in the address (?q=…), so a link reproduces the forecast.
 */
export function Component() {
  const { user } = useAuth();
  const curves = useCurves(user?.login ?? null);
  const [params, setParams] = useSearchParams();
  const fromUrl = useMemo(() => readForecastParam(params.get(FORECAST_PARAM)), [params]);
  const urlText = fromUrl.kind === "ok" ? fromUrl.text : null;
  const [state, setState] = useState<FormState>(() => (fromUrl.kind === "ok" ? stateFromRequest(fromUrl.request) : presetState("multiband")));
  const [localErrors, setLocalErrors] = useState<Record<string, string> | null>(null);
  const [progress, setProgress] = useState<JobProgress | null>(null);
  const qc = useQueryClient();

  // A link, back or forward: the form shows the request of the address (adjusted while rendering).
  const [formFor, setFormFor] = useState(urlText);
  if (formFor !== urlText) {
    setFormFor(urlText);
    if (fromUrl.kind === "ok") setState(stateFromRequest(fromUrl.request));
  }

  // A background job's id rides in the address beside the request (?job=), so a reload reads it back.
  const jobId = params.get(JOB_PARAM);
  const run = useForecast(fromUrl.kind === "ok" ? { input: fromUrl.input, text: fromUrl.text, job: runsAsJob(fromUrl.request) } : undefined, setProgress, {
    id: jobId,
    onCreated: (id) =>
      setParams(
        (p) => {
          const next = new URLSearchParams(p);
          next.set(JOB_PARAM, id);
          return next;
        },
        { replace: true },
      ),
  });
  const submit = () => {
    const input = toRequest(state);
    const errors = requestFieldErrors(input);
    setLocalErrors(errors);
    if (errors) return;
    const text = JSON.stringify(input);
    if (text === urlText && run.error) void run.refetch();
    else setParams({ [FORECAST_PARAM]: text });
  };
  const cancel = () => void qc.cancelQueries({ queryKey: [...forecastKeys.all, "run", urlText] });
  // Which binary of a grid the plots, tables and save show (the first unless chosen; reset by a new request).
  const [shown, setShown] = useState<{ text: string | null; index: number }>({ text: null, index: 0 });
  const grid = run.data?.grid ?? null;
  const shownIndex = shown.text === urlText && grid && shown.index < grid.length ? shown.index : 0;
  const main = grid ? grid[shownIndex] : run.data?.main;
  const stale = run.data !== undefined && urlText !== null && JSON.stringify(toRequest(state)) !== urlText;

  return (
    <article className="flex flex-col gap-6">
      <header className="max-w-3xl">
        <h1 className="text-4xl leading-tight">Forecast a bound</h1>
        <p className="mt-3 text-lg leading-relaxed text-ink-soft">
          Which instrument would test a theory? Choose a binary and detectors — each alone, together, or a space detector years before merger with a ground detector at the end —
          and get a Fisher-matrix estimate of the bound on the ppE β at each b, and what it would mean for every catalogued coupling. An estimate for planning, not a measurement.
        </p>
      </header>
      {fromUrl.kind === "bad" && (
        <div role="alert" className="rounded border border-amber/40 bg-amber-wash p-3 text-sm text-amber" data-testid="forecast-bad-link">
          This link's forecast cannot be read ({fromUrl.message}); the form shows the preset instead.
        </div>
      )}
      {curves.isPending && <Loading what="noise curves" />}
      {curves.error && <ErrorNote error={curves.error} retry={() => void curves.refetch()} />}
      {curves.data && (
        <>
          <ForecastForm
            state={state}
            onChange={(s) => {
              setState(s);
              if (localErrors) setLocalErrors(null);
            }}
            onSubmit={submit}
            busy={run.isFetching}
            error={run.error}
            localErrors={localErrors}
            curves={curves.data.curves}
          />
          {user && <CurveUpload curves={curves.data.curves} />}
        </>
      )}
      {run.isFetching && progress && (
        <div className="flex flex-wrap items-center gap-3 text-sm" data-testid="forecast-job" aria-live="polite">
          <span>{progress.status === "queued" ? "Waiting for a worker" : "Computing"} (a background job: many values of b or several binaries)</span>
          <progress className="h-3 w-64" max={1} value={progress.progress} aria-label="forecast job progress" data-testid="forecast-job-progress" />
          <Button kind="quiet" onClick={cancel} data-testid="forecast-job-cancel">
            Cancel
          </Button>
        </div>
      )}
      {run.data && main && (
        <section className="flex flex-col gap-5" data-testid="forecast-results" aria-live="polite">
          <h2 className="text-2xl">Forecast</h2>
          {stale && (
            <p className="rounded border border-amber/40 bg-amber-wash p-2 text-sm text-amber" data-testid="forecast-stale">
              The form has changed since this forecast was made: run it again to update the numbers below.
            </p>
          )}
          {grid && (
            <Field label="Plots, tables and saving for the binary">
              {(c) => (
                <Select {...c} value={String(shownIndex)} onChange={(e) => setShown({ text: urlText, index: Number(e.target.value) })} data-testid="forecast-shown-binary" className="max-w-xs">
                  {grid.map((f, i) => (
                    <option key={i} value={i}>
                      {Number(f.source.m1.toPrecision(4))} + {Number(f.source.m2.toPrecision(4))} M☉ (source frame)
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          )}
          <BoundPlot result={main} />
          <ForecastTable result={main} />
          <ForecastAssumptions result={main} />
          {run.data.grid && <ForecastGrid forecasts={run.data.grid} />}
          <h2 className="text-2xl">What it would mean for the theories</h2>
          <CouplingPlot result={main} />
          <TranslationTable result={main} />
          <SaveForecast result={main} />
        </section>
      )}
    </article>
  );
}
