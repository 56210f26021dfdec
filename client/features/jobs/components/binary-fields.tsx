import { Field, Select } from "../../../components/ui/field.tsx";

/** The frame of a posterior's masses, as the samples and stacking panels ask for it. */
export function FrameField({ label, value, onChange, testId }: { label: string; value: "source" | "detector"; onChange: (v: "source" | "detector") => void; testId?: string }) {
  return (
    <Field label={label}>
      {(c) => (
        <Select {...c} value={value} onChange={(e) => onChange(e.target.value === "detector" ? "detector" : "source")} data-testid={testId}>
          <option value="source">source frame</option>
          <option value="detector">detector frame</option>
        </Select>
      )}
    </Field>
  );
}

/** The kinds of the two bodies, as "bh,bh" (split on the comma for the request). */
export function BodiesField({ value, onChange, testId }: { value: string; onChange: (v: string) => void; testId?: string }) {
  return (
    <Field label="Bodies">
      {(c) => (
        <Select {...c} value={value} onChange={(e) => onChange(e.target.value)} data-testid={testId}>
          <option value="bh,bh">two black holes</option>
          <option value="bh,ns">black hole + neutron star</option>
          <option value="ns,ns">two neutron stars</option>
        </Select>
      )}
    </Field>
  );
}
