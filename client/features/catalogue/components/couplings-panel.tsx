import { useId, useState } from "react";
import { conditionText } from "../../../../common/symbol-text.ts";
import type { TheoryDetail } from "../../../../common/catalogue.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { authorList, factorTex, unitLabel } from "./format.ts";
import { RetiredNote } from "./retirement.tsx";

type StoredCoupling = TheoryDetail["couplings"][number];

/** The factor with enough digits to check by hand, in tabular figures. */
function showFactor(f: number): string {
  return Number.isInteger(f) ? String(f) : f.toPrecision(6);
}

function CouplingCard({ coupling }: { coupling: StoredCoupling }) {
  const id = useId();
  const canonical = coupling.convention ?? coupling.conventions[0]?.name ?? "canonical";
  const [chosen, setChosen] = useState(canonical);
  const convention = coupling.conventions.find((c) => c.name === chosen);
  const sub = (name: string) => `${coupling.latex}_{\\mathrm{${name.replace(/[^A-Za-z0-9]/g, "")}}}`;
  return (
    <article className="rounded border border-paper-edge bg-white/40 p-4" data-testid={`coupling-${coupling.symbol}`}>
      <header className="flex flex-wrap items-baseline gap-3">
        <h3 className="text-lg">
          <MathTex tex={coupling.latex} />
        </h3>
        <span className="text-sm text-ink-soft">
          unit {unitLabel(coupling.unit)}; dimension L<sup className="tabular-nums">{coupling.dimension}</sup> (G = c = 1)
        </span>
        {coupling.quoted && (
          <span className="text-sm text-ink-soft">
            limits quoted as <MathTex tex={coupling.quoted.latex} /> in {unitLabel(coupling.quoted.unit)}
          </span>
        )}
      </header>
      {coupling.retired && <RetiredNote retired={coupling.retired} what="This coupling" />}
      {coupling.description && <p className="mt-1 text-[0.95rem]">{conditionText(coupling.description)}</p>}
      <p className="mt-1 text-xs text-ink-faint" data-machine>
        API name <code>{coupling.symbol}</code>
        {coupling.quoted && coupling.quoted.symbol !== coupling.symbol && (
          <>
            ; limits as <code>{coupling.quoted.symbol}</code>
          </>
        )}
      </p>
      {coupling.conventions.length > 0 && (
        <div className="mt-3 border-t border-paper-edge pt-3">
          <div className="flex flex-wrap items-center gap-3">
            <label htmlFor={`${id}-conv`} className="text-sm font-semibold">
              Convention
            </label>
            <select id={`${id}-conv`} value={chosen} onChange={(e) => setChosen(e.target.value)} className="rounded border border-paper-edge bg-white/70 px-2 py-1 text-sm">
              {coupling.conventions.map((c) => (
                <option key={c.name} value={c.name}>
                  {c.name}
                  {c.name === canonical ? " (used by the mappings)" : ""}
                </option>
              ))}
            </select>
          </div>
          {convention && (
            <div className="mt-2 flex flex-col gap-1 text-[0.95rem]" data-testid="convention-detail">
              {convention.name === canonical ? (
                <p>The mappings on this page use this normalisation.</p>
              ) : (
                <p className="tabular-nums">
                  <MathTex tex={`${sub(canonical)} = ${convention.factor_expression ? factorTex(convention.factor_expression) : showFactor(convention.factor)}\\; ${sub(convention.name)}`} />
                  <span className="ml-3 text-ink-soft">factor = {showFactor(convention.factor)}</span>
                </p>
              )}
              {convention.action_latex && <MathTex display tex={convention.action_latex} />}
              {convention.note && <p className="text-sm text-ink-soft">{conditionText(convention.note)}</p>}
              <p className="text-sm text-ink-soft">
                {convention.reference ? (
                  <>
                    Reference: {authorList(convention.reference.authors, 2)} ({convention.reference.year})
                    {convention.reference.arxiv ? `, arXiv:${convention.reference.arxiv}` : ""}
                  </>
                ) : (
                  "No reference given for this convention."
                )}
                {convention.source_status === "memory" && (
                  <Badge tone="caution" className="ml-2">
                    source to be confirmed
                  </Badge>
                )}
                {convention.source_status === "derived" && (
                  <Badge tone="info" className="ml-2">
                    derived
                  </Badge>
                )}
              </p>
            </div>
          )}
        </div>
      )}
    </article>
  );
}

export function CouplingsPanel({ couplings }: { couplings: StoredCoupling[] }) {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {couplings.map((c) => (
        <CouplingCard key={c.symbol} coupling={c} />
      ))}
    </div>
  );
}
