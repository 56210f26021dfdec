import { useState } from "react";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { useCurves, useRunForecast } from "../../features/forecast/api/forecasts.ts";
import { CurveUpload } from "../../features/forecast/components/curve-upload.tsx";
import { ForecastForm, presetState, toRequest, type FormState } from "../../features/forecast/components/forecast-form.tsx";
import { BoundPlot, CouplingPlot } from "../../features/forecast/components/forecast-plots.tsx";
import { ForecastAssumptions, ForecastTable, TranslationTable } from "../../features/forecast/components/forecast-results.tsx";
import { SaveForecast } from "../../features/forecast/components/save-forecast.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";

/** The forecast page: a binary and a set of detectors in, the bound on β per network and what it means for each theory out. */
export function Component() {
  const { user } = useAuth();
  const curves = useCurves(user?.login ?? null);
  const run = useRunForecast();
  const [state, setState] = useState<FormState>(() => presetState("multiband"));

  return (
    <article className="flex flex-col gap-6">
      <header className="max-w-3xl">
        <h1 className="text-4xl leading-tight">Forecast a bound</h1>
        <p className="mt-3 text-lg leading-relaxed text-ink-soft">
          Which instrument would test a theory? Choose a binary and detectors — each alone, together, or a space detector years before merger with a ground detector at the end —
          and get a Fisher-matrix estimate of the bound on the ppE β at each b, and what it would mean for every catalogued coupling. An estimate for planning, not a measurement.
        </p>
      </header>
      {curves.isPending && <Loading what="noise curves" />}
      {curves.error && <ErrorNote error={curves.error} retry={() => void curves.refetch()} />}
      {curves.data && (
        <>
          <ForecastForm state={state} onChange={setState} onSubmit={() => run.mutate(toRequest(state))} busy={run.isPending} error={run.error} curves={curves.data.curves} />
          {user && <CurveUpload curves={curves.data.curves} />}
        </>
      )}
      {run.data && (
        <section className="flex flex-col gap-5" data-testid="forecast-results" aria-live="polite">
          <h2 className="text-2xl">Forecast</h2>
          <BoundPlot result={run.data} />
          <ForecastTable result={run.data} />
          <ForecastAssumptions result={run.data} />
          <h2 className="text-2xl">What it would mean for the theories</h2>
          <CouplingPlot result={run.data} />
          <TranslationTable result={run.data} />
          <SaveForecast result={run.data} />
        </section>
      )}
    </article>
  );
}
