import { useCallback } from "react";
import type { StackJobResult } from "../../../../common/jobs.ts";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { MARK_STYLE } from "../../../components/ui/theory-labels.ts";
import type { PlotModule } from "../../../lib/plot.ts";
import { SaveToSheet } from "../../sheets/components/save-to-sheet.tsx";
import { CautionList } from "../../translate/components/caution-list.tsx";
import { PlotFigure } from "../../../components/ui/figure.tsx";
import { VerdictBadge } from "../../translate/components/results-table.tsx";
import { decadeLabel, formatPlain, SciNumber, unitText } from "../../translate/components/sci-number.tsx";

// Our palette: events in muted tones, the combination in the sea ink, bounds in brick.
const EVENT_TONES = ["#8c7a4f", "#5f7f9c", "#7b5d86", "#6f8f5a", "#a0664a", "#4f8c86"];
const SEA = "#24484a";
const BRICK = "#8f3a2c";
const pct = (x: number) => `${(Math.round(x * 1000) / 10).toString()}%`;

/** The bound as one line of text: "x ≤ v unit", "x ≥ v unit" or "x ∈ [lo, hi] unit". */
function Bound({ coupling }: { coupling: StackJobResult["coupling"] }) {
  const unit = unitText(coupling.unit);
  if (coupling.signed_interval) {
    return (
      <>
        {symbolText(coupling.symbol, coupling.latex)} ∈ [<SciNumber value={coupling.signed_interval[0]} />, <SciNumber value={coupling.signed_interval[1]} />] {unit}
      </>
    );
  }
  return (
    <>
      {symbolText(coupling.symbol, coupling.latex)} {coupling.side === "lower" ? "≥" : "≤"} <SciNumber value={coupling.value ?? Number.NaN} className="font-semibold" /> {unit}
    </>
  );
}

/** One name per event, told apart when two share a label. */
function seriesNames(data: StackJobResult): string[] {
  return data.events.map((e, i) => `${e.label}${e.used ? "" : " (left out)"}` + (data.events.filter((f) => f.label === e.label).length > 1 ? ` #${i + 1}` : ""));
}

/** Each event's coupling posterior (its likelihood under the stack's prior) and the combined one, with the combined bound marked. */
export function StackPlot({ data }: { data: StackJobResult }) {
  const build = useCallback(
    (Plot: PlotModule, width: number) => {
      const labels = seriesNames(data);
      const rows: { x: number; y: number; series: string }[] = [];
      data.events.forEach((_, i) => data.grid.x.forEach((x, j) => rows.push({ x, y: data.grid.events[i]![j]!, series: labels[i]! })));
      data.grid.x.forEach((x, j) => rows.push({ x, y: data.grid.combined[j]!, series: "combined" }));
      const positive = data.grid.x.every((x) => x > 0);
      const span = positive ? data.grid.x[data.grid.x.length - 1]! / data.grid.x[0]! : 0;
      const log = positive && span >= 100;
      const unit = unitText(data.coupling.unit);
      const marks = data.coupling.signed_interval ?? (data.coupling.value !== undefined ? [data.coupling.value] : []);
      const domain = [...labels, "combined"];
      return Plot.plot({
        width,
        height: 280,
        marginLeft: 50,
        style: { fontFamily: '"Source Serif 4", Georgia, serif', fontSize: "12px", background: "transparent" },
        x: { type: log ? "log" : "linear", label: `${symbolText(data.coupling.symbol, data.coupling.latex)}${unit ? ` (${unit})` : ""} →`, ...(log ? { tickFormat: decadeLabel } : { ticks: 5, tickFormat: (d: number) => formatPlain(d, 2) }) },
        y: { label: "↑ posterior density (peak = 1)", grid: true, domain: [0, 1.05] },
        // The legend is the figure's own (under the plot and in the downloaded files), not Plot's HTML swatches.
        color: { domain, range: [...labels.map((_, i) => EVENT_TONES[i % EVENT_TONES.length]!), SEA] },
        marks: [
          Plot.line(
            rows.filter((r) => r.series !== "combined" && (!log || r.x > 0)),
            { x: "x", y: "y", stroke: "series", strokeWidth: 1.4, strokeDasharray: "4,3" },
          ),
          Plot.line(
            rows.filter((r) => r.series === "combined"),
            { x: "x", y: "y", stroke: "series", strokeWidth: 2.6 },
          ),
          Plot.ruleX(marks, { stroke: BRICK, strokeWidth: 2 }),
          Plot.ruleY([0]),
        ],
      });
    },
    [data],
  );
  return (
    <PlotFigure
      build={build}
      width={620}
      title={`${data.theory_name}: each event's posterior of ${symbolText(data.coupling.symbol, data.coupling.latex)} and the combination`}
      filename={`${data.theory}-${data.coupling.symbol}-stack`}
      testId="stack-plot"
      legend={[
        ...seriesNames(data).map((name, i) => ({ mark: "╌", color: EVENT_TONES[i % EVENT_TONES.length]!, label: name })),
        { mark: "━", color: SEA, label: "combined" },
        { ...MARK_STYLE[data.verdict], label: `combined bound (brick line): ${MARK_STYLE[data.verdict].label}` },
      ]}
      cautions={data.cautions.map((c) => conditionText(c.message))}
      caption={`Dashed: each event's likelihood times the ${data.prior.kind.replace("_", " ")} prior, on the common grid; solid: their product (the combined posterior); brick: the combined ${pct(data.credibility)} ${data.coupling.side === "interval" ? "interval" : `${data.coupling.side} bound`}. Each curve is scaled to peak at 1.`}
    />
  );
}

