import type { ConvertResult } from "../../../../common/convert.ts";
import type { Sheet, SheetRecord } from "../../../../common/sheets.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { ScrollBox } from "../../../components/ui/scroll-box.tsx";
import { sciText, unitLabel } from "../../../components/ui/text-format.ts";
import { formatDateTime } from "../../../../common/dates.ts";
import { catalogueVersionText } from "../../../../common/catalogue-version.ts";

/** A sheet's records and their stored translations, read-only (owner and shared readers alike). */

const num = (x: number) => sciText(x, 3);
const unit = (u: string) => (u.trim() === "1" || u.trim() === "" ? "" : unitLabel(u));

function boundText(r: SheetRecord): string {
  const b = r.bound;
  const symbol = b.parameter === "ppe_beta" ? "β" : `δφ_${b.k}`;
  const [lo, hi] = b.interval ?? [null, null];
  const value =
    b.upper !== undefined ? `|${symbol}| ≤ ${num(b.upper)}` : lo !== null && hi !== null ? `${symbol} ∈ [${num(lo)}, ${num(hi)}]` : lo !== null ? `${symbol} ≥ ${num(lo)}` : `${symbol} ≤ ${num(hi ?? Number.NaN)}`;
  const what = b.parameter === "ppe_beta" ? `${value} at b = ${b.b}${b.sign_convention === "minus" ? " (exp(−iΨ))" : ""}` : value;
  return `${what}, ${Math.round(b.credibility * 1000) / 10}% credibility`;
}

function binaryText(r: SheetRecord): string {
  const x = r.binary;
  const spins = x.chi1 || x.chi2 ? `, χ = ${x.chi1}, ${x.chi2}` : "";
  return `${x.m1} + ${x.m2} M☉ (${x.frame} frame)${spins}, ${x.bodies.join("–")}${x.z === undefined ? "" : `, z = ${x.z}`}`;
}

function bestSentence(r: ConvertResult): string | undefined {
  const comparable = r.reference_bounds.filter((c) => c.ratio !== null);
  const best = comparable.reduce<(typeof comparable)[number] | undefined>((acc, c) => (!acc || (c.ratio ?? 0) < (acc.ratio ?? 0) ? c : acc), undefined);
  return best?.sentence;
}

function hostOf(link: string): string {
  try {
    return new URL(link).host;
  } catch {
    return link;
  }
}

export function ValidityBadge({ r }: { r: ConvertResult }) {
  if (!r.valid) return <Badge tone="fail">not valid</Badge>;
  return r.validity.some((v) => !v.ok) ? <Badge tone="caution">valid, with caution</Badge> : <Badge tone="ok">valid</Badge>;
}

interface Props {
  sheet: Sheet;
  /** Owner only: remove a record (the page PATCHes the sheet without it). */
  onRemove?: (record: SheetRecord) => void;
  busy?: boolean;
}

export function SheetRecords({ sheet, onRemove, busy = false }: Props) {
  if (sheet.records.length === 0) return <p className="rounded border border-dashed border-paper-edge p-4 text-ink-soft">No records yet: translate a bound and save it to this sheet.</p>;
  return (
    <ol className="flex flex-col gap-6" data-testid="sheet-records">
      {sheet.records.map((r) => (
        <li key={r.id} className="rounded border border-paper-edge bg-white/40 p-4" data-testid={`record-${r.label}`}>
          <div className="flex flex-wrap items-baseline justify-between gap-3">
            <h3 className="text-lg">
              {r.label}
              {r.detector_network && <span className="ml-2 text-sm font-normal text-ink-soft">{r.detector_network}</span>}
            </h3>
            {onRemove && (
              <Button kind="danger" onClick={() => onRemove(r)} busy={busy}>
                Remove record
              </Button>
            )}
          </div>
          <p className="text-sm text-ink-soft">
            {boundText(r)} · {binaryText(r)}
            {r.analysis_method && <> · {r.analysis_method}</>}
          </p>
          {r.data_link && (
            <p className="text-sm">
              data:{" "}
              <a href={r.data_link} rel="noreferrer noopener" target="_blank">
                {hostOf(r.data_link)}
              </a>
            </p>
          )}
          {r.notes && <p className="mt-1 text-sm italic text-ink-soft">{r.notes}</p>}
          <ScrollBox label={`Limits from ${r.label}`} className="mt-3">
          <table className="w-full border-collapse text-sm">
            <thead className="text-left text-ink-soft">
              <tr>
                <th scope="col" className="sticky left-0 bg-paper py-1 pr-3 font-semibold">Theory</th>
                <th scope="col" className="py-1 pr-3 font-semibold">Limit</th>
                <th scope="col" className="py-1 pr-3 font-semibold">Validity</th>
                <th scope="col" className="py-1 font-semibold">Against published bounds · cautions</th>
              </tr>
            </thead>
            <tbody>
              {r.translation.results.map((x) => (
                <tr key={x.theory} className="border-t border-paper-edge align-top">
                  <td className="sticky left-0 bg-paper py-1 pr-3 min-w-[7rem]">{x.theory_name}</td>
                  <td className="py-1 pr-3 whitespace-nowrap tabular-nums">
                    <MathTex tex={x.coupling.latex} label={x.coupling.symbol} /> {x.coupling.side === "upper" ? "≤" : "≥"} {num(x.coupling.value)} {unit(x.coupling.unit)}
                    {x.also.map((a) => (
                      <span key={a.symbol} className="block text-ink-soft">
                        <MathTex tex={a.latex} label={a.symbol} /> {a.side === "upper" ? "≤" : "≥"} {num(a.value)} {unit(a.unit)}
                      </span>
                    ))}
                  </td>
                  <td className="py-1 pr-3">
                    <ValidityBadge r={x} />
                  </td>
                  <td className="py-1">
                    {bestSentence(x) && <span className="block">{bestSentence(x)}</span>}
                    {x.cautions
                      .filter((c) => c.code === "validity" || c.code === "one_signed")
                      .map((c, i) => (
                        <span key={i} className={`block text-xs ${c.code === "validity" ? "text-brick" : "text-amber"}`}>
                          {c.message}
                        </span>
                      ))}
                  </td>
                </tr>
              ))}
              {r.translation.results.length === 0 && (
                <tr>
                  <td colSpan={4} className="py-1 text-ink-soft">
                    No catalogued theory is constrained by this bound.
                  </td>
                </tr>
              )}
            </tbody>
          </table>
          </ScrollBox>
          {r.translation.not_applicable.length > 0 && (
            <details className="mt-2 text-sm text-ink-soft">
              <summary>{r.translation.not_applicable.length} theories not constrained, and why</summary>
              <ul className="mt-1">
                {r.translation.not_applicable.map((n) => (
                  <li key={n.theory}>
                    {n.theory_name}: {n.reason}
                  </li>
                ))}
              </ul>
            </details>
          )}
          <p className="mt-2 text-xs text-ink-faint">
            Translated {formatDateTime(r.translated_at)} against the catalogue of{" "}
            <span title={`catalogue version ${r.translation.catalogue_revision}`} className="underline decoration-dotted">
              {catalogueVersionText(r.translation.catalogue_revision)}
            </span>
            ; H₀ = {r.cosmology.H0}, Ωₘ = {r.cosmology.Omega_m}.
          </p>
        </li>
      ))}
    </ol>
  );
}
