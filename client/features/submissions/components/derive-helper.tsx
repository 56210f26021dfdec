import { useId, useState } from "react";
import { useFormContext } from "react-hook-form";
import { Button } from "../../../components/ui/button.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { useDeriveBeta, type DeriveRequest } from "../api/derive-beta.ts";
import type { SubmissionFormInput } from "./form-values.ts";

type Source = "energy_flux" | "frequency_drift" | "propagation";

const inputClass = "w-full rounded border border-paper-edge bg-white/70 px-2 py-1 font-mono text-sm";

/**
 * Derives beta from how the theory changes the binding energy and flux (or the frequency drift), on the
 * server, and offers the result for the mapping. The inputs are kept as the mapping's derivation, so
 * the reviewer and the engine can re-derive it.
 */
export function DeriveHelper({ index }: { index: number }) {
  const id = useId();
  const { getValues, setValue } = useFormContext<SubmissionFormInput>();
  const derive = useDeriveBeta();
  const [source, setSource] = useState<Source>("energy_flux");
  const [order, setOrder] = useState("-1");
  const [energy, setEnergy] = useState("");
  const [flux, setFlux] = useState("");
  const [gamma, setGamma] = useState("");
  const [alphaMd, setAlphaMd] = useState("0");
  const [dispersion, setDispersion] = useState("");
  const [used, setUsed] = useState<number | undefined>();

  const alphaNumber = Number(alphaMd);
  const alphaOk = alphaMd.trim() !== "" && Number.isFinite(alphaNumber);
  // A propagation effect's order follows from the dispersion exponent: n = (3 alpha + 2) / 2.
  const orderNumber = source === "propagation" ? (3 * alphaNumber + 2) / 2 : Number(order);
  const orderOk = source === "propagation" ? alphaOk : order.trim() !== "" && Number.isFinite(orderNumber);

  function run() {
    const couplings = getValues("theory.couplings").flatMap((c) => (c.symbol && typeof c.dimension === "number" ? [{ symbol: c.symbol, dimension: c.dimension }] : []));
    const definitions = (getValues("theory.definitions") ?? []).flatMap((d) => (d.symbol && d.expression ? [{ symbol: d.symbol, expression: d.expression }] : []));
    const req: DeriveRequest = { couplings, definitions };
    if (source === "energy_flux") {
      if (energy.trim()) req.energy = { order: orderNumber, coefficient: energy.trim() };
      if (flux.trim()) req.flux = { order: orderNumber, coefficient: flux.trim() };
    } else if (source === "frequency_drift" && gamma.trim()) {
      req.frequency_drift = { order: orderNumber, coefficient: gamma.trim() };
    } else if (source === "propagation" && dispersion.trim()) {
      req.propagation = { alpha_md: alphaNumber, coefficient: dispersion.trim() };
    }
    setUsed(undefined);
    derive.mutate(req);
  }

  function use(termIndex: number) {
    const term = derive.data?.terms[termIndex];
    if (!term) return;
    const base = `theory.mappings.${index}` as const;
    const opts = { shouldDirty: true, shouldValidate: true } as const;
    setValue(`${base}.expression`, term.beta, opts);
    setValue(`${base}.b`, term.b, opts);
    setValue(`${base}.pn_order`, term.pn_order, opts);
    if (source === "propagation") setValue(`${base}.alpha_md`, alphaNumber, opts);
    setValue(
      `${base}.derivation`,
      source === "energy_flux"
        ? { kind: "energy_flux", order: orderNumber, ...(energy.trim() ? { A: energy.trim() } : {}), ...(flux.trim() ? { B: flux.trim() } : {}) }
        : source === "frequency_drift"
          ? { kind: "frequency_drift", order: orderNumber, gamma: gamma.trim() }
          : { kind: "propagation", order: orderNumber, A: dispersion.trim() },
      opts,
    );
    setUsed(termIndex);
  }

  const canRun = orderOk && (source === "energy_flux" ? Boolean(energy.trim() || flux.trim()) : source === "frequency_drift" ? Boolean(gamma.trim()) : Boolean(dispersion.trim()));
  return (
    <div className="flex flex-col gap-3 text-sm" data-testid={`derive-${index}`}>
      <fieldset className="flex flex-wrap gap-4">
        <legend className="sr-only">What the theory changes</legend>
        <label className="flex items-center gap-1">
          <input type="radio" name={`${id}-source`} checked={source === "energy_flux"} onChange={() => setSource("energy_flux")} /> binding energy and/or flux
        </label>
        <label className="flex items-center gap-1">
          <input type="radio" name={`${id}-source`} checked={source === "frequency_drift"} onChange={() => setSource("frequency_drift")} /> frequency drift
        </label>
        <label className="flex items-center gap-1">
          <input type="radio" name={`${id}-source`} checked={source === "propagation"} onChange={() => setSource("propagation")} /> propagation (dispersion relation)
        </label>
      </fieldset>
      <p className="text-ink-soft">
        {source === "energy_flux" ? (
          <MathTex tex={"E = E_{\\rm GR}\\,[1 + A\\,v^{2k}],\\quad F = F_{\\rm GR}\\,[1 + B\\,v^{2k}]"} />
        ) : source === "frequency_drift" ? (
          <MathTex tex={"\\dot f = \\dot f_{\\rm GR}\\,[1 + \\gamma\\,u^{2k}]"} />
        ) : (
          <MathTex tex={"E^2 = p^2 + A\\,p^{\\alpha}"} />
        )}
        <span className="ml-2">
          {source === "propagation"
            ? "first order in A; give A / h^(2 − α) as a power of length with its sign (1/lambda_g^2 for a graviton mass, α = 0)."
            : "first order in A, B, γ; k is the relative PN order."}
        </span>
      </p>
      <div className="grid gap-3 sm:grid-cols-[6rem_1fr_1fr]">
        {source === "propagation" ? (
          <label className="flex flex-col gap-1">
            <span className="font-semibold">α (exponent)</span>
            <input className={inputClass} value={alphaMd} onChange={(e) => setAlphaMd(e.target.value)} inputMode="decimal" aria-invalid={!alphaOk} />
          </label>
        ) : (
          <label className="flex flex-col gap-1">
            <span className="font-semibold">k (PN order)</span>
            <input className={inputClass} value={order} onChange={(e) => setOrder(e.target.value)} inputMode="decimal" aria-invalid={!orderOk} />
          </label>
        )}
        {source === "propagation" ? (
          <label className="flex flex-col gap-1 sm:col-span-2">
            <span className="font-semibold">A / h^(2 − α) (dispersion)</span>
            <input className={inputClass} value={dispersion} onChange={(e) => setDispersion(e.target.value)} placeholder="1/lambda_g^2" spellCheck={false} />
          </label>
        ) : source === "energy_flux" ? (
          <>
            <label className="flex flex-col gap-1">
              <span className="font-semibold">A (energy)</span>
              <input className={inputClass} value={energy} onChange={(e) => setEnergy(e.target.value)} placeholder="0" spellCheck={false} />
            </label>
            <label className="flex flex-col gap-1">
              <span className="font-semibold">B (flux)</span>
              <input className={inputClass} value={flux} onChange={(e) => setFlux(e.target.value)} placeholder="(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" spellCheck={false} />
            </label>
          </>
        ) : (
          <label className="flex flex-col gap-1 sm:col-span-2">
            <span className="font-semibold">γ (frequency drift)</span>
            <input className={inputClass} value={gamma} onChange={(e) => setGamma(e.target.value)} spellCheck={false} />
          </label>
        )}
      </div>
      <div>
        <Button onClick={run} disabled={!canRun} busy={derive.isPending}>
          Derive β
        </Button>
      </div>
      {derive.isError && <ErrorNote error={derive.error} title="The derivation failed." />}
      {derive.data && (
        <div className="rounded border border-paper-edge bg-paper p-3" aria-live="polite">
          {derive.data.terms.length === 0 && <p>No phase correction follows at first order (for example a −1PN change of the energy alone).</p>}
          <ul className="flex flex-col gap-2">
            {derive.data.terms.map((t, i) => (
              <li key={i} className="flex flex-wrap items-center gap-3" data-testid={`derived-term-${i}`}>
                <MathTex tex={`\\displaystyle b = ${t.b}:\\quad \\beta = ${t.beta_latex}`} className="text-lg" />
                <Button kind={used === i ? "secondary" : "primary"} onClick={() => use(i)}>
                  {used === i ? "used for this mapping" : "use this β"}
                </Button>
              </li>
            ))}
          </ul>
          {derive.data.steps.length > 0 && (
            <details className="mt-2">
              <summary className="cursor-pointer text-sea">Steps ({derive.data.steps.length})</summary>
              <ol className="mt-1 flex flex-col gap-1 pl-2">
                {derive.data.steps.map((s, i) => (
                  <li key={i}>
                    <MathTex display tex={s} />
                  </li>
                ))}
              </ol>
            </details>
          )}
          {(derive.data.amplitude ?? []).map((t, i) => (
            <p key={`a${i}`} className="mt-2 text-ink-soft">
              With it, an amplitude correction: <MathTex tex={`a = ${t.a}:\\quad \\alpha = ${t.alpha_latex}`} />
              {t.note && <span className="block text-xs" data-testid="amplitude-note">{`${t.note.charAt(0).toUpperCase()}${t.note.slice(1)}.`}</span>}
            </p>
          ))}
          <ul className="mt-2 list-disc pl-5 text-xs text-ink-soft">
            {derive.data.notes.map((n, i) => (
              <li key={i}>{n}</li>
            ))}
            <li>Leading order in the small-coupling expansion; higher PN corrections to the same effect are not included.</li>
          </ul>
        </div>
      )}
    </div>
  );
}