export function StackResultView({ id, data }: { id: string; data: StackJobResult }) {
  const unit = unitText(data.coupling.unit);
  const used = data.events.filter((e) => e.used).length;
  return (
    <div className="flex flex-col gap-4" data-testid="stack-result">
      <div className="grid gap-4 rounded border border-paper-edge bg-white/40 p-4 sm:grid-cols-[1fr_1.4fr]">
        <div>
          <p className="text-sm text-ink-soft">
            {data.theory_name}, {used} of {data.events.length} events combined, {pct(data.credibility)} credibility, prior {data.prior.kind.replace("_", " ")}
            {data.prior.range ? ` on [${data.prior.range.join(", ")}]` : ""}
          </p>
          <p className="mt-1 text-2xl" data-testid="stack-bound">
            <Bound coupling={data.coupling} />
          </p>
          <p className="mt-2 flex flex-wrap items-center gap-2 text-sm" data-testid="stack-verdict" data-verdict={data.verdict}>
            <VerdictBadge verdict={data.verdict} />
            <span>at most {pct(data.fraction_outside)} of any used event's binaries are outside validity at the combined bound.</span>
          </p>
        </div>
        <CautionList cautions={data.cautions} testId="stack-cautions" />
      </div>
      <div className="relative overflow-x-auto rounded border border-paper-edge bg-white/40">
        <table className="w-full border-collapse text-[0.95rem]" data-testid="stack-events">
          <caption className="sr-only">Each event's own bound and whether it entered the combination</caption>
          <thead className="bg-paper-deep text-left text-sm">
            <tr>
              {["Event", "Input", `Own bound on ${symbolText(data.coupling.symbol, data.coupling.latex)}`, "Validity", "In the combination"].map((h) => (
                <th key={h} scope="col" className="border-b border-paper-edge px-3 py-2 font-semibold">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {data.events.map((e, i) => (
              <tr key={`${e.label}-${i}`} className="border-b border-paper-edge/70 align-top" data-testid={`stack-event-${i}`}>
                <td className="px-3 py-2">{e.label}</td>
                <td className="px-3 py-2 text-sm">{e.kind === "samples" ? "samples job" : "summary (quick estimate)"}</td>
                <td className="px-3 py-2 whitespace-nowrap">
                  {e.interval ? (
                    <>
                      [<SciNumber value={e.interval[0]} />, <SciNumber value={e.interval[1]} />] {unit}
                    </>
                  ) : e.bound === null ? (
                    "—"
                  ) : (
                    <>
                      {data.coupling.side === "lower" ? "≥" : "≤"} <SciNumber value={e.bound} /> {unit}
                    </>
                  )}
                </td>
                <td className="px-3 py-2 text-sm">{e.verdict === null ? "" : <VerdictBadge verdict={e.verdict} />}</td>
                <td className="px-3 py-2 text-sm text-ink-soft">{e.used ? "yes" : (e.reason ?? "left out")}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <StackPlot data={data} />
      <SaveToSheet what="this combined result" payload={{ kind: "stack", job: id }} defaults={{ label: `${data.theory}: ${data.events.map((e) => e.label).join(" + ")}`.slice(0, 120), analysis_method: "several events combined (posterior samples)" }} />
    </div>
  );
}
