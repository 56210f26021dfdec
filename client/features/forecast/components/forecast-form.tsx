import { useState, type FormEvent } from "react";
import { COALESCENCE_OPTIONS, MAX_FORECAST_B, type CurveInfoDto } from "../../../../common/forecasts.ts";
import type { PageForecast, PageForecastInput } from "../lib/forecast-url.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextArea, TextInput } from "../../../components/ui/field.tsx";
import { ApiError } from "../../../lib/api-client.ts";

interface DetectorRow {
  key: number;
  curve: string;
  label: string;
  f_low: string;
  years_observed: string;
  years_before_merger: string;
  orientation: "sky_averaged" | "optimal";
}

export interface FormState {
  m1: string;
  m2: string;
  chi1: string;
  chi2: string;
  distanceKind: "distance_mpc" | "z";
  distance: string;
  detectors: DetectorRow[];
  /** Each network as the keys of its detectors. */
  networks: number[][];
  b: string;
  phi_c: string;
  chi_s: string;
  chi_a: string;
  credibility: string;
  sides: "two" | "one";
  upper_cut: "isco" | "merger_extrapolated";
  coalescence: Coalescence;
  /** More binaries for a grid, one "m1, m2" per line (same spins and distance as the first). */
  more: string;
}

type Coalescence = (typeof COALESCENCE_OPTIONS)[number];

let nextKey = 1;
const row = (curve: string): DetectorRow => ({ key: nextKey++, curve, label: "", f_low: "", years_observed: "", years_before_merger: "", orientation: "sky_averaged" });

/** A named starting point: detectors and which of them observe together. */
export const PRESETS: { id: string; name: string; curves: string[]; networks: number[][] }[] = [
  { id: "multiband", name: "Multi-band: LISA years before merger + aLIGO design", curves: ["aligo-design", "lisa"], networks: [[0], [1], [0, 1]] },
  { id: "ground", name: "Ground: aLIGO design against ET-B", curves: ["aligo-design", "et-b"], networks: [[0], [1], [0, 1]] },
  { id: "space", name: "Space: LISA, TianQin and DECIGO", curves: ["lisa", "tianqin", "decigo"], networks: [[0], [1], [2], [0, 1]] },
];

export function presetState(id: string, base?: FormState): FormState {
  const preset = PRESETS.find((p) => p.id === id) ?? PRESETS[0]!;
  const detectors = preset.curves.map(row);
  return {
    m1: "36",
    m2: "29",
    chi1: "0",
    chi2: "0",
    distanceKind: "distance_mpc",
    distance: "410",
    b: "-13, -11, -9, -7, -6, -5, -4, -3, -2, -1, 1, 2, 4, 5, 6",
    phi_c: String(Math.PI.toFixed(4)),
    chi_s: "1",
    chi_a: "1",
    credibility: "0.9",
    sides: "two",
    upper_cut: "isco",
    coalescence: "shared",
    more: "",
    ...(base ?? {}),
    detectors,
    networks: preset.networks.map((n) => n.map((i) => detectors[i]!.key)),
  };
}

const num = (s: string) => (s.trim() === "" ? undefined : Number(s));
const prior = (s: string) => (s.trim() === "" || s.trim().toLowerCase() === "none" ? null : Number(s));

