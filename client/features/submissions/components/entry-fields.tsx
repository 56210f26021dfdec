import { useWatch } from "react-hook-form";
import { ENTRY_KINDS, FAMILY_LABELS, THEORY_FAMILIES } from "../../../../common/catalogue.ts";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { FormField } from "./form-field.tsx";
import { optionalString, type SubmissionFormInput } from "./form-values.ts";

const kindLabels: Record<(typeof ENTRY_KINDS)[number], string> = { theory: "a theory (given by its action)", parameterized_spacetime: "a parameterized spacetime (given by its metric)" };

/** Name, slug, family, summary and the action, with a live rendering of the action's TeX. */
export function EntryFields({ lockSlug }: { lockSlug: boolean }) {
  const action = useWatch<SubmissionFormInput, "theory.action_latex">({ name: "theory.action_latex" });
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <FormField name="theory.name" label="Name" placeholder="Einstein-dilaton-Gauss-Bonnet gravity" className="md:col-span-2" />
      <FormField
        name="theory.slug"
        label="Short name (in the address)"
        hint={lockSlug ? "This change targets an existing entry, so its short name stays." : "lower-case words joined by hyphens, e.g. edgb"}
        placeholder="edgb"
        readOnly={lockSlug}
      />
      <FormField name="theory.family" label="Family" as="select">
        {THEORY_FAMILIES.map((f) => (
          <option key={f} value={f}>
            {FAMILY_LABELS[f]}
          </option>
        ))}
      </FormField>
      <FormField name="theory.kind" label="The entry is" as="select">
        {ENTRY_KINDS.map((k) => (
          <option key={k} value={k}>
            {kindLabels[k]}
          </option>
        ))}
      </FormField>
      <FormField name="theory.summary" label="Summary" as="textarea" rows={3} mono={false} className="md:col-span-2" hint="Two or three sentences: what changes, which bodies carry the effect, at which PN order." />
      <div className="md:col-span-2">
        <FormField name="theory.action_latex" label="Action (TeX)" as="textarea" rows={2} options={{ setValueAs: optionalString }} hint="Optional. Rendered below as you type." />
        {action && action.trim() !== "" && (
          <div className="mt-2 overflow-x-auto rounded border border-paper-edge bg-paper px-3 py-2">
            <MathTex display tex={action} />
          </div>
        )}
      </div>
    </div>
  );
}
