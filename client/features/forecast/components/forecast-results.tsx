import type { ForecastResponse } from "../../../../common/forecasts.ts";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { Caution } from "../../../components/ui/states.tsx";
import { conditionText, texText } from "../../../../common/symbol-text.ts";
import { thresholdText } from "../../../components/ui/text-format.ts";
import { SciNumber, unitText } from "../../translate/components/sci-number.tsx";
import { NETWORK_COLOURS, networkName } from "./forecast-plots.tsx";

const VERDICT_TEXT = { valid: "valid", outside_validity: "outside validity", not_assessed: "not assessed" } as const;

const STATUS_TEXT = { ok: "", ill_conditioned: "ill-conditioned", no_constraint: "no constraint" } as const;

function Hz({ f }: { f: number }) {
  return <span className="tabular-nums">{Number(f.toPrecision(4))} Hz</span>;
}

/** What every number below rests on: bands, priors, the frequency cut, and the cautions. */
export function ForecastAssumptions({ result }: { result: ForecastResponse }) {
  const p = result.priors;
  const prior = (v: number | null) => (v === null ? "none" : `σ = ${Number(v.toPrecision(4))}`);
  return (
    <section className="flex flex-col gap-2 text-sm" data-testid="forecast-assumptions">
      <h3 className="text-lg">What this forecast assumes</h3>
      <ul className="list-disc pl-5 text-ink-soft">
        <li>
          Source: {result.source.m1.toPrecision(4)} + {result.source.m2.toPrecision(4)} M☉ (source frame), χ₁ = {result.source.chi1}, χ₂ = {result.source.chi2}, D<sub>L</sub> ={" "}
          {result.source.distance_mpc.toPrecision(4)} Mpc, z = {result.source.z.toPrecision(3)}; ISCO of the detector-frame mass <Hz f={result.source.f_isco_hz} />.
        </li>
        <li data-testid="forecast-priors">
          Gaussian priors: φ<sub>c</sub> {prior(p.phi_c)}, χ<sub>s</sub> {prior(p.chi_s)}, χ<sub>a</sub> {prior(p.chi_a)}. Bounds are {Math.round(result.credibility * 100)} % {result.sides}-sided
          (|β| &lt; {result.multiplier.toFixed(3)} σ<sub>β</sub>).
        </li>
        <li data-testid="forecast-coalescence-used">
          {result.coalescence === "shared" ? (
            <>
              One coalescence phase φ<sub>c</sub> and time t<sub>c</sub> for all detectors of a network (phase-coherent).
            </>
          ) : (
            <>
              Each detector of a network has its own coalescence phase φ<sub>c</sub>
              {result.coalescence === "phi_c_per_detector" ? "" : <> and time t<sub>c</sub></>} (not phase-coherent); the φ<sub>c</sub> prior stays on the first detector&apos;s.
            </>
          )}
        </li>
        {result.detectors.map((d) => (
          <li key={d.index}>
            {d.label}: <Hz f={d.f_low} /> ({d.low_cut}) to <Hz f={d.f_high} /> ({d.high_cut}), {d.orientation === "optimal" ? "optimal orientation" : "sky-averaged"}, SNR{" "}
            {d.snr.toPrecision(3)}
            {d.extrapolated && <strong className="text-amber"> — extrapolated past the ISCO</strong>}
            {d.to_confirm && (
              <span className="ml-1 rounded bg-amber-wash px-1 text-xs text-amber" title={d.to_confirm} data-testid="band-to-confirm">
                source to be confirmed
              </span>
            )}
          </li>
        ))}
      </ul>
      {result.cautions.length > 0 && (
        <Caution title="Read before quoting">
          <ul className="list-disc pl-5">
            {result.cautions.map((c) => (
              <li key={c}>{conditionText(c)}</li>
            ))}
          </ul>
        </Caution>
      )}
    </section>
  );
}

