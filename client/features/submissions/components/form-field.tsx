import type { ReactNode } from "react";
import { useFormContext, type FieldPath, type RegisterOptions } from "react-hook-form";
import { Field, Select, TextArea, TextInput } from "../../../components/ui/field.tsx";
import type { SubmissionFormInput } from "./form-values.ts";
import { useFieldError } from "./use-field-error.ts";

type Name = FieldPath<SubmissionFormInput>;

interface Props {
  name: Name;
  label: ReactNode;
  hint?: ReactNode;
  as?: "input" | "textarea" | "select";
  type?: string;
  placeholder?: string;
  rows?: number;
  options?: RegisterOptions<SubmissionFormInput, Name>;
  children?: ReactNode;
  className?: string;
  inputMode?: "decimal" | "numeric" | "text";
  readOnly?: boolean;
  /** Textareas: prose (false) or formulas (true, the default). */
  mono?: boolean;
}

/** A registered control with its label and its error (from zod on the client or from the server). */
export function FormField({ name, label, hint, as = "input", type = "text", placeholder, rows = 3, options, children, className, inputMode, readOnly, mono }: Props) {
  const { register } = useFormContext<SubmissionFormInput>();
  const error = useFieldError(name);
  return (
    <Field label={label} hint={hint} error={error} className={className}>
      {(aria) => {
        const reg = register(name, options);
        if (as === "textarea") return <TextArea {...aria} {...reg} rows={rows} placeholder={placeholder} spellCheck={mono === false} mono={mono} />;
        if (as === "select")
          return (
            <Select {...aria} {...reg}>
              {children}
            </Select>
          );
        return <TextInput {...aria} {...reg} type={type} placeholder={placeholder} inputMode={inputMode} readOnly={readOnly} spellCheck={false} autoComplete="off" className={readOnly ? "bg-paper-deep text-ink-soft" : ""} />;
      }}
    </Field>
  );
}