/** The request as the API takes it; numbers the user left blank are left out (server defaults). */
export function toRequest(s: FormState): PageForecastInput {
  const index = new Map(s.detectors.map((d, i) => [d.key, i]));
  const source = { m1: Number(s.m1), m2: Number(s.m2), chi1: Number(s.chi1 || 0), chi2: Number(s.chi2 || 0), frame: "source" as const, [s.distanceKind]: Number(s.distance) };
  const more = s.more
    .split(/\n/)
    .map((l) => l.trim())
    .filter(Boolean)
    .map((l) => {
      const [a = "", b = ""] = l.split(/[\s,;]+/);
      return { ...source, m1: Number(a), m2: Number(b) };
    });
  return {
    source,
    ...(more.length > 0 ? { more_sources: more } : {}),
    detectors: s.detectors.map((d) => ({
      curve: d.curve,
      ...(d.label.trim() ? { label: d.label.trim() } : {}),
      ...(num(d.f_low) !== undefined ? { f_low: num(d.f_low) } : {}),
      ...(num(d.years_observed) !== undefined ? { years_observed: num(d.years_observed) } : {}),
      ...(num(d.years_before_merger) !== undefined ? { years_before_merger: num(d.years_before_merger) } : {}),
      orientation: d.orientation,
    })),
    networks: s.networks.filter((n) => n.length > 0).map((n) => n.map((k) => index.get(k)!).filter((i) => i !== undefined)),
    b: s.b
      .split(/[\s,;]+/)
      .filter(Boolean)
      .map(Number),
    priors: { phi_c: prior(s.phi_c), chi_s: prior(s.chi_s), chi_a: prior(s.chi_a) },
    credibility: Number(s.credibility),
    sides: s.sides,
    upper_cut: s.upper_cut,
    ...(s.coalescence !== "shared" ? { coalescence: s.coalescence } : {}),
  };
}

const text = (v: number | undefined | null) => (v === undefined || v === null ? "" : String(v));

/** The form showing a request (from a link): the inverse of toRequest. */
export function stateFromRequest(r: PageForecast): FormState {
  const detectors = r.detectors.map((d): DetectorRow => ({
    ...row(d.curve),
    label: d.label ?? "",
    f_low: text(d.f_low),
    years_observed: text(d.years_observed),
    years_before_merger: text(d.years_before_merger),
    orientation: d.orientation,
  }));
  const distanceKind = r.source.distance_mpc !== undefined ? "distance_mpc" : "z";
  const prior = (v: number | null | undefined, fallback: string) => (v === undefined ? fallback : v === null ? "" : String(v));
  return {
    m1: String(r.source.m1),
    m2: String(r.source.m2),
    chi1: String(r.source.chi1),
    chi2: String(r.source.chi2),
    distanceKind,
    distance: text(distanceKind === "z" ? r.source.z : r.source.distance_mpc),
    detectors,
    networks: r.networks.map((n) => n.map((i) => detectors[i]?.key ?? -1).filter((k) => k >= 0)),
    b: r.b.join(", "),
    phi_c: prior(r.priors?.phi_c, String(Math.PI.toFixed(4))),
    chi_s: prior(r.priors?.chi_s, "1"),
    chi_a: prior(r.priors?.chi_a, "1"),
    credibility: String(r.credibility),
    sides: r.sides,
    upper_cut: r.upper_cut,
    coalescence: r.coalescence,
    more: (r.more_sources ?? []).map((x) => `${x.m1}, ${x.m2}`).join("\n"),
  };
}

const COALESCENCE_TEXT: Record<Coalescence, string> = {
  shared: "one φ_c and t_c for all (phase-coherent)",
  phi_c_per_detector: "a φ_c per detector",
  phi_c_t_c_per_detector: "a φ_c and t_c per detector",
};

interface Props {
  state: FormState;
  onChange: (s: FormState) => void;
  onSubmit: () => void;
  busy: boolean;
  error: unknown;
  /** Field errors found before sending (the same schema as the server's). */
  localErrors?: Record<string, string> | null;
  curves: CurveInfoDto[];
}