/** b down the side, one column per network: the bound, with its status beside it. */
export function ForecastTable({ result }: { result: ForecastResponse }) {
  const bs = result.networks[0]?.rows.map((r) => r.b) ?? [];
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm" data-testid="forecast-table">
        <caption className="mb-2 text-left text-ink-soft">
          Forecast {Math.round(result.credibility * 100)} % bound on |β| ({result.sides}-sided), Fisher-matrix estimate; condition number of the scaled matrix in grey.
        </caption>
        <thead>
          <tr className="border-b border-paper-edge text-left">
            <th className="py-1 pr-3">b</th>
            {result.networks.map((n, i) => (
              <th key={i} className="py-1 pr-3" style={{ color: NETWORK_COLOURS[i] }}>
                {networkName(result, i)}
                <div className="text-xs font-normal text-ink-faint">
                  SNR {n.snr.total.toPrecision(3)}
                  {n.snr.total < 10 && <span className="ml-1 rounded bg-amber-wash px-1 text-amber" title="Below SNR 10 a Fisher estimate is not trustworthy (common practice)">low SNR</span>}
                </div>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {bs.map((b, bi) => (
            <tr key={b} className="border-b border-paper-edge/60 align-top">
              <th className="py-1 pr-3 text-left tabular-nums">{b}</th>
              {result.networks.map((n, ni) => {
                const row = n.rows[bi]!;
                return (
                  <td key={ni} className="py-1 pr-3" data-testid={`forecast-cell-${ni}-${b}`}>
                    {row.bound !== null ? <SciNumber value={row.bound} /> : <span className="text-ink-faint">—</span>}
                    {row.condition_number !== null && row.bound !== null && (
                      <span className="ml-2 text-xs text-ink-faint">
                        κ <SciNumber value={row.condition_number} digits={1} />
                      </span>
                    )}
                    {row.status !== "ok" && <div className={`text-xs ${row.status === "no_constraint" ? "text-ink-faint" : "text-amber"}`}>{STATUS_TEXT[row.status]}</div>}
                    {row.note && row.status !== "no_constraint" && <div className="text-xs text-amber">{conditionText(row.note)}</div>}
                    {row.note && row.status === "no_constraint" && <div className="text-xs text-ink-faint">{conditionText(row.note)}</div>}
                    {row.bound !== null && n.snr.total < 10 && <div className="text-xs text-amber">SNR &lt; 10: not trustworthy</div>}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
      {result.networks.some((n) => n.cautions.length > 0) && (
        <ul className="mt-2 list-disc pl-5 text-xs text-amber">
          {result.networks.flatMap((n, i) => n.cautions.map((c) => <li key={`${i}-${c}`}>{networkName(result, i)}: {c}</li>))}
        </ul>
      )}
    </div>
  );
}

type Result = ForecastResponse["translations"][number]["results"][number];
type Reference = Result["reference_bounds"][number];

/** The TeX of a symbol the result knows (the coupling, its other units, the canonical form). */
function latexOf(x: Result, symbol: string): string | null {
  const known = [x.coupling, ...x.also, x.canonical, ...(x.signed_interval ? [x.signed_interval] : [])];
  return known.find((q) => q.symbol === symbol)?.latex ?? null;
}

/** A published bound beside the forecast: the comparison in words, its symbol typeset. */
function Published({ x, r }: { x: Result; r: Reference }) {
  const tex = latexOf(x, r.symbol);
  const symbol = tex ? <MathTex tex={tex} label={texText(tex)} /> : <span>{conditionText(r.symbol)}</span>;
  const bound = (
    <>
      {symbol} {r.side === "upper" ? "<" : ">"} <SciNumber value={r.value} digits={3} /> {unitText(r.unit)}
      {r.credibility !== null ? `, ${Math.round(r.credibility * 100)} %` : ", credibility not stated"}
    </>
  );
  const cite = r.reference.citation;
  if (r.verdict === "tighter" || r.verdict === "weaker" || r.verdict === "equal") {
    const ratio = r.ratio === null ? null : r.verdict === "weaker" ? 1 / r.ratio : r.ratio;
    return (
      <div>
        {r.verdict === "equal" ? "as tight as" : `${ratio === null ? "" : `${Number(ratio.toPrecision(3))} times `}${r.verdict === "tighter" ? "tighter" : "weaker"} than`} {cite} ({bound})
      </div>
    );
  }
  return (
    <div>
      {cite}: {bound}
      <span className="text-ink-faint">{r.verdict === "not_compared" ? " (not compared: this limit is outside the validity of its mapping)" : " (not comparable)"}</span>
    </div>
  );
}

/** Every translated limit: theory, network, coupling, verdict and the published bounds beside it. */
export function TranslationTable({ result }: { result: ForecastResponse }) {
  const rows = result.translations.flatMap((t) => t.results.map((x) => ({ t, x })));
  const skipped = result.translations.flatMap((t) => t.not_applicable.map((x) => ({ t, x })));
  if (rows.length === 0 && skipped.length === 0) return <p className="text-sm text-ink-faint">No catalogued theory enters at a b this forecast could bound.</p>;
  return (
    <div className="overflow-x-auto">
      {/* On phones each limit is a small card (theory, then network and limit, verdict, published) instead of a wide row. */}
      <table className="w-full border-collapse text-sm max-md:block" data-testid="forecast-translations">
        <caption className="max-md:block mb-2 text-left text-ink-soft">What each network's bound would mean for the catalogued theories (the translator's closed forms and validity checks).</caption>
        <thead>
          <tr className="border-b border-paper-edge text-left max-md:hidden">
            <th className="py-1 pr-3">theory</th>
            <th className="py-1 pr-3">network</th>
            <th className="py-1 pr-3">forecast limit</th>
            <th className="py-1 pr-3">validity</th>
            <th className="py-1 pr-3">published</th>
          </tr>
        </thead>
        <tbody className="max-md:block">
          {rows.map(({ t, x }) => (
            <tr
              key={`${t.network}-${t.b}-${t.interval.join(":")}-${x.theory}-${x.convention}`}
              className="border-b border-paper-edge/60 align-top max-md:grid max-md:grid-cols-2 max-md:gap-x-3 max-md:gap-y-1 max-md:py-2"
            >
              <td className="py-1 pr-3 max-md:col-span-2 max-md:py-0 max-md:font-semibold">
                {conditionText(x.theory_name)} <span className="text-xs text-ink-faint">(b = {t.b})</span>
              </td>
              <td className="py-1 pr-3" style={{ color: NETWORK_COLOURS[t.network] }}>
                {networkName(result, t.network)}
                {result.networks[t.network]!.snr.total < 10 && <div className="text-xs text-amber">SNR &lt; 10</div>}
              </td>
              <td className="py-1 pr-3" data-testid="forecast-limit">
                <MathTex tex={x.coupling.latex} label={texText(x.coupling.latex)} /> {x.coupling.side === "upper" ? "<" : ">"} <SciNumber value={x.coupling.value} /> {unitText(x.coupling.unit)}
                {t.sides === "one" && (
                  <div className="text-xs text-ink-faint">
                    from β {t.interval[0] !== null ? "> −" : "< "}
                    <SciNumber value={t.beta_max} digits={2} /> (one-sided)
                  </div>
                )}
              </td>
              <td className={`py-1 pr-3 ${x.verdict === "valid" ? "" : "text-amber"}`} data-verdict={x.verdict} data-testid="forecast-verdict">
                {VERDICT_TEXT[x.verdict]}
                {x.validity
                  .filter((v) => v.status !== "ok")
                  .map((v) => (
                    <div key={v.label} className="text-xs">
                      {v.status === "fails" ? "fails" : "stretched"}
                      {v.factor !== null ? ` ×${thresholdText(Number(v.factor.toPrecision(2)))}` : ""}: {conditionText(v.label)}
                      {v.value !== null && (
                        <>
                          {" "}
                          (<SciNumber value={v.value} digits={2} /> &gt; {thresholdText(v.max)})
                        </>
                      )}
                    </div>
                  ))}
              </td>
              <td className="py-1 pr-3 text-xs max-md:col-span-2 max-md:py-0">
                {x.reference_bounds.length === 0 ? <span className="text-ink-faint">—</span> : x.reference_bounds.map((r) => <Published key={r.reference.key + r.value} x={x} r={r} />)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {skipped.length > 0 && (
        <details className="mt-2 text-xs text-ink-soft">
          <summary>Theories that give no limit here ({skipped.length})</summary>
          <ul className="list-disc pl-5">
            {skipped.map(({ t, x }) => (
              <li key={`${t.network}-${t.b}-${t.interval.join(":")}-${x.theory}`}>
                {x.theory_name}, {networkName(result, t.network)}, b = {t.b}: {x.reason}
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
