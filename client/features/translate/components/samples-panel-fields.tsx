import { useState } from "react";
import type { z } from "zod";
import { GIMR_KS } from "../../../../common/convert.ts";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";

/**
 * The deviation and the theory a posterior or a set of events is translated for. Shared by the
 * "Posterior samples" and "Several events" panels; values stay text until the request schema judges them.
 */
export interface DeviationValues {
  parameter: "ppe_beta" | "gimr_dphi";
  /** b for ppE beta, k for gIMR. */
  index: string;
  credibility: string;
  theory: string;
}

export interface TheoryOption {
  slug: string;
  name: string;
}

export const DEFAULT_DEVIATION: DeviationValues = { parameter: "ppe_beta", index: "-7", credibility: "0.9", theory: "" };

/** The b a deviation enters at, or null while the index is not a usable number. */
export function bOfDeviation(v: DeviationValues): number | null {
  const n = Number(v.index.trim());
  if (v.index.trim() === "" || !Number.isFinite(n)) return null;
  return v.parameter === "ppe_beta" ? n : n - 5;
}

/** The request fields of a deviation: b or k, the credibility, the theory. */
export function deviationRequest(v: DeviationValues): { theory: string; parameter: DeviationValues["parameter"]; b?: unknown; k?: unknown; credibility: unknown } {
  const t = v.index.trim();
  const index = t === "" ? undefined : Number.isFinite(Number(t)) ? Number(t) : t;
  return {
    theory: v.theory,
    parameter: v.parameter,
    ...(v.parameter === "ppe_beta" ? { b: index } : { k: index }),
    credibility: v.credibility.trim() === "" ? undefined : Number(v.credibility),
  };
}

interface Props {
  idPrefix: string;
  value: DeviationValues;
  onChange: (v: DeviationValues) => void;
  theories: readonly TheoryOption[];
  theoriesLoading: boolean;
  errors: Record<string, string>;
}

export function DeviationFields({ idPrefix, value, onChange, theories, theoriesLoading, errors }: Props) {
  const set = (patch: Partial<DeviationValues>) => onChange({ ...value, ...patch });
  const indexName = value.parameter === "ppe_beta" ? "b" : "k";
  return (
    <div className="grid gap-3 sm:grid-cols-4">
      <Field label="Deviation measured">
        {(c) => (
          <Select {...c} value={value.parameter} onChange={(e) => set({ parameter: e.target.value === "gimr_dphi" ? "gimr_dphi" : "ppe_beta", theory: "" })} data-testid={`${idPrefix}-parameter`}>
            <option value="ppe_beta">ppE β</option>
            <option value="gimr_dphi">gIMR δφ_k</option>
          </Select>
        )}
      </Field>
      <Field label={`${indexName} of the deviation`} error={errors[indexName]} hint={value.parameter === "gimr_dphi" ? `one of ${GIMR_KS.filter((k) => typeof k === "number").join(", ")}` : undefined}>
        {(c) => <TextInput {...c} inputMode="decimal" value={value.index} onChange={(e) => set({ index: e.target.value, theory: "" })} data-testid={`${idPrefix}-index`} />}
      </Field>
      <Field label="Credible level" error={errors.credibility}>
        {(c) => <TextInput {...c} inputMode="decimal" value={value.credibility} onChange={(e) => set({ credibility: e.target.value })} data-testid={`${idPrefix}-credibility`} />}
      </Field>
      <Field label="Theory to constrain" error={errors.theory} hint={theoriesLoading ? "loading the theories at this b…" : theories.length === 0 ? "no accepted theory enters at this b" : undefined}>
        {(c) => (
          <Select {...c} value={value.theory} onChange={(e) => set({ theory: e.target.value })} data-testid={`${idPrefix}-theory`}>
            <option value="">choose a theory</option>
            {theories.map((t) => (
              <option key={t.slug} value={t.slug}>
                {t.name}
              </option>
            ))}
          </Select>
        )}
      </Field>
    </div>
  );
}

/** zod issues (or server fields) keyed by path; the first message per path is kept. */
export function issuesByPath(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of issues) fields[issue.path.map(String).join(".")] ??= issue.message;
  return fields;
}

/** Fields the deviation inputs show next to themselves; the rest is listed under the form. */
const SHOWN_BY_DEVIATION_FIELDS = ["b", "k", "credibility", "theory"];

/**
 * Both panels judge their request with the shared schema before sending it: problems found here
 * and fields the server named are shown together, and only a request that passes is submitted.
 */
export function useCheckedRequest<S extends z.ZodType>(schema: S, serverFields: Record<string, string>, onSubmit: (request: z.output<S>) => void) {
  const [problems, setProblems] = useState<Record<string, string>>({});
  const errors = { ...serverFields, ...problems };
  return {
    errors,
    listed: Object.entries(errors).filter(([k]) => !SHOWN_BY_DEVIATION_FIELDS.includes(k)),
    fail: (field: string, message: string) => setProblems({ [field]: message }),
    submit: (candidate: unknown) => {
      const checked = schema.safeParse(candidate);
      if (!checked.success) {
        setProblems(issuesByPath(checked.error.issues));
        return;
      }
      setProblems({});
      onSubmit(checked.data);
    },
  };
}
