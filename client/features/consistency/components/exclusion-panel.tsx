import { thresholdText } from "../../../../common/number-text.ts";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { useEffect, useState, type FormEvent } from "react";
import { DEFAULT_TEST_CURVE, couplingExclusionRequestSchema, type CouplingExclusionRequest, type CouplingExclusionResponse } from "../../../../common/consistency.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { Caution, ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useTheories } from "../../catalogue/api/get-theories.ts";
import { useCurves } from "../../forecast/api/forecasts.ts";
import { useAuth } from "../../auth/components/auth-context.tsx";
import { useCouplingExclusion } from "../api/run-consistency.ts";

const num = (s: string) => (s.trim() === "" ? undefined : Number(s));
const sig = (x: number) => Number(x.toPrecision(3)).toString();

const VERDICT_TONE = { valid: "ok", outside_validity: "fail", not_assessed: "caution" } as const;
const VERDICT_LABEL = { valid: "valid", outside_validity: "outside validity", not_assessed: "not assessed" } as const;

function ExclusionTable({ data }: { data: CouplingExclusionResponse }) {
  const symbol = symbolText(data.coupling.symbol, data.coupling.latex);
  return (
    <table className="w-full min-w-[40rem] text-sm" data-testid="exclusion-table">
      <caption className="text-left text-ink-soft">
        Smallest {symbol} ({data.coupling.unit}) at which GR is excluded at {Math.round(data.credibility * 100)} %, remnant M<sub>f</sub> = {sig(data.remnant.M_f)} M☉, χ<sub>f</sub> = {sig(data.remnant.chi_f)}.
        Widths: inspiral σ(M<sub>f</sub>) = {sig(data.widths.inspiral.sigma_M_f)} M☉, σ(χ<sub>f</sub>) = {sig(data.widths.inspiral.sigma_chi_f)}, ρ = {data.widths.inspiral.rho.toFixed(2)} ({data.widths.inspiral.from}); merger-ringdown σ(M<sub>f</sub>) ={" "}
        {sig(data.widths.merger_ringdown.sigma_M_f)} M☉, σ(χ<sub>f</sub>) = {sig(data.widths.merger_ringdown.sigma_chi_f)}, ρ = {data.widths.merger_ringdown.rho.toFixed(2)} ({data.widths.merger_ringdown.from})
        {data.widths.forecast ? `; inspiral SNR ${data.widths.forecast.snr.toFixed(1)} on ${data.widths.forecast.f_low.toPrecision(3)}–${data.widths.forecast.f_high.toPrecision(4)} Hz` : ""}.
      </caption>
      <thead>
        <tr className="text-left">
          <th scope="col">side</th>
          <th scope="col">exact reading</th>
          <th scope="col">linear reading</th>
          <th scope="col">linear reading parts by 10 % from</th>
          {data.inspiral_bias && <th scope="col">inspiral bias past 1σ from</th>}
          <th scope="col">verdict</th>
        </tr>
      </thead>
      <tbody>
        {data.sides.map((s) => (
          <tr key={s.side} className="border-t border-paper-edge align-top">
            <td className="whitespace-nowrap pr-2">{s.side === "positive" ? `${symbol} > 0` : `${symbol} < 0`}</td>
            <td>{s.x === null ? <span className="text-ink-faint">{s.reason}</span> : sig(s.x)}</td>
            <td>{s.x_linear === null ? "—" : sig(s.x_linear)}</td>
            <td>{s.linear_breaks_at === null ? "not reached" : sig(s.linear_breaks_at)}</td>
            {data.inspiral_bias && (
              <td data-testid={`bias-sigma-${s.side}`}>
                {s.bias_exceeds_sigma_at === null ? "not reached" : sig(s.bias_exceeds_sigma_at)}
                {s.bias_sigmas_at_bound !== null && (
                  <p className={`text-xs ${s.bias_sigmas_at_bound > 1 ? "text-amber" : "text-ink-soft"}`}>
                    {s.bias_sigmas_at_bound.toFixed(1)}σ at the bound{s.bias_sigmas_at_bound > 1 ? ": linear bias stretched" : ""}
                  </p>
                )}
              </td>
            )}
            <td>
              <Badge tone={VERDICT_TONE[s.verdict]}>{VERDICT_LABEL[s.verdict]}</Badge>
              {s.validity
                .filter((c) => c.status !== "ok")
                .map((c) => (
                  <p key={c.label} className={`text-xs ${c.status === "fails" ? "text-brick" : "text-amber"}`}>
                    {conditionText(c.label)}: {sig(c.value ?? 0)} vs {thresholdText(c.max)}
                    {c.factor === null ? "" : ` (× ${sig(c.factor)}${c.status === "stretched" ? ", stretched: kept as valid" : ""})`}
                  </p>
                ))}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

const CURVE_FROM = { "test.forecast": "the forecast's detector", "test.inspiral_bias": "the detector chosen for the bias", default: "the default detector" } as const;

/** Whether the theory's inspiral term entered, with which detector and band, and the caution that goes with it. */
function InspiralBiasNote({ data }: { data: CouplingExclusionResponse }) {
  const b = data.inspiral_bias;
  const caution = data.inspiral_side;
  return (
    <div data-testid="inspiral-bias-note" className="flex flex-col gap-1 text-sm">
      <p>
        <Badge tone={b ? "ok" : "neutral"}>{b ? "inspiral bias included" : "no inspiral bias"}</Badge>{" "}
        {b ? (
          <>
            ppE term{b.terms.length > 1 ? "s" : ""} at b = {b.terms.map((t) => t.b).join(", ")}, linear bias from the Fisher matrix of {b.label} ({CURVE_FROM[b.curve_from]}), {b.f_low.toPrecision(3)}–{b.f_high.toPrecision(4)} Hz; per unit β:{" "}
            {b.terms.map((t, i) => (
              <span key={t.b}>
                {i > 0 ? "; " : ""}δ ln M<sub>f</sub> = {sig(t.d_ln_M_f_per_beta)}, δχ<sub>f</sub> = {sig(t.d_chi_f_per_beta)}
              </span>
            ))}
            .
          </>
        ) : (
          <span className="text-ink-soft">the inspiral estimate is the GR remnant.</span>
        )}
      </p>
      {caution && <Caution title={b ? "Linear bias: trusted to about one standard deviation" : undefined}>{caution}</Caution>}
    </div>
  );
}

/** One estimate's widths: standard deviations of M_f (solar masses) and chi_f, and their correlation. */
interface EstimateWidths {
  sigma_M_f: number;
  sigma_chi_f: number;
  rho?: number | undefined;
}

/** The widths of the test run above: from its two Gaussian summaries, or from the moments of its sample files. */
export interface TestWidths {
  from: "summaries" | "samples";
  inspiral: EstimateWidths;
  merger_ringdown: EstimateWidths;
}

interface Props {
  test: TestWidths | undefined;
  onTrack: (data: CouplingExclusionResponse | undefined) => void;
  /** The request the page's address holds (the form starts from it), and where a new one goes. */
  request: CouplingExclusionRequest | undefined;
  onRequest: (request: CouplingExclusionRequest) => void;
}

const str = (x: number | undefined) => (x === undefined ? "" : String(x));

/** "What coupling would this test exclude": a theory's ringdown shifts against the test's widths. */
export function ExclusionPanel({ test, onTrack, request, onRequest }: Props) {
  const theories = useTheories({});
  const ringdownTheories = (theories.data?.theories ?? []).filter((t) => t.mappings.some((m) => m.kind === "ringdown_frequency" || m.kind === "ringdown_damping" || m.kind === "remnant_mass" || m.kind === "remnant_spin"));
  const [slug, setSlug] = useState(request?.theory ?? "");
  const b0 = request?.binary;
  const [binary, setBinary] = useState(b0 ? { m1: str(b0.m1), m2: str(b0.m2), chi1: str(b0.chi1), chi2: str(b0.chi2), z: str(b0.z) } : { m1: "39", m2: "32", chi1: "0", chi2: "0", z: "0.09" });
  const [frame, setFrame] = useState<"detector" | "source">(b0?.frame ?? "detector");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const f0 = request?.test.forecast;
  const [widthsFrom, setWidthsFrom] = useState<"test" | "forecast">(f0 ? "forecast" : "test");
  const [fc, setFc] = useState({
    curve: f0?.curve ?? "aligo-design",
    f_low: str(f0 ? f0.f_low : 10),
    distance_mpc: str(f0?.distance_mpc),
    ringdown_snr: str(f0?.ringdown_snr ?? 20),
    years_observed: str(f0?.years_observed),
    years_before_merger: str(f0?.years_before_merger),
  });
  const b1 = request?.test.inspiral_bias;
  const [bias, setBias] = useState({ include: b1?.include ?? true, curve: b1?.curve ?? DEFAULT_TEST_CURVE });
  const { user } = useAuth();
  const curves = useCurves(user?.login ?? null);
  const builtIn = (curves.data?.curves ?? []).filter((c) => !c.custom && !c.space);
  // The forecast widths take any curve the forecasts take: ground, space (with an observing window) and the caller's own.
  const allCurves = curves.data?.curves ?? [];
  const fcCurve = allCurves.find((c) => c.id === fc.curve);
  const fcSpace = fcCurve?.space ?? false;
  const result = useCouplingExclusion(request);
  const serverFields = result.error instanceof ApiError ? result.error.fields : {};
  const shown = { ...serverFields, ...errors };
  const selected = ringdownTheories.find((t) => t.slug === (slug || ringdownTheories[0]?.slug));
  const hasPhaseTerm = selected?.mappings.some((m) => m.kind === "inspiral_phase" && !m.retired) ?? false;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (widthsFrom === "test" && !test) {
      setErrors({ test: "Run the test above first (two summaries or two sample files): its widths are used here (or forecast them for a detector)." });
      return;
    }
    const width = (p: EstimateWidths) => ({ sigma_M_f: p.sigma_M_f, sigma_chi_f: p.sigma_chi_f, ...(p.rho === undefined ? {} : { rho: p.rho }) });
    const forecast = Object.fromEntries(
      [
        ["curve", fc.curve],
        ["f_low", num(fc.f_low)],
        ["distance_mpc", num(fc.distance_mpc)],
        ...(fcSpace
          ? [
              ["years_observed", num(fc.years_observed)],
              ["years_before_merger", num(fc.years_before_merger)],
            ]
          : []),
        ["ringdown_snr", num(fc.ringdown_snr)],
      ].filter(([, v]) => v !== undefined),
    );
    const parsed = couplingExclusionRequestSchema.safeParse({
      theory: slug || ringdownTheories[0]?.slug || "",
      binary: Object.fromEntries([...Object.entries(binary).map(([k, v]) => [k, num(v)] as const).filter(([, v]) => v !== undefined), ["frame", frame]]),
      test:
        widthsFrom === "test" && test
          ? { inspiral: width(test.inspiral), merger_ringdown: width(test.merger_ringdown), ...(hasPhaseTerm ? { inspiral_bias: bias.include ? { curve: bias.curve } : { include: false } } : {}) }
          : { forecast, ...(hasPhaseTerm && !bias.include ? { inspiral_bias: { include: false } } : {}) },
    });
    if (!parsed.success) {
      const next: Record<string, string> = {};
      for (const issue of parsed.error.issues) next[issue.path.join(".")] ??= issue.message;
      setErrors(next);
      return;
    }
    setErrors({});
    onRequest(parsed.data);
  };

  const data = result.data;
  useEffect(() => onTrack(data), [data, onTrack]);

  return (
    <section className="flex flex-col gap-4 rounded border border-paper-edge p-4" aria-labelledby="exclusion-heading" data-testid="exclusion-panel">
      <h2 id="exclusion-heading" className="text-2xl">
        What coupling would this test exclude?
      </h2>
      <p className="max-w-3xl text-ink-soft">
        A theory that shifts the ringdown or the remnant makes a GR template infer a different remnant from the merger-ringdown part; its ppE term biases the inspiral
        part too. With the test's widths (from the test above, summaries or sample files, or forecast for a detector) and a binary, this finds the smallest coupling at which (0, 0) would leave
        the credible region, and draws the expected deviation over the contours.
      </p>
      <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          <Field label="Theory" error={shown.theory} className="col-span-2">
            {(control) => (
              <Select {...control} name="theory" value={slug || ringdownTheories[0]?.slug || ""} onChange={(e) => setSlug(e.target.value)}>
                {ringdownTheories.map((t) => (
                  <option key={t.slug} value={t.slug}>
                    {t.name}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          {(["m1", "m2", "chi1", "chi2", "z"] as const).map((k) => (
            <Field key={k} label={k === "z" ? "z" : k === "m1" || k === "m2" ? `${k} (M☉)` : k === "chi1" ? "χ1" : "χ2"} error={shown[`binary.${k}`]}>
              {(control) => <TextInput {...control} name={`binary.${k}`} inputMode="decimal" value={binary[k]} onChange={(e) => setBinary((b) => ({ ...b, [k]: e.target.value }))} />}
            </Field>
          ))}
          <Field label="Mass frame" error={shown["binary.frame"]}>
            {(control) => (
              <Select {...control} name="binary.frame" value={frame} onChange={(e) => setFrame(e.target.value === "source" ? "source" : "detector")}>
                <option value="detector">detector</option>
                <option value="source">source</option>
              </Select>
            )}
          </Field>
        </div>
        <fieldset className="flex flex-col gap-2">
          <legend className="font-semibold">Widths of the test</legend>
          <div className="flex flex-wrap gap-4">
            <label className="flex items-center gap-2">
              <input type="radio" name="widths-from" checked={widthsFrom === "test"} onChange={() => setWidthsFrom("test")} data-testid="widths-test" />
              {test?.from === "samples" ? "from the sample files above (their standard deviations and correlations)" : "from the test above"}
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" name="widths-from" checked={widthsFrom === "forecast"} onChange={() => setWidthsFrom("forecast")} data-testid="widths-forecast" />
              forecast for a detector (inspiral Fisher matrix, single-mode ringdown)
            </label>
          </div>
          {widthsFrom === "forecast" && (
            <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
              <Field label="Detector" error={shown["test.forecast.curve"]}>
                {(control) => (
                  <Select
                    {...control}
                    name="test.forecast.curve"
                    value={fc.curve}
                    onChange={(e) => {
                      const next = allCurves.find((c) => c.id === e.target.value);
                      // A space detector's band comes from its observing window unless f_low is given.
                      setFc((v) => ({ ...v, curve: e.target.value, f_low: next?.space ? "" : v.f_low === "" ? String(next?.default_f_low ?? 10) : v.f_low }));
                    }}
                  >
                    {allCurves.length === 0 && <option value={fc.curve}>{fc.curve}</option>}
                    {(
                      [
                        ["ground", allCurves.filter((c) => !c.custom && !c.space)],
                        ["space", allCurves.filter((c) => !c.custom && c.space)],
                        ["your curves", allCurves.filter((c) => c.custom)],
                      ] as const
                    )
                      .filter(([, list]) => list.length > 0)
                      .map(([group, list]) => (
                        <optgroup key={group} label={group}>
                          {list.map((c) => (
                            <option key={c.id} value={c.id}>
                              {c.name}
                            </option>
                          ))}
                        </optgroup>
                      ))}
                  </Select>
                )}
              </Field>
              <Field label={<>f<sub>low</sub> (Hz)</>} error={shown["test.forecast.f_low"]}>
                {(control) => (
                  <TextInput {...control} name="test.forecast.f_low" inputMode="decimal" value={fc.f_low} placeholder={fcSpace ? "window" : undefined} onChange={(e) => setFc((v) => ({ ...v, f_low: e.target.value }))} />
                )}
              </Field>
              {fcSpace && (
                <>
                  <Field label="Years observed" error={shown["test.forecast.years_observed"]} hint="blank: 4">
                    {(control) => <TextInput {...control} name="test.forecast.years_observed" inputMode="decimal" value={fc.years_observed} onChange={(e) => setFc((v) => ({ ...v, years_observed: e.target.value }))} />}
                  </Field>
                  <Field label="starting years before merger" error={shown["test.forecast.years_before_merger"]} hint="blank: 4">
                    {(control) => <TextInput {...control} name="test.forecast.years_before_merger" inputMode="decimal" value={fc.years_before_merger} onChange={(e) => setFc((v) => ({ ...v, years_before_merger: e.target.value }))} />}
                  </Field>
                </>
              )}
              <Field label="Distance (Mpc)" error={shown["test.forecast.distance_mpc"]} hint="blank: from z">
                {(control) => <TextInput {...control} name="test.forecast.distance_mpc" inputMode="decimal" value={fc.distance_mpc} onChange={(e) => setFc((v) => ({ ...v, distance_mpc: e.target.value }))} />}
              </Field>
              <Field label="Ringdown SNR" error={shown["test.forecast.ringdown_snr"] ?? shown["test.merger_ringdown"]}>
                {(control) => <TextInput {...control} name="test.forecast.ringdown_snr" inputMode="decimal" value={fc.ringdown_snr} onChange={(e) => setFc((v) => ({ ...v, ringdown_snr: e.target.value }))} />}
              </Field>
            </div>
          )}
        </fieldset>
        {hasPhaseTerm && (
          <fieldset className="flex flex-col gap-2" data-testid="inspiral-bias-options">
            <legend className="font-semibold">Inspiral side</legend>
            <label className="flex items-center gap-2">
              <input type="checkbox" name="test.inspiral_bias.include" checked={bias.include} onChange={(e) => setBias((v) => ({ ...v, include: e.target.checked }))} />
              <span>
                include the bias of the inspiral estimate from the entry&apos;s ppE term (linear, Fisher matrix on f<sub>low</sub> – split frequency)
              </span>
            </label>
            {bias.include && widthsFrom === "test" && (
              <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                <Field label="Detector for the bias" error={shown["test.inspiral_bias.curve"] ?? shown["test.inspiral_bias.f_low"]} hint="its noise curve sets the bias" className="col-span-2">
                  {(control) => (
                    <Select {...control} name="test.inspiral_bias.curve" value={bias.curve} onChange={(e) => setBias((v) => ({ ...v, curve: e.target.value }))}>
                      {(builtIn.length > 0 ? builtIn : [{ id: bias.curve, name: bias.curve }]).map((c) => (
                        <option key={c.id} value={c.id}>
                          {c.name}
                        </option>
                      ))}
                    </Select>
                  )}
                </Field>
              </div>
            )}
            {bias.include && widthsFrom === "forecast" && <p className="text-sm text-ink-soft">The bias uses the forecast&apos;s detector and band.</p>}
          </fieldset>
        )}
        {shown.test && (
          <p role="alert" className="text-sm text-brick">
            {shown.test}
          </p>
        )}
        <div>
          <Button kind="primary" type="submit" data-testid="run-exclusion" disabled={ringdownTheories.length === 0}>
            Find the excluded coupling
          </Button>
        </div>
      </form>
      {theories.isPending && <Loading what="the catalogue" />}
      {result.isFetching && <Loading what="the forecast" />}
      {result.error && !(result.error instanceof ApiError && Object.keys(result.error.fields).length > 0) && <ErrorNote error={result.error} title="The forecast failed." />}
      {data && (
        <>
          {/* Six columns do not fit a phone: the table scrolls sideways instead of squeezing the verdicts. */}
          <div className="overflow-x-auto">
            <ExclusionTable data={data} />
          </div>
          <InspiralBiasNote data={data} />
          <Caution title="Where this estimate stops being trustworthy">
            <ul className="list-disc pl-5">
              {data.cautions
                .filter((c) => c !== data.inspiral_side)
                .map((c) => (
                  <li key={c}>{conditionText(c)}</li>
                ))}
            </ul>
          </Caution>
        </>
      )}
    </section>
  );
}
