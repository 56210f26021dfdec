import { useCallback } from "react";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import type { SamplesJobResult } from "../../../../common/jobs.ts";
import { SaveToSheet } from "../../sheets/components/save-to-sheet.tsx";
import type { PlotModule } from "../../../lib/plot.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { CautionList } from "../../translate/components/caution-list.tsx";
import { PlotFigure } from "../../../components/ui/figure.tsx";
import { MARK_STYLE } from "../../../components/ui/theory-labels.ts";
import { VerdictBadge } from "../../translate/components/results-table.tsx";
import { decadeLabel, formatPlain, SciNumber, unitText } from "../../translate/components/sci-number.tsx";

const SEA = "#24484a";
const BRICK = "#8f3a2c";
const pct = (x: number) => `${(Math.round(x * 1000) / 10).toString()}%`;

function CouplingHistogram({ data }: { data: SamplesJobResult }) {
  const build = useCallback(
    (Plot: PlotModule, width: number) => {
      const h = data.histogram;
      const bins = h.mass.map((mass, i) => ({ x1: h.edges[i]!, x2: h.edges[i + 1]!, mass }));
      if (bins.length === 0) throw new Error("no sample to plot");
      const unit = unitText(data.coupling.unit);
      const marks = data.coupling.signed_interval ?? (data.coupling.value !== undefined ? [data.coupling.value] : []);
      const log = h.scale === "log";
      const wide = log && bins[bins.length - 1]!.x2 / bins[0]!.x1 >= 100;
      return Plot.plot({
        width,
        height: 240,
        marginLeft: 50,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent" },
        x: { type: log ? "log" : "linear", label: `${symbolText(data.coupling.symbol, data.coupling.latex)}${unit ? ` (${unit})` : ""} →`, ...(wide ? { tickFormat: decadeLabel } : { ticks: 4, tickFormat: (d: number) => formatPlain(d, 2) }) },
        y: { label: "↑ posterior mass", grid: true },
        marks: [
          Plot.rectY(bins, { x1: "x1", x2: "x2", y: "mass", fill: SEA, fillOpacity: 0.55, inset: 0.5 }),
          Plot.ruleY([0]),
          Plot.ruleX(marks, { stroke: BRICK, strokeWidth: 2 }),
        ],
      });
    },
    [data],
  );
  return (
    <PlotFigure
      build={build}
      width={560}
      title={`${data.theory_name}: posterior of ${symbolText(data.coupling.symbol, data.coupling.latex)}`}
      filename={`${data.theory}-${data.coupling.symbol}-posterior`}
      testId="job-histogram"
      legend={[{ ...MARK_STYLE[data.verdict], label: `the bound (brick line): ${MARK_STYLE[data.verdict].label}` }]}
      cautions={data.cautions.map((c) => conditionText(c.message))}
      caption={`The coupling's posterior under the ${data.prior.kind.replace("_", " ")} prior (weighted); brick: the ${pct(data.credibility)} ${data.coupling.side === "interval" ? "interval" : `${data.coupling.side} bound`}.`}
    />
  );
}

export function SamplesJobResultView({ id, data }: { id: string; data: SamplesJobResult }) {
  const unit = unitText(data.coupling.unit);
  const c = data.coupling;
  return (
    <div className="flex flex-col gap-4" data-testid="job-result">
      <div className="grid gap-4 rounded border border-paper-edge bg-white/40 p-4 sm:grid-cols-[1fr_1.4fr]">
        <div>
          <p className="text-sm text-ink-soft">
            {data.theory_name}, b = {data.b}, {pct(data.credibility)} credibility, prior {data.prior.kind.replace("_", " ")}
          </p>
          <p className="mt-1 text-2xl" data-testid="job-bound">
            {c.signed_interval ? (
              <>
                {symbolText(c.symbol, c.latex)} ∈ [<SciNumber value={c.signed_interval[0]} />, <SciNumber value={c.signed_interval[1]} />] {unit}
              </>
            ) : (
              <>
                {symbolText(c.symbol, c.latex)} {c.side === "upper" ? "≤" : "≥"} <SciNumber value={c.value ?? Number.NaN} className="font-semibold" /> {unit}
              </>
            )}
          </p>
          <p className="mt-2 flex items-center gap-2 text-sm" data-testid="job-verdict" data-verdict={data.verdict}>
            <VerdictBadge verdict={data.verdict} />
            <span>{pct(data.fraction_outside)} of the posterior's binaries are outside validity at the bound.</span>
          </p>
          <p className="mt-1 text-sm text-ink-soft" data-testid="job-counts">
            {data.samples.used} of {data.samples.read} samples used; effective sample size {Math.round(data.effective_sample_size)}.
          </p>
          <p className="mt-1 text-xs text-ink-faint">
            {data.file.name} ({data.file.format}, SHA-256 {data.file.sha256.slice(0, 12)}…), columns {Object.entries(data.columns).map(([k, v]) => `${k} = ${v}`).join(", ")}; {data.seconds.toFixed(1)} s in the worker.
          </p>
          <a className="mt-2 inline-block text-sm underline" href={apiPaths.jobSamplesCsv(id)} data-testid="job-csv">
            Per-sample values (CSV)
          </a>
        </div>
        <CautionList cautions={data.cautions} testId="job-cautions" />
      </div>
      <CouplingHistogram data={data} />
      <SaveToSheet
        what="this samples result"
        payload={{ kind: "samples_job", job: id }}
        defaults={{ label: data.file.name.replace(/\.[^.]+$/, "").slice(0, 120), analysis_method: `posterior samples (${data.file.format} file)` }}
      />
    </div>
  );
}
