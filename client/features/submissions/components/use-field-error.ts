import { get, useFormState, type FieldPath } from "react-hook-form";
import type { SubmissionFormInput } from "./form-values.ts";

/** The message react-hook-form holds for one path (client validation or a server answer). */
export function useFieldError(name: FieldPath<SubmissionFormInput>): string | undefined {
  const { errors } = useFormState<SubmissionFormInput>({ name, exact: true });
  const e = get(errors, name) as { message?: unknown; root?: { message?: unknown } } | undefined;
  const msg = e?.message ?? e?.root?.message;
  return typeof msg === "string" && msg ? msg : undefined;
}
