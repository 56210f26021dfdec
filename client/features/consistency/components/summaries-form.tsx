import { useState, type FormEvent, type ReactNode } from "react";
import { consistencyRequestSchema, type ConsistencyRequest } from "../../../../common/consistency.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";

type Estimate = Record<"M_f" | "chi_f" | "sigma_M_f" | "sigma_chi_f" | "rho", string>;

/** Invented demonstration numbers (a heavy binary, detector frame), not any published event. */
const DEMO: { inspiral: Estimate; merger_ringdown: Estimate } = {
  inspiral: { M_f: "63.1", chi_f: "0.66", sigma_M_f: "4.1", sigma_chi_f: "0.03", rho: "-0.8" },
  merger_ringdown: { M_f: "68.4", chi_f: "0.72", sigma_M_f: "4.6", sigma_chi_f: "0.08", rho: "0.9" },
};

const Mf = (
  <>
    M<sub>f</sub>
  </>
);
const chif = (
  <>
    χ<sub>f</sub>
  </>
);
const LABELS: Record<keyof Estimate, ReactNode> = {
  M_f: <>{Mf} (M☉)</>,
  chi_f: chif,
  sigma_M_f: <>σ({Mf}) (M☉)</>,
  sigma_chi_f: <>σ({chif})</>,
  rho: "correlation ρ",
};

const toNumber = (s: string): number | undefined => (s.trim() === "" ? undefined : Number(s));

interface Props {
  onSubmit: (request: ConsistencyRequest) => void;
  serverErrors: Record<string, string>;
  /** The request the page's address holds, shown in the form instead of the demonstration values. */
  initial?: ConsistencyRequest | undefined;
}

const text = (x: number | undefined) => (x === undefined ? "" : String(x));
const asEstimate = (e: ConsistencyRequest["inspiral"]): Estimate => ({
  M_f: text(e.M_f),
  chi_f: text(e.chi_f),
  sigma_M_f: text(e.sigma_M_f),
  sigma_chi_f: text(e.sigma_chi_f),
  rho: text(e.rho),
});

/** Two remnant estimates as Gaussian summaries: centre, widths and correlation of (M_f, chi_f). */
export function SummariesForm({ onSubmit, serverErrors, initial }: Props) {
  const [values, setValues] = useState(initial ? { inspiral: asEstimate(initial.inspiral), merger_ringdown: asEstimate(initial.merger_ringdown) } : DEMO);
  const [frame, setFrame] = useState<"detector" | "source">(initial?.frame ?? "detector");
  const [z, setZ] = useState(text(initial?.z));
  const [levels, setLevels] = useState(initial ? initial.levels.join(", ") : "0.68, 0.9, 0.95");
  const [full, setFull] = useState({ M_f: text(initial?.full_signal?.M_f), chi_f: text(initial?.full_signal?.chi_f) });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const shown = { ...serverErrors, ...errors };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const estimate = (v: Estimate) => Object.fromEntries(Object.entries(v).map(([k, s]) => [k, toNumber(s)]).filter(([, n]) => n !== undefined));
    const parsed = consistencyRequestSchema.safeParse({
      inspiral: estimate(values.inspiral),
      merger_ringdown: estimate(values.merger_ringdown),
      frame,
      ...(toNumber(z) === undefined ? {} : { z: toNumber(z) }),
      levels: levels.split(",").map((s) => Number(s.trim())).filter((n) => !Number.isNaN(n)),
      ...(full.M_f.trim() === "" && full.chi_f.trim() === "" ? {} : { full_signal: { M_f: toNumber(full.M_f), chi_f: toNumber(full.chi_f) } }),
    });
    if (!parsed.success) {
      const next: Record<string, string> = {};
      for (const issue of parsed.error.issues) next[issue.path.join(".")] ??= issue.message;
      setErrors(next);
      return;
    }
    setErrors({});
    onSubmit(parsed.data);
  };

  return (
    <form onSubmit={submit} className="flex flex-col gap-4" data-testid="summaries-form" noValidate>
      <div className="grid gap-4 md:grid-cols-2">
        {(["inspiral", "merger_ringdown"] as const).map((part) => (
          <fieldset key={part} className="rounded border border-paper-edge p-3">
            <legend className="px-1 font-semibold">{part === "inspiral" ? "Inspiral estimate" : "Merger-ringdown estimate"}</legend>
            <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
              {(Object.keys(LABELS) as (keyof Estimate)[]).map((k) => (
                <Field key={k} label={LABELS[k]} error={shown[`${part}.${k}`]} hint={k === "rho" ? "blank = 0 (then a caution)" : undefined}>
                  {(control) => (
                    <TextInput
                      {...control}
                      inputMode="decimal"
                      name={`${part}.${k}`}
                      value={values[part][k]}
                      onChange={(e) => setValues((v) => ({ ...v, [part]: { ...v[part], [k]: e.target.value } }))}
                    />
                  )}
                </Field>
              ))}
            </div>
          </fieldset>
        ))}
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Field label="Mass frame" error={shown.frame}>
          {(control) => (
            <Select {...control} name="frame" value={frame} onChange={(e) => setFrame(e.target.value === "source" ? "source" : "detector")}>
              <option value="detector">detector (redshifted)</option>
              <option value="source">source</option>
            </Select>
          )}
        </Field>
        <Field label="Redshift z" error={shown.z} hint="optional; gives the split frequency for source-frame masses">
          {(control) => <TextInput {...control} name="z" inputMode="decimal" value={z} onChange={(e) => setZ(e.target.value)} />}
        </Field>
        <Field label="Credible levels" error={shown.levels ?? shown["levels.0"] ?? shown["levels.1"] ?? shown["levels.2"]} className="col-span-2">
          {(control) => <TextInput {...control} name="levels" value={levels} onChange={(e) => setLevels(e.target.value)} />}
        </Field>
        <Field label={<>Full-signal {Mf} (M☉)</>} error={shown["full_signal.M_f"] ?? shown.full_signal} hint="optional; sets the split frequency (else the inspiral estimate's)">
          {(control) => <TextInput {...control} name="full_signal.M_f" inputMode="decimal" value={full.M_f} onChange={(e) => setFull((f) => ({ ...f, M_f: e.target.value }))} />}
        </Field>
        <Field label={<>Full-signal {chif}</>} error={shown["full_signal.chi_f"]}>
          {(control) => <TextInput {...control} name="full_signal.chi_f" inputMode="decimal" value={full.chi_f} onChange={(e) => setFull((f) => ({ ...f, chi_f: e.target.value }))} />}
        </Field>
      </div>
      <div>
        <Button kind="primary" type="submit" data-testid="run-consistency">
          Run the test
        </Button>
      </div>
    </form>
  );
}
