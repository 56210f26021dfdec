import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { Button } from "../../../components/ui/button.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { FormField } from "./form-field.tsx";
import { optionalNumber, type SubmissionFormInput } from "./form-values.ts";
import { useFieldError } from "./use-field-error.ts";

function CouplingPreview({ index }: { index: number }) {
  const latex = useWatch<SubmissionFormInput, `theory.couplings.${number}.latex`>({ name: `theory.couplings.${index}.latex` });
  return latex ? <MathTex tex={latex} /> : <span className="text-ink-faint text-sm">(TeX preview)</span>;
}

/** A select left at "not stated" leaves the field absent. */
const blankAsUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);

export function CouplingsFields() {
  const { control } = useFormContext<SubmissionFormInput>();
  const { fields, append, remove } = useFieldArray({ control, name: "theory.couplings" });
  const listError = useFieldError("theory.couplings");
  return (
    <div className="flex flex-col gap-3">
      {listError && (
        <p role="alert" className="text-sm text-brick">
          {listError}
        </p>
      )}
      {fields.map((f, i) => (
        <fieldset key={f.id} className="rounded border border-paper-edge bg-white/40 p-3" data-testid={`coupling-fields-${i}`}>
          <legend className="px-1 text-sm font-semibold">
            Coupling {i + 1} <CouplingPreview index={i} />
          </legend>
          <div className="grid gap-3 sm:grid-cols-4">
            <FormField name={`theory.couplings.${i}.symbol`} label="Symbol" placeholder="alpha" hint="as used in expressions" />
            <FormField name={`theory.couplings.${i}.latex`} label="TeX" placeholder="\alpha" />
            <FormField
              name={`theory.couplings.${i}.dimension`}
              label="Dimension (power of length)"
              inputMode="decimal"
              options={{ setValueAs: optionalNumber }}
              hint="G = c = 1: 2 for km², 0 if dimensionless"
            />
            <FormField name={`theory.couplings.${i}.unit`} label="Unit" placeholder="km^2" />
            <FormField
              name={`theory.couplings.${i}.gr_value`}
              label="GR is at"
              as="select"
              options={{ setValueAs: blankAsUndefined }}
              hint="the checks send the coupling there: beta must vanish"
            >
              <option value="">not stated</option>
              <option value="zero">coupling = 0</option>
              <option value="infinity">coupling → ∞ (λ_g, ω_BD)</option>
            </FormField>
            <FormField name={`theory.couplings.${i}.range`} label="Physical range" as="select" options={{ setValueAs: blankAsUndefined }}>
              <option value="">not stated</option>
              <option value="positive">positive</option>
              <option value="non_negative">zero or positive</option>
              <option value="any_sign">either sign</option>
            </FormField>
            <FormField name={`theory.couplings.${i}.description`} label="Description" className="sm:col-span-2" placeholder="Gauss-Bonnet coupling in the convention of the action above" />
            <div className="flex items-end justify-end sm:col-span-4">
              <Button kind="danger" onClick={() => remove(i)} disabled={fields.length === 1} aria-label={`Remove coupling ${i + 1}`}>
                Remove
              </Button>
            </div>
          </div>
        </fieldset>
      ))}
      <div>
        <Button onClick={() => append({ symbol: "", latex: "", dimension: 0, unit: "", conventions: [] })}>Add a coupling</Button>
      </div>
    </div>
  );
}
