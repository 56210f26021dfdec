import { useMemo } from "react";
import { useWatch } from "react-hook-form";
import { CheckBadge, CheckList, worstOutcome } from "../../../components/ui/check-list.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { useDebouncedValue } from "../../../components/ui/use-debounced-value.ts";
import { ApiError } from "../../../lib/api-client.ts";
import { useExpressionCheck, type ExpressionCheckRequest } from "../api/check-expression.ts";
import type { MappingInput, SubmissionFormInput } from "./form-values.ts";

/** What the engine is asked to check the expression as, per kind of mapping. */
const targetOf: Record<MappingInput["kind"], string> = {
  inspiral_phase: "ppe_phase",
  inspiral_amplitude: "ppe_amplitude",
  ringdown_frequency: "ringdown_frequency",
  ringdown_damping: "ringdown_damping",
  remnant_mass: "remnant_mass",
  remnant_spin: "remnant_spin",
};

const finite = (v: unknown): number | undefined => (typeof v === "number" && Number.isFinite(v) ? v : undefined);

/** The form's derivation (A, B at one order, gamma, or a dispersion coefficient A) in the engine's term-by-term shape. */
function derivationOf(d: MappingInput["derivation"], alphaMd: number | undefined): ExpressionCheckRequest["derivation"] {
  if (!d || !Number.isFinite(d.order)) return undefined;
  const term = (c: string | undefined) => (c && c.trim() ? { order: d.order, coefficient: c.trim() } : undefined);
  if (d.kind === "energy_flux") {
    const energy = term(d.A);
    const flux = term(d.B);
    return energy || flux ? { ...(energy ? { energy } : {}), ...(flux ? { flux } : {}) } : undefined;
  }
  if (d.kind === "frequency_drift") {
    const drift = term(d.gamma);
    return drift ? { frequency_drift: drift } : undefined;
  }
  if (d.kind === "propagation" && d.A && d.A.trim()) {
    // The dispersion exponent is the mapping's, or follows from the order: n = (3 alpha + 2) / 2.
    return { propagation: { alpha_md: alphaMd ?? (2 * d.order - 2) / 3, coefficient: d.A.trim(), order: d.order } };
  }
  return undefined;
}

/** The check request for one mapping as it stands in the form, or undefined when there is nothing to check. */
export function useCheckRequest(index: number): ExpressionCheckRequest | undefined {
  const mapping = useWatch<SubmissionFormInput, `theory.mappings.${number}`>({ name: `theory.mappings.${index}` });
  const couplings = useWatch<SubmissionFormInput, "theory.couplings">({ name: "theory.couplings" });
  const definitions = useWatch<SubmissionFormInput, "theory.definitions">({ name: "theory.definitions" });
  const request = useMemo(() => {
    const expression = mapping?.expression?.trim() ?? "";
    if (!expression) return undefined;
    const req: ExpressionCheckRequest = {
      expression,
      target: targetOf[mapping?.kind ?? "inspiral_phase"],
      couplings: (couplings ?? []).flatMap((c) => {
        const d = finite(c.dimension);
        return c.symbol && d !== undefined ? [{ symbol: c.symbol, dimension: d, ...(c.gr_value ? { gr_value: c.gr_value } : {}) }] : [];
      }),
      definitions: (definitions ?? []).flatMap((d) => (d.symbol && d.expression?.trim() ? [{ symbol: d.symbol, expression: d.expression.trim() }] : [])),
    };
    const b = finite(mapping?.b);
    const a = finite(mapping?.a);
    const n = finite(mapping?.pn_order);
    if (b !== undefined) req.b = b;
    if (a !== undefined) req.a = a;
    if (n !== undefined) req.pn_order = n;
    const derivation = derivationOf(mapping?.derivation, finite(mapping?.alpha_md));
    if (derivation) req.derivation = derivation;
    return req;
  }, [mapping, couplings, definitions]);
  // Checks run when typing pauses (~400 ms), not on every keystroke.
  const settled = useDebouncedValue(request ? JSON.stringify(request) : "", 400);
  return useMemo(() => (settled ? (JSON.parse(settled) as ExpressionCheckRequest) : undefined), [settled]);
}

/** The engine's reading of the expression, rendered, with its checks: shown under the expression as you type. */
export function MappingLiveCheck({ index }: { index: number }) {
  const request = useCheckRequest(index);
  const check = useExpressionCheck(request);
  // The engine names the expression, or the definition the problem sits in ("definitions.zeta").
  const expressionError = check.error instanceof ApiError ? Object.entries(check.error.fields).map(([k, m]) => (k === "expression" ? m : `${k}: ${m}`)).join("; ") || undefined : undefined;

  if (!request) return <p className="text-sm text-ink-faint">Type the expression to see it rendered and checked.</p>;
  return (
    <div className="rounded border border-paper-edge bg-paper px-3 py-2" aria-live="polite" data-testid={`live-check-${index}`}>
      {check.isPending ? (
        <p className="text-sm text-ink-faint">Checking…</p>
      ) : check.isError ? (
        expressionError ? (
          <p className="text-sm text-brick" data-testid={`live-check-error-${index}`}>
            <span className="font-semibold">The engine cannot read this expression:</span> {expressionError}
          </p>
        ) : (
          <p className="text-sm text-amber">
            The expression checker did not answer ({check.error instanceof ApiError ? `${check.error.status}: ${check.error.message}` : check.error.message}). You can still save;
            the checks run again on the server.
          </p>
        )
      ) : (
        <div className={check.isFetching ? "opacity-60" : ""}>
          <div className="flex flex-wrap items-center gap-3">
            <span className="text-sm text-ink-soft">Reads as</span>
            {check.data.latex ? <MathTex tex={`\\displaystyle ${check.data.latex}`} className="text-lg" /> : <span className="text-sm text-brick">(does not parse)</span>}
            <span className="ml-auto">
              <CheckBadge outcome={worstOutcome(check.data.checks)} />
            </span>
          </div>
          <div className="mt-2">
            <CheckList checks={check.data.checks} testId={`live-checks-${index}`} />
          </div>
        </div>
      )}
    </div>
  );
}
