import { conditionText } from "../../../../common/symbol-text.ts";
import type { ConsistencyResult } from "../../../../common/consistency.ts";
import { Caution } from "../../../components/ui/states.tsx";
import { DeviationPlot, type DeviationMark } from "./deviation-plot.tsx";

const pct = (q: number) => `${(q * 100).toFixed(q > 0.999 ? 2 : 1)} %`;

/** A theory's expected deviation drawn over the contours, with its excluded couplings marked. */
export interface DeviationTrack {
  theory: string;
  track: { x: number; mean: [number, number] }[];
  marks: DeviationMark[];
  cautions: string[];
}

/** The quantile, the deviation's centre and widths, the plot and the cautions. */
export function ConsistencyResultView({ result, track }: { result: ConsistencyResult; track?: DeviationTrack | undefined }) {
  const [m0, m1] = result.deviation.mean;
  const c = result.deviation.covariance;
  const s0 = Math.sqrt(c[0][0]);
  const s1 = Math.sqrt(c[1][1]);
  return (
    <section className="flex flex-col gap-4" aria-label="Consistency result" data-testid="consistency-result">
      <div className="flex flex-wrap items-baseline gap-x-8 gap-y-2">
        <p className="text-2xl">
          GR quantile <strong data-testid="gr-quantile">{pct(result.gr_quantile)}</strong>
        </p>
        <p className="text-sm text-ink-soft">
          (0, 0) lies on the {pct(result.gr_quantile)} credible contour: {result.gr_quantile < 0.68 ? "consistent with general relativity at the usual levels" : result.gr_quantile < 0.95 ? "in the tail; not a significant deviation on its own" : "outside the 95 % region"}.
        </p>
      </div>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-4">
        <dt className="text-ink-faint">
          ΔM<sub>f</sub>/M̄<sub>f</sub>
        </dt>
        <dd>
          {m0.toFixed(3)} ± {s0.toFixed(3)}
        </dd>
        <dt className="text-ink-faint">
          Δχ<sub>f</sub>/χ̄<sub>f</sub>
        </dt>
        <dd>
          {m1.toFixed(3)} ± {s1.toFixed(3)}
        </dd>
        <dt className="text-ink-faint">correlation</dt>
        <dd>{(c[0][1] / (s0 * s1)).toFixed(2)}</dd>
        <dt className="text-ink-faint">split frequency</dt>
        <dd data-testid="split-frequency">
          {result.split_frequency_hz === undefined ? "not computed (source-frame masses need z)" : `${result.split_frequency_hz.toFixed(1)} Hz`}
        </dd>
      </dl>
      {result.split && (
        <p className="text-sm text-ink-soft" data-testid="split-source">
          Split frequency at twice the orbital frequency of the ISCO of the {result.split.from === "full_signal" ? "full-signal" : "inspiral estimate's"} remnant (M<sub>f</sub> ={" "}
          {result.split.M_f.toPrecision(4)} M☉ in the detector frame, χ<sub>f</sub> = {result.split.chi_f.toFixed(3)}; Ghosh et al. 2016, 2018)
          {result.split.from === "inspiral" ? ". The published analyses split at the full-signal remnant: give it under “full-signal remnant” when you have it." : "."}
        </p>
      )}
      <DeviationPlot
        contours={result.contours}
        mean={result.deviation.mean}
        {...(track ? { track: track.track, marks: track.marks, trackName: track.theory } : {})}
        cautions={[...result.cautions, ...(track?.cautions ?? []).map((c) => `${track?.theory}: ${c}`)]}
        title="Deviation from the remnant estimates"
        filename="imr-consistency"
      />
      <Caution title="Read this beside the number">
        <ul className="list-disc pl-5" data-testid="consistency-cautions">
          {result.cautions.map((c) => (
            <li key={c}>{conditionText(c)}</li>
          ))}
        </ul>
      </Caution>
    </section>
  );
}
