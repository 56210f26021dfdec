import type { FieldErrors, FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError } from "../../../lib/api-client.ts";

/**
 * Paths the submission form renders a control for. A server error on one of these lands beside its
 * control; anything else (a field the form does not show, or the body as a whole) is listed at the top.
 */
const renderedPaths: RegExp[] = [
  /^theory\.(slug|name|family|kind|summary|action_latex|couplings|definitions|mappings|references)$/,
  /^theory\.couplings\.\d+\.(symbol|latex|dimension|unit|description)$/,
  /^theory\.definitions\.\d+\.(symbol|expression|description)$/,
  /^theory\.mappings\.\d+\.(kind|pn_order|b|a|expression|latex|coupling|source_status|references|locator)$/,
  /^theory\.mappings\.\d+\.validity\.\d+\.(expression|max|label|kind)$/,
  /^theory\.references\.\d+\.(key|arxiv|doi|authors|title|year|journal|locator)$/,
];

export function isRenderedPath(path: string): boolean {
  return renderedPaths.some((re) => re.test(path));
}

/** Server field keys may name an item of a cited-keys list (mappings.0.references.1): point at the list. */
function normalise(path: string): string {
  return path.replace(/^(theory\.mappings\.\d+\.references)\.\d+$/, "$1");
}

/**
 * Field messages of an error answer: a 400's `fields`, or a 409 that names one field in its details
 * (a slug already taken names "theory.slug").
 */
export function fieldsOf(err: unknown): Record<string, string> {
  if (!(err instanceof ApiError)) return {};
  if (Object.keys(err.fields).length > 0) return err.fields;
  const field = err.details.field;
  if (typeof field !== "string" || !field) return {};
  return { [field]: err.message.startsWith(`${field}: `) ? err.message.slice(field.length + 2) : err.message };
}

export interface UnplacedError {
  path: string;
  message: string;
}

/**
 * Puts each field error of an error answer on its form field (setError) and returns the ones that have no
 * control in the form, so the caller can list them. Non-validation errors return [] and are the
 * caller's to show.
 */
export function applyServerErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>): UnplacedError[] {
  const fields = fieldsOf(err);
  const unplaced: UnplacedError[] = [];
  let focused = false;
  for (const [raw, message] of Object.entries(fields)) {
    const path = normalise(raw);
    if (isRenderedPath(path)) {
      setError(path as Path<T>, { type: "server", message }, { shouldFocus: !focused });
      focused = true;
    } else {
      unplaced.push({ path: raw, message });
    }
  }
  return unplaced;
}

/** Every message in react-hook-form's nested error tree, with its dotted path, for the summary. */
export function flattenErrors(errors: FieldErrors, prefix = ""): UnplacedError[] {
  const out: UnplacedError[] = [];
  for (const [key, value] of Object.entries(errors)) {
    if (!value || typeof value !== "object") continue;
    const path = key === "root" ? prefix : prefix ? `${prefix}.${key}` : key;
    const v = value as { message?: unknown; type?: unknown; ref?: unknown };
    if (typeof v.message === "string" && v.message && (typeof v.type === "string" || "ref" in v)) out.push({ path: path || "form", message: v.message });
    for (const [k, child] of Object.entries(value as Record<string, unknown>)) {
      if (k === "message" || k === "type" || k === "ref" || k === "types") continue;
      if (child && typeof child === "object") out.push(...flattenErrors({ [k]: child } as FieldErrors, path));
    }
  }
  return out;
}
