import { useFieldArray, useFormContext } from "react-hook-form";
import { Button } from "../../../components/ui/button.tsx";
import { Empty } from "../../../components/ui/states.tsx";
import { FormField } from "./form-field.tsx";
import type { SubmissionFormInput } from "./form-values.ts";

/** Abbreviations the mappings may use (zeta = 16*pi*alpha^2/M^4); the engine expands them before checking. */
export function DefinitionsFields() {
  const { control } = useFormContext<SubmissionFormInput>();
  const { fields, append, remove } = useFieldArray({ control, name: "theory.definitions" });
  return (
    <div className="flex flex-col gap-3">
      {fields.length === 0 && <Empty>No definitions: the mappings use the couplings and binary variables directly.</Empty>}
      {fields.map((f, i) => (
        <div key={f.id} className="grid gap-3 rounded border border-paper-edge bg-white/40 p-3 sm:grid-cols-[10rem_1fr_auto]" data-testid={`definition-fields-${i}`}>
          <FormField name={`theory.definitions.${i}.symbol`} label="Symbol" placeholder="zeta" />
          <FormField name={`theory.definitions.${i}.expression`} label="Expression" placeholder="16*pi*alpha^2/M^4" />
          <div className="flex items-end">
            <Button kind="danger" onClick={() => remove(i)} aria-label={`Remove definition ${i + 1}`}>
              Remove
            </Button>
          </div>
        </div>
      ))}
      <div>
        <Button onClick={() => append({ symbol: "", expression: "" })}>Add a definition</Button>
      </div>
    </div>
  );
}
