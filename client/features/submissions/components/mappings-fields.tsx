import { Controller, useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { MAPPING_KINDS, SOURCE_STATUSES } from "../../../../common/catalogue.ts";
import { Button } from "../../../components/ui/button.tsx";
import { DeriveHelper } from "./derive-helper.tsx";
import { FormField } from "./form-field.tsx";
import { emptyMapping, optionalNumber, optionalString, type SubmissionFormInput } from "./form-values.ts";
import { MappingLiveCheck } from "./mapping-live-check.tsx";
import { useFieldError } from "./use-field-error.ts";
import { ValidityFields } from "./validity-fields.tsx";

const kindLabel: Record<(typeof MAPPING_KINDS)[number], string> = {
  inspiral_phase: "inspiral phase (ppE β)",
  inspiral_amplitude: "inspiral amplitude (ppE α)",
  ringdown_frequency: "ringdown frequency shift",
  ringdown_damping: "ringdown damping-time shift",
  remnant_mass: "remnant mass shift (fractional)",
  remnant_spin: "remnant spin shift (fractional)",
};
const sourceLabel: Record<(typeof SOURCE_STATUSES)[number], string> = {
  confirmed: "read in the cited source",
  derived: "re-derived by me",
  memory: "from memory (an editor must confirm)",
};

/** Which of the entry's references this mapping rests on: one checkbox per citable reference. */
function CitesField({ index }: { index: number }) {
  const { control } = useFormContext<SubmissionFormInput>();
  const refs = useWatch<SubmissionFormInput, "theory.references">({ name: "theory.references" }) ?? [];
  const error = useFieldError(`theory.mappings.${index}.references`);
  const keys = refs.map((r) => r.key).filter((k): k is string => Boolean(k));
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={error ? `cites-${index}-error` : undefined}>
      <legend className="text-sm font-semibold">Sources of this formula</legend>
      <Controller
        control={control}
        name={`theory.mappings.${index}.references`}
        render={({ field }) => {
          const chosen = new Set(field.value ?? []);
          if (keys.length === 0) return <p className="text-sm text-ink-faint">Add references below (with a citation key) to cite them here.</p>;
          return (
            <div className="flex flex-wrap gap-x-4 gap-y-1">
              {keys.map((k) => (
                <label key={k} className="flex items-center gap-1 font-mono text-sm">
                  <input
                    type="checkbox"
                    checked={chosen.has(k)}
                    onBlur={field.onBlur}
                    onChange={(e) => field.onChange(e.target.checked ? [...chosen, k] : [...chosen].filter((x) => x !== k))}
                  />
                  {k}
                </label>
              ))}
            </div>
          );
        }}
      />
      {error && (
        <p id={`cites-${index}-error`} role="alert" className="text-sm text-brick">
          {error}
        </p>
      )}
    </fieldset>
  );
}

/** A ringdown mapping names its quasinormal mode (l, m, n) instead of a PN order and b. */
function RingdownModeFields({ base }: { base: `theory.mappings.${number}` }) {
  return (
    <div className="grid grid-cols-3 gap-2 sm:col-span-2" data-testid="ringdown-mode-fields">
      <FormField name={`${base}.mode.l`} label="Mode l" inputMode="numeric" options={{ setValueAs: optionalNumber }} hint="(2,2,0) is the usual" />
      <FormField name={`${base}.mode.m`} label="m" inputMode="numeric" options={{ setValueAs: optionalNumber }} />
      <FormField name={`${base}.mode.n`} label="n (overtone)" inputMode="numeric" options={{ setValueAs: optionalNumber }} />
    </div>
  );
}

