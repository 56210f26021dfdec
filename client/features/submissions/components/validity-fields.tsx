import { useFieldArray, useFormContext } from "react-hook-form";
import { VALIDITY_KINDS } from "../../../../common/catalogue.ts";
import { Button } from "../../../components/ui/button.tsx";
import { FormField } from "./form-field.tsx";
import { optionalNumber, type SubmissionFormInput } from "./form-values.ts";

const kindLabel: Record<(typeof VALIDITY_KINDS)[number], string> = { hard: "hard limit", rule_of_thumb: "rule of thumb" };

/** Conditions under which the mapping holds: a dimensionless expression that must stay below a number. */
export function ValidityFields({ mapping }: { mapping: number }) {
  const { control } = useFormContext<SubmissionFormInput>();
  const { fields, append, remove } = useFieldArray({ control, name: `theory.mappings.${mapping}.validity` });
  return (
    <div className="flex flex-col gap-2">
      {fields.map((f, j) => (
        <div key={f.id} className="grid gap-2 rounded border border-paper-edge/80 p-2 sm:grid-cols-[2fr_7rem_2fr_1.4fr_auto]" data-testid={`validity-fields-${mapping}-${j}`}>
          <FormField name={`theory.mappings.${mapping}.validity.${j}.expression`} label="Expression" placeholder="16*pi*alpha^2/m1^4" />
          <FormField name={`theory.mappings.${mapping}.validity.${j}.max`} label="Must stay below" inputMode="decimal" options={{ setValueAs: optionalNumber }} />
          <FormField name={`theory.mappings.${mapping}.validity.${j}.label`} label="In words" placeholder="small coupling on body 1" />
          <FormField name={`theory.mappings.${mapping}.validity.${j}.kind`} label="Kind" as="select">
            {VALIDITY_KINDS.map((k) => (
              <option key={k} value={k}>
                {kindLabel[k]}
              </option>
            ))}
          </FormField>
          <div className="flex items-end">
            <Button kind="danger" onClick={() => remove(j)} aria-label={`Remove validity condition ${j + 1}`}>
              Remove
            </Button>
          </div>
        </div>
      ))}
      <div>
        <Button kind="quiet" onClick={() => append({ expression: "", max: 1, label: "", kind: "rule_of_thumb" })}>
          + add a validity condition
        </Button>
      </div>
    </div>
  );
}
