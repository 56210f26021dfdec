import { formatDateTime } from "../../../../common/dates.ts";
import type { RingdownConvertResponse } from "../../../../common/ringdown.ts";
import { ringdownBoundText, ringdownLimitOf } from "../../../../common/ringdown-limit.ts";
import type { RingdownRecord } from "../../../../common/sheets.ts";
import { symbolText } from "../../../../common/symbol-text.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { ScrollBox } from "../../../components/ui/scroll-box.tsx";
import { bestReference } from "../../translate/components/results-table.tsx";
import { CatalogueVersion, num, StaleNote, unit } from "./translation-record.tsx";

/** A ringdown record: the QNM-shift bound, the remnant, and the translation as it was made when saved. */

const VERDICT = {
  valid: <Badge tone="ok">valid</Badge>,
  outside_validity: <Badge tone="fail">not valid</Badge>,
  not_assessed: <Badge tone="info">not assessed</Badge>,
} as const;

function remnantText(t: RingdownConvertResponse): string {
  const r = t.remnant;
  return `remnant ${Number(r.M_f_source.toPrecision(4))} M☉ (source frame), χ_f = ${Number(r.chi_f.toPrecision(3))}${r.from === "fit" ? ", from the binary through the remnant fits" : ""}${r.z === undefined ? "" : `, z = ${r.z}`}`;
}

function RingdownLimits({ label, translation }: { label: string; translation: RingdownConvertResponse }) {
  const rows = translation.results.filter((x) => x.status === "bounded");
  return (
    <ScrollBox label={`Limits from ${label}`} className="mt-3">
      <table className="w-full border-collapse text-sm">
        <thead className="text-left text-ink-soft">
          <tr>
            <th scope="col" className="sticky left-0 bg-paper py-1 pr-3 font-semibold">
              Entry
            </th>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Limit
            </th>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Validity
            </th>
            <th scope="col" className="py-1 font-semibold">
              Against published bounds · sources
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((x) => {
            const l = ringdownLimitOf(x)!;
            const best = bestReference(x.reference_bounds);
            return (
              <tr key={`${x.slug}-${x.mapping?.kind ?? ""}`} className="border-t border-paper-edge align-top">
                <td className="sticky left-0 min-w-[7rem] bg-paper py-1 pr-3">{x.name}</td>
                <td className="whitespace-nowrap py-1 pr-3 tabular-nums">
                  {l.signed_interval ? (
                    <>
                      {num(l.signed_interval.lower)} ≤ <MathTex tex={l.latex} label={symbolText(l.symbol, l.latex)} /> ≤ {num(l.signed_interval.upper)} {unit(l.unit)}
                    </>
                  ) : (
                    <>
                      <MathTex tex={l.latex} label={symbolText(l.symbol, l.latex)} /> {l.side === "upper" ? "≤" : "≥"} {num(l.value)} {unit(l.unit)}
                    </>
                  )}
                </td>
                <td className="py-1 pr-3">{VERDICT[x.verdict]}</td>
                <td className="min-w-[14rem] py-1">
                  {best && <span className="block">{best.sentence}</span>}
                  {x.references.length > 0 && <span className="block text-xs text-ink-soft">sources: {x.references.map((c) => c.citation).join("; ")}</span>}
                </td>
              </tr>
            );
          })}
          {rows.length === 0 && (
            <tr>
              <td colSpan={4} className="py-1 text-ink-soft">
                No catalogued entry is limited by this bound.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </ScrollBox>
  );
}

export function RingdownRecordBody({ r, onRetranslate, busy = false }: { r: RingdownRecord; onRetranslate?: (() => void) | undefined; busy?: boolean }) {
  const t = r.translation;
  const others = t.results.filter((x) => x.status !== "bounded");
  return (
    <>
      <p className="text-sm text-ink-soft">
        {ringdownBoundText(t.bound, r.request.bound.upper)} · {remnantText(t)}
        {r.analysis_method && <> · {r.analysis_method}</>}
      </p>
      <StaleNote r={r} onRetranslate={onRetranslate} busy={busy} />
      <RingdownLimits label={r.label} translation={t} />
      {others.length > 0 && (
        <details className="mt-2 text-sm text-ink-soft">
          <summary>{others.length} entries not limited, and why</summary>
          <ul className="mt-1">
            {others.map((n) => (
              <li key={`${n.slug}-${n.mapping?.kind ?? ""}`}>
                {n.name}: {n.reason}
              </li>
            ))}
          </ul>
        </details>
      )}
      <p className="mt-2 text-xs text-ink-faint">
        Translated {formatDateTime(r.translated_at)} against the catalogue of {t.catalogue_revision ? <CatalogueVersion token={t.catalogue_revision} /> : "an unrecorded version"}; Kerr (
        {t.qnm.mode.split("").join(",")}) mode f = {t.qnm.frequency_hz.toPrecision(4)} Hz, τ = {(t.qnm.damping_time_s * 1e3).toPrecision(3)} ms ({t.qnm.frame} frame).
        {!r.stale && onRetranslate && (
          <>
            {" "}
            <button type="button" className="underline" onClick={onRetranslate} data-testid="retranslate-record">
              Re-translate against today's catalogue
            </button>
          </>
        )}
      </p>
      {r.history.length > 0 && (
        <details className="mt-2 text-sm" data-testid="record-history">
          <summary className="cursor-pointer text-ink-soft">
            {r.history.length} earlier translation{r.history.length === 1 ? "" : "s"} (replaced by re-translation)
          </summary>
          <ol className="mt-2 flex flex-col gap-3">
            {[...r.history].reverse().map((h, i) => (
              <li key={i} className="rounded border border-dashed border-paper-edge p-2">
                <p className="text-xs text-ink-soft">
                  Translated {formatDateTime(h.translated_at)}; replaced {formatDateTime(h.replaced_at)}.
                </p>
                <RingdownLimits label={`${r.label}, earlier translation`} translation={h.translation} />
              </li>
            ))}
          </ol>
        </details>
      )}
    </>
  );
}
