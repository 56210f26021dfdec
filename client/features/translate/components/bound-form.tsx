import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useMemo, useState } from "react";
import { get, useForm, useWatch, type FieldPath } from "react-hook-form";
import type { z } from "zod";
import { DEFAULT_COSMOLOGY, DEFAULT_F_LOW_HZ, GIMR_KS, convertRequestSchema, type ConvertRequest } from "../../../../common/convert.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ApiError } from "../../../lib/api-client.ts";

type FormInput = z.input<typeof convertRequestSchema>;
type FormPath = FieldPath<FormInput>;

/** A worked example that opens the page: a 10 + 5 solar-mass black-hole binary and a -1PN bound. */
export const EXAMPLE_REQUEST: FormInput = {
  bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, sign_convention: "plus", f_low: DEFAULT_F_LOW_HZ },
  binary: { m1: 10, m2: 5, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" },
  cosmology: { ...DEFAULT_COSMOLOGY },
};

const FIELD_NAMES: readonly string[] = [
  "bound.parameter",
  "bound.b",
  "bound.k",
  "bound.a",
  "bound.z",
  "bound.upper",
  "bound.interval",
  "bound.interval.0",
  "bound.interval.1",
  "bound.credibility",
  "bound.f_low",
  "bound.sign_convention",
  "bound.includes_spin",
  "binary.m1",
  "binary.m2",
  "binary.chi1",
  "binary.chi2",
  "binary.bodies.0",
  "binary.bodies.1",
  "binary.frame",
  "binary.z",
  "cosmology.H0",
  "cosmology.Omega_m",
];

const num = { valueAsNumber: true } as const;
const optionalNum = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v)) } as const;
const gimrK = { setValueAs: (v: unknown) => (v === "5l" || v === "6l" ? v : Number(v)) } as const;
/** An interval end: a number, or null when left blank (unbounded on that side). */
const intervalEnd = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v)) } as const;
const alwaysNull = { setValueAs: () => null } as const;

/** How the bound is stated: |x| <= U, [lo, hi], or one end of it. Only the fields of the chosen shape are sent. */
export type BoundShape = "symmetric" | "interval" | "lower_only" | "upper_only";

/** The shapes' names, as the forms offer them (x is the deviation's symbol). */
export function boundShapeLabel(shape: BoundShape, x: string): string {
  return shape === "symmetric" ? `symmetric |${x}| ≤ U` : shape === "interval" ? "interval [lo, hi]" : shape === "lower_only" ? `one-sided: ${x} ≥ lo` : `one-sided: ${x} ≤ hi`;
}

export function toShape(v: string): BoundShape {
  return v === "interval" || v === "lower_only" || v === "upper_only" ? v : "symmetric";
}

function shapeOf(bound: FormInput["bound"]): BoundShape {
  if (bound.interval === undefined) return "symmetric";
  const [lo, hi] = bound.interval;
  if (lo === null || lo === undefined) return "upper_only";
  if (hi === null || hi === undefined) return "lower_only";
  return "interval";
}

interface Props {
  onSubmit: (request: ConvertRequest) => void;
  /** The last request's failure: its field errors are put beside their fields. */
  serverError?: unknown;
  busy?: boolean;
  initial?: FormInput;
}