function MappingFieldset({ index, onRemove, canRemove }: { index: number; onRemove: () => void; canRemove: boolean }) {
  const base = `theory.mappings.${index}` as const;
  const couplings = useWatch<SubmissionFormInput, "theory.couplings">({ name: "theory.couplings" }) ?? [];
  const kind = useWatch<SubmissionFormInput, `theory.mappings.${number}.kind`>({ name: `${base}.kind` });
  const isRingdown = kind === "ringdown_frequency" || kind === "ringdown_damping";
  const isRemnant = kind === "remnant_mass" || kind === "remnant_spin";
  return (
    <fieldset className="rounded border border-paper-edge bg-white/40 p-4" data-testid={`mapping-fields-${index}`}>
      <legend className="px-1 font-semibold">Mapping {index + 1}</legend>
      <div className="grid gap-3 sm:grid-cols-4">
        <FormField name={`${base}.kind`} label="Deviation" as="select" className="sm:col-span-2">
          {MAPPING_KINDS.map((k) => (
            <option key={k} value={k}>
              {kindLabel[k]}
            </option>
          ))}
        </FormField>
        {isRingdown ? (
          <RingdownModeFields base={base} />
        ) : isRemnant ? null : (
          <>
            <FormField name={`${base}.pn_order`} label="PN order n" inputMode="decimal" options={{ setValueAs: optionalNumber }} hint="relative order; −1 for dipole radiation" />
            <FormField name={`${base}.b`} label="ppE b" inputMode="decimal" options={{ setValueAs: optionalNumber }} hint="b = 2n − 5 for the phase" />
          </>
        )}
        <div className="sm:col-span-4">
          <FormField
            name={`${base}.expression`}
            label={
              isRingdown
                ? kind === "ringdown_frequency"
                  ? "Expression for δf/f"
                  : "Expression for δτ/τ"
                : isRemnant
                  ? kind === "remnant_mass"
                    ? <>Expression for δM<sub>f</sub>/M<sub>f</sub></>
                    : <>Expression for δχ<sub>f</sub>/χ<sub>f</sub></>
                  : "Expression for β"
            }
            as="textarea"
            rows={2}
            placeholder="-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))"
            hint={
              isRingdown || isRemnant
                ? "Fractional shift at the remnant: plain maths in the couplings, definitions, the remnant's M_f and chi_f, and the binary variables"
                : "Plain maths in the couplings, definitions and binary variables m1, m2, M, eta, chi1, chi2, s1, s2 …"
            }
          />
          <div className="mt-2">
            <MappingLiveCheck index={index} />
          </div>
        </div>
        <FormField name={`${base}.coupling`} label="Constrains" as="select" options={{ setValueAs: optionalString }}>
          <option value="">the first coupling</option>
          {couplings
            .filter((c) => c.symbol)
            .map((c) => (
              <option key={c.symbol} value={c.symbol}>
                {c.symbol}
              </option>
            ))}
        </FormField>
        <FormField name={`${base}.source_status`} label="The formula is" as="select">
          {SOURCE_STATUSES.map((s) => (
            <option key={s} value={s}>
              {sourceLabel[s]}
            </option>
          ))}
        </FormField>
        <FormField name={`${base}.locator`} label="Equation or table" placeholder="Eq. (38)" options={{ setValueAs: optionalString }} className="sm:col-span-2" />
        <div className="sm:col-span-4">
          <CitesField index={index} />
        </div>
        <div className="sm:col-span-4">
          <h4 className="text-sm font-semibold mb-1">Validity conditions</h4>
          <ValidityFields mapping={index} />
        </div>
        <details className="sm:col-span-4 rounded border border-sea/20 bg-sea-wash/40 p-3">
          <summary className="cursor-pointer font-semibold text-sea">Derive β from an energy or flux change</summary>
          <div className="mt-3">
            <DeriveHelper index={index} />
          </div>
        </details>
        <div className="sm:col-span-4 flex justify-end">
          <Button kind="danger" onClick={onRemove} disabled={!canRemove}>
            Remove mapping {index + 1}
          </Button>
        </div>
      </div>
    </fieldset>
  );
}

export function MappingsFields() {
  const { control } = useFormContext<SubmissionFormInput>();
  const { fields, append, remove } = useFieldArray({ control, name: "theory.mappings" });
  const listError = useFieldError("theory.mappings");
  return (
    <div className="flex flex-col gap-4">
      {listError && (
        <p role="alert" className="text-sm text-brick">
          {listError}
        </p>
      )}
      {fields.map((f, i) => (
        <MappingFieldset key={f.id} index={i} onRemove={() => remove(i)} canRemove={fields.length > 1} />
      ))}
      <div>
        <Button onClick={() => append(emptyMapping())}>Add a mapping</Button>
      </div>
    </div>
  );
}