export function ForecastForm({ state, onChange, onSubmit, busy, error, localErrors, curves }: Props) {
  const [preset, setPreset] = useState(PRESETS[0]!.id);
  const fields = localErrors ?? (error instanceof ApiError ? error.fields : {});
  const set = (patch: Partial<FormState>) => onChange({ ...state, ...patch });
  const setDetector = (key: number, patch: Partial<DetectorRow>) => set({ detectors: state.detectors.map((d) => (d.key === key ? { ...d, ...patch } : d)) });
  const curveOf = (id: string) => curves.find((c) => c.id === id);
  const detName = (d: DetectorRow) => d.label || curveOf(d.curve)?.name || d.curve;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onSubmit();
  };
  const err = (path: string) => fields[path];

  return (
    <form onSubmit={submit} className="flex flex-col gap-5" data-testid="forecast-form" noValidate>
      <fieldset className="flex flex-wrap items-end gap-3 rounded border border-paper-edge p-3">
        <legend className="px-1 font-semibold">Start from</legend>
        <Field label="Preset">
          {(c) => (
            <Select {...c} value={preset} onChange={(e) => setPreset(e.target.value)} data-testid="forecast-preset">
              {PRESETS.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Button onClick={() => onChange(presetState(preset, state))} data-testid="forecast-apply-preset">
          Use preset
        </Button>
      </fieldset>

      <fieldset className="grid grid-cols-2 gap-3 rounded border border-paper-edge p-3 md:grid-cols-6">
        <legend className="px-1 font-semibold">Source (source frame)</legend>
        <Field label="m₁ [M☉]" error={err("source.m1")}>{(c) => <TextInput {...c} inputMode="decimal" value={state.m1} onChange={(e) => set({ m1: e.target.value })} />}</Field>
        <Field label="m₂ [M☉]" error={err("source.m2")}>{(c) => <TextInput {...c} inputMode="decimal" value={state.m2} onChange={(e) => set({ m2: e.target.value })} />}</Field>
        <Field label="χ₁ (aligned)" error={err("source.chi1")}>{(c) => <TextInput {...c} inputMode="decimal" value={state.chi1} onChange={(e) => set({ chi1: e.target.value })} />}</Field>
        <Field label="χ₂ (aligned)" error={err("source.chi2")}>{(c) => <TextInput {...c} inputMode="decimal" value={state.chi2} onChange={(e) => set({ chi2: e.target.value })} />}</Field>
        <Field label="Given">
          {(c) => (
            <Select {...c} value={state.distanceKind} onChange={(e) => set({ distanceKind: e.target.value === "z" ? "z" : "distance_mpc" })}>
              <option value="distance_mpc">luminosity distance [Mpc]</option>
              <option value="z">redshift z</option>
            </Select>
          )}
        </Field>
        <Field label={state.distanceKind === "z" ? "z" : "D_L [Mpc]"} error={err(`source.${state.distanceKind}`)}>
          {(c) => <TextInput {...c} inputMode="decimal" value={state.distance} onChange={(e) => set({ distance: e.target.value })} />}
        </Field>
        <Field
          label="More binaries for a grid (m₁, m₂ per line)"
          className="col-span-2 md:col-span-6"
          error={Object.entries(fields).find(([k]) => k.startsWith("more_sources"))?.[1] ?? Object.entries(fields).find(([k]) => /^sources\.[1-9]/.test(k))?.[1]}
          hint="Optional. Same spins and distance as above; with more binaries the forecast runs as a background job and a table compares them."
        >
          {(c) => (
            <TextArea {...c} rows={2} value={state.more} onChange={(e) => set({ more: e.target.value })} placeholder={"10, 10\n60, 50"} data-testid="forecast-more-sources" />
          )}
        </Field>
      </fieldset>

      <fieldset className="flex flex-col gap-3 rounded border border-paper-edge p-3">
        <legend className="px-1 font-semibold">Detectors</legend>
        {state.detectors.map((d, i) => {
          const curve = curveOf(d.curve);
          return (
            <div key={d.key} className="grid grid-cols-2 items-end gap-3 border-b border-paper-edge/60 pb-3 md:grid-cols-7" data-testid={`forecast-detector-${i}`}>
              <Field
                label={`#${i} curve`}
                error={err(`detectors.${i}.curve`)}
                className="md:col-span-2"
                hint={curve?.to_confirm ? <span className="text-amber" data-testid={`to-confirm-${i}`} title={curve.to_confirm}>source to be confirmed: channel convention</span> : undefined}
              >
                {(c) => (
                  <Select {...c} value={d.curve} onChange={(e) => setDetector(d.key, { curve: e.target.value })}>
                    {curves.map((cv) => (
                      <option key={cv.id} value={cv.id}>
                        {cv.name}
                        {cv.custom ? " (yours)" : ""}
                      </option>
                    ))}
                  </Select>
                )}
              </Field>
              <Field label="Label">{(c) => <TextInput {...c} value={d.label} placeholder={curve?.name ?? ""} onChange={(e) => setDetector(d.key, { label: e.target.value })} />}</Field>
              <Field label={<>f<sub>low</sub> [Hz]</>} error={err(`detectors.${i}.f_low`)} hint={curve ? `curve from ${curve.f_min} Hz` : undefined}>
                {(c) => <TextInput {...c} inputMode="decimal" value={d.f_low} placeholder={curve && !curve.space ? String(curve.default_f_low) : "window"} onChange={(e) => setDetector(d.key, { f_low: e.target.value })} />}
              </Field>
              {curve?.space ? (
                <>
                  <Field label="years observed" error={err(`detectors.${i}.years_observed`)}>
                    {(c) => <TextInput {...c} inputMode="decimal" value={d.years_observed} placeholder="4" onChange={(e) => setDetector(d.key, { years_observed: e.target.value })} />}
                  </Field>
                  <Field label="starting years before merger" error={err(`detectors.${i}.years_before_merger`)}>
                    {(c) => <TextInput {...c} inputMode="decimal" value={d.years_before_merger} placeholder="4" onChange={(e) => setDetector(d.key, { years_before_merger: e.target.value })} />}
                  </Field>
                </>
              ) : (
                <p className="text-xs text-ink-faint md:col-span-2">Observes up to merger; the band ends at the ISCO.</p>
              )}
              <div className="flex items-end gap-2">
                <Field label="Orientation">
                  {(c) => (
                    <Select {...c} value={d.orientation} onChange={(e) => setDetector(d.key, { orientation: e.target.value === "optimal" ? "optimal" : "sky_averaged" })}>
                      <option value="sky_averaged">sky-averaged</option>
                      <option value="optimal">optimal</option>
                    </Select>
                  )}
                </Field>
                <Button
                  kind="quiet"
                  disabled={state.detectors.length <= 1}
                  onClick={() => set({ detectors: state.detectors.filter((x) => x.key !== d.key), networks: state.networks.map((n) => n.filter((k) => k !== d.key)) })}
                  aria-label={`remove detector ${i}`}
                >
                  ✕
                </Button>
              </div>
            </div>
          );
        })}
        <div>
          <Button onClick={() => set({ detectors: [...state.detectors, row(curves[0]?.id ?? "aligo-design")] })}>Add a detector</Button>
        </div>
      </fieldset>

      <fieldset className="flex flex-col gap-2 rounded border border-paper-edge p-3">
        <legend className="px-1 font-semibold">Networks (detectors observing the same binary; their Fisher matrices add)</legend>
        {state.networks.map((n, ni) => (
          <div key={ni} className="flex flex-wrap items-center gap-3 text-sm" data-testid={`forecast-network-${ni}`}>
            <span className="w-24 text-ink-soft">network {ni + 1}</span>
            {state.detectors.map((d, di) => (
              <label key={d.key} className="flex items-center gap-1">
                <input
                  type="checkbox"
                  checked={n.includes(d.key)}
                  onChange={(e) => set({ networks: state.networks.map((m, mi) => (mi !== ni ? m : e.target.checked ? [...m, d.key] : m.filter((k) => k !== d.key))) })}
                />
                #{di} {detName(d)}
              </label>
            ))}
            <Button kind="quiet" onClick={() => set({ networks: state.networks.filter((_, mi) => mi !== ni) })} aria-label={`remove network ${ni + 1}`}>
              ✕
            </Button>
            {err(`networks.${ni}`) && <span className="text-brick">{err(`networks.${ni}`)}</span>}
          </div>
        ))}
        <div className="flex flex-wrap gap-2">
          <Button onClick={() => set({ networks: [...state.networks, []] })}>Add a network</Button>
          <Button
            onClick={() => set({ networks: [...state.detectors.map((d) => [d.key]), ...(state.detectors.length > 1 ? [state.detectors.map((d) => d.key)] : [])] })}
          >
            Each alone, and all together
          </Button>
        </div>
      </fieldset>

      <fieldset className="grid grid-cols-2 gap-3 rounded border border-paper-edge p-3 md:grid-cols-7">
        <legend className="px-1 font-semibold">Exponents, priors and bound</legend>
        <Field
          label="b values"
          error={err("b") ?? Object.entries(fields).find(([k]) => k.startsWith("b."))?.[1]}
          className="col-span-2 md:col-span-2"
          hint={`b = 2n − 5 at PN order n; more than ${MAX_FORECAST_B} values run as a background job`}
        >
          {(c) => <TextInput {...c} value={state.b} onChange={(e) => set({ b: e.target.value })} />}
        </Field>
        <Field label={<>σ prior φ<sub>c</sub></>} error={err("priors.phi_c")} hint="blank: no prior">{(c) => <TextInput {...c} value={state.phi_c} onChange={(e) => set({ phi_c: e.target.value })} />}</Field>
        <Field label={<>σ prior χ<sub>s</sub></>} error={err("priors.chi_s")}>{(c) => <TextInput {...c} value={state.chi_s} onChange={(e) => set({ chi_s: e.target.value })} />}</Field>
        <Field label={<>σ prior χ<sub>a</sub></>} error={err("priors.chi_a")}>{(c) => <TextInput {...c} value={state.chi_a} onChange={(e) => set({ chi_a: e.target.value })} />}</Field>
        <Field label="Credibility" error={err("credibility")}>{(c) => <TextInput {...c} value={state.credibility} onChange={(e) => set({ credibility: e.target.value })} />}</Field>
        <Field label="Sides">
          {(c) => (
            <Select {...c} value={state.sides} onChange={(e) => set({ sides: e.target.value === "one" ? "one" : "two" })}>
              <option value="two">two-sided |β|</option>
              <option value="one">one-sided</option>
            </Select>
          )}
        </Field>
        <Field label="Upper frequency cut" className="col-span-2 md:col-span-3">
          {(c) => (
            <Select {...c} value={state.upper_cut} onChange={(e) => set({ upper_cut: e.target.value === "merger_extrapolated" ? "merger_extrapolated" : "isco" })}>
              <option value="isco">ISCO of the detector-frame mass (inspiral only)</option>
              <option value="merger_extrapolated">PhenomA merger frequency (extrapolation, labelled)</option>
            </Select>
          )}
        </Field>
        <Field label="Coalescence phase and time" className="col-span-2 md:col-span-3" hint="per detector: for detectors that are not phase-coherent (space + ground, years apart); can only loosen a bound">
          {(c) => (
            <Select {...c} value={state.coalescence} onChange={(e) => set({ coalescence: COALESCENCE_OPTIONS.find((x) => x === e.target.value) ?? "shared" })} data-testid="forecast-coalescence">
              {COALESCENCE_OPTIONS.map((x) => (
                <option key={x} value={x}>
                  {COALESCENCE_TEXT[x]}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </fieldset>

      {localErrors && (
        <div role="alert" className="rounded border border-brick/40 bg-brick-wash p-3 text-sm text-brick" data-testid="forecast-error">
          Not sent: {Object.entries(localErrors).map(([k, v]) => `${k}: ${v}`).join("; ")}
        </div>
      )}
      {!localErrors && error !== null && error !== undefined && (
        <div role="alert" className="rounded border border-brick/40 bg-brick-wash p-3 text-sm text-brick" data-testid="forecast-error">
          {error instanceof Error ? error.message : String(error)}
        </div>
      )}
      <div>
        <Button type="submit" kind="primary" busy={busy} data-testid="forecast-run">
          Run the forecast
        </Button>
      </div>
    </form>
  );
}