/** The bound, the binary and the cosmology; validated with the same schema the server uses. */
export function BoundForm({ onSubmit, serverError, busy = false, initial = EXAMPLE_REQUEST }: Props) {
  // Only mounted inputs are sent: the fields of the other parameter or bound shape never reach the strict schema.
  const form = useForm<FormInput, unknown, ConvertRequest>({ resolver: zodResolver(convertRequestSchema), defaultValues: initial, mode: "onSubmit", shouldUnregister: true });
  const [shape, setShape] = useState<BoundShape>(() => shapeOf(initial.bound));
  const { register, handleSubmit, setError, formState, control } = form;
  const errors = formState.errors;
  const parameter = useWatch({ control, name: "bound.parameter" });
  const frame = useWatch({ control, name: "binary.frame" });
  // A distance ratio is an interval around 1: it has no symmetric form.
  const ratio = parameter === "distance_ratio";
  const form_ = ratio && shape === "symmetric" ? "interval" : shape;
  /** The deviation's symbol in the labels. */
  const x = parameter === "gimr_dphi" ? "δφ_k" : parameter === "ppe_alpha" ? "α" : ratio ? "d_L^GW/d_L^EM" : "β";

  // Server field errors go to the field they name (the form's own store); the rest are listed below.
  useEffect(() => {
    if (!(serverError instanceof ApiError)) return;
    for (const [path, message] of Object.entries(serverError.fields)) {
      if (FIELD_NAMES.includes(path)) setError(path as FormPath, { type: "server", message });
    }
  }, [serverError, setError]);
  const otherErrors = useMemo(() => {
    if (!(serverError instanceof ApiError)) return [];
    const entries = Object.entries(serverError.fields);
    if (entries.length === 0) return [serverError.message];
    return entries.filter(([path]) => !FIELD_NAMES.includes(path)).map(([path, message]) => `${path}: ${message}`);
  }, [serverError]);

  const err = (path: string): string | undefined => {
    const node: unknown = get(errors, path);
    const message = node && typeof node === "object" && "message" in node ? node.message : undefined;
    return typeof message === "string" ? message : undefined;
  };

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate aria-label="Bound to translate" className="flex flex-col gap-6" data-testid="bound-form">
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-lg font-semibold">The bound</legend>
        <Field label="Deviation parameter" error={err("bound.parameter")}>
          {(c) => (
            <Select {...c} {...register("bound.parameter")}>
              <option value="ppe_beta">ppE β at exponent b</option>
              <option value="gimr_dphi">gIMR δφ_k</option>
              <option value="ppe_alpha">ppE amplitude α at exponent a</option>
              <option value="distance_ratio">distance ratio d_L^GW / d_L^EM</option>
            </Select>
          )}
        </Field>
        {parameter === "ppe_alpha" ? (
          // Keys: each exponent field is its own input, so the one it replaces is unregistered (not renamed in place).
          <Field key="a" label="Exponent a" hint="a = 2n at n-th PN order; amplitude birefringence enters at a = 3" error={err("bound.a")}>
            {(c) => <TextInput {...c} type="number" step="any" defaultValue={3} {...register("bound.a", num)} />}
          </Field>
        ) : ratio ? (
          <Field key="z" label="Source redshift z" hint="where the GW and EM distances were compared" error={err("bound.z")}>
            {(c) => <TextInput {...c} type="number" step="any" {...register("bound.z", num)} />}
          </Field>
        ) : parameter === "gimr_dphi" ? (
          <Field key="k" label="Index k" hint="b = k − 5; 5l, 6l are the log terms" error={err("bound.k")}>
            {(c) => (
              <Select {...c} {...register("bound.k", gimrK)} defaultValue="-2">
                {GIMR_KS.map((k) => (
                  <option key={String(k)} value={String(k)}>
                    {String(k)}
                  </option>
                ))}
              </Select>
            )}
          </Field>
        ) : (
          <Field key="b" label="Exponent b" hint="b = 2n − 5 at n-th PN order" error={err("bound.b")}>
            {(c) => <TextInput {...c} type="number" step="any" {...register("bound.b", num)} />}
          </Field>
        )}
        <Field label="Form of the bound" hint="as the analysis reports it" error={undefined}>
          {(c) => (
            <Select {...c} value={form_} onChange={(e) => setShape(toShape(e.target.value))} data-testid="bound-shape">
              {!ratio && <option value="symmetric">{boundShapeLabel("symmetric", "x")}</option>}
              <option value="interval">{boundShapeLabel("interval", "x")}</option>
              <option value="lower_only">{boundShapeLabel("lower_only", "x")}</option>
              <option value="upper_only">{boundShapeLabel("upper_only", "x")}</option>
            </Select>
          )}
        </Field>
        {form_ === "symmetric" && (
          <Field label={`Upper bound on |${x}|`} error={err("bound.upper")}>
            {(c) => <TextInput {...c} type="number" step="any" {...register("bound.upper", num)} />}
          </Field>
        )}
        {(form_ === "interval" || form_ === "lower_only") && (
          <Field label={`Lower end lo of ${x}`} hint={ratio ? "positive; GR is 1" : "signed"} error={err("bound.interval.0") ?? err("bound.interval") ?? err("bound.interval.root")}>
            {(c) => <TextInput {...c} type="number" step="any" {...register("bound.interval.0", intervalEnd)} />}
          </Field>
        )}
        {(form_ === "interval" || form_ === "upper_only") && (
          <Field label={`Upper end hi of ${x}`} hint={ratio ? "positive; GR is 1" : "signed"} error={err("bound.interval.1") ?? (form_ === "upper_only" ? (err("bound.interval") ?? err("bound.interval.root")) : undefined)}>
            {(c) => <TextInput {...c} type="number" step="any" {...register("bound.interval.1", intervalEnd)} />}
          </Field>
        )}
        {form_ === "lower_only" && <input type="hidden" {...register("bound.interval.1", alwaysNull)} />}
        {form_ === "upper_only" && <input type="hidden" {...register("bound.interval.0", alwaysNull)} />}
        <Field label="Credibility" hint="fraction, e.g. 0.9" error={err("bound.credibility")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("bound.credibility", num)} />}
        </Field>
        <Field label={<>Lowest band frequency f<sub>low</sub> (Hz)</>} hint={`${DEFAULT_F_LOW_HZ} Hz is common practice; validity conditions use it`} error={err("bound.f_low")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("bound.f_low", num)} />}
        </Field>
        {parameter === "ppe_alpha" || ratio ? (
          <p className="self-end text-sm text-ink-soft sm:col-span-2" data-testid="amplitude-note">
            {ratio
              ? "Translated as the amplitude term at a = 0: α = 1/r − 1. The binary's masses do not enter; its redshift, if given, must equal z."
              : "The amplitude does not depend on the phase sign convention."}
          </p>
        ) : parameter === "gimr_dphi" ? (
          <label className="flex items-center gap-2 self-end text-sm sm:col-span-2">
            <input type="checkbox" {...register("bound.includes_spin")} />
            the analysis stretched the spin-including φ_k
          </label>
        ) : (
          <Field label="Phase sign convention of the analysis" error={err("bound.sign_convention")} className="sm:col-span-2">
            {(c) => (
              <Select {...c} {...register("bound.sign_convention")}>
                <option value="plus">h ∝ exp(+iΨ) (as here)</option>
                <option value="minus">h ∝ exp(−iΨ): β is flipped</option>
              </Select>
            )}
          </Field>
        )}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-4">
        <legend className="mb-2 text-lg font-semibold">The binary</legend>
        <Field label="m₁ (M☉)" error={err("binary.m1")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("binary.m1", num)} />}
        </Field>
        <Field label="m₂ (M☉)" error={err("binary.m2")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("binary.m2", num)} />}
        </Field>
        <Field label="χ₁ (aligned)" error={err("binary.chi1")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("binary.chi1", num)} />}
        </Field>
        <Field label="χ₂ (aligned)" error={err("binary.chi2")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("binary.chi2", num)} />}
        </Field>
        <Field label="Body 1" error={err("binary.bodies.0")}>
          {(c) => (
            <Select {...c} {...register("binary.bodies.0")}>
              <option value="bh">black hole</option>
              <option value="ns">neutron star</option>
            </Select>
          )}
        </Field>
        <Field label="Body 2" error={err("binary.bodies.1")}>
          {(c) => (
            <Select {...c} {...register("binary.bodies.1")}>
              <option value="bh">black hole</option>
              <option value="ns">neutron star</option>
            </Select>
          )}
        </Field>
        <Field label="Masses are" error={err("binary.frame")}>
          {(c) => (
            <Select {...c} {...register("binary.frame")}>
              <option value="source">source-frame</option>
              <option value="detector">detector-frame (redshifted)</option>
            </Select>
          )}
        </Field>
        <Field label="Redshift z" hint={frame === "detector" ? "needed for detector-frame masses" : "needed for propagation effects"} error={err("binary.z")}>
          {(c) => <TextInput {...c} type="number" step="any" placeholder="none" {...register("binary.z", optionalNum)} />}
        </Field>
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-4">
        <legend className="mb-2 text-lg font-semibold">Cosmology</legend>
        <Field label="H₀ (km/s/Mpc)" hint={`Planck 2018: ${DEFAULT_COSMOLOGY.H0}`} error={err("cosmology.H0")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("cosmology.H0", num)} />}
        </Field>
        <Field label="Ωₘ (flat)" hint={`Planck 2018: ${DEFAULT_COSMOLOGY.Omega_m}`} error={err("cosmology.Omega_m")}>
          {(c) => <TextInput {...c} type="number" step="any" {...register("cosmology.Omega_m", num)} />}
        </Field>
      </fieldset>

      {otherErrors.length > 0 && (
        <div role="alert" className="rounded border border-brick/40 bg-brick-wash p-3 text-sm text-brick">
          {otherErrors.map((m) => (
            <p key={m}>{m}</p>
          ))}
        </div>
      )}
      <div>
        <Button kind="primary" type="submit" busy={busy}>
          Translate the bound
        </Button>
      </div>
    </form>
  );
}
