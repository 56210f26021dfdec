import type { ConvertResponse, ConvertResult } from "../../../../common/convert.ts";
import { catalogueVersionText } from "../../../../common/catalogue-version.ts";
import { formatDateTime } from "../../../../common/dates.ts";
import type { EntryChange, TranslationRecord } from "../../../../common/sheets.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { ScrollBox } from "../../../components/ui/scroll-box.tsx";
import { sciText, unitLabel } from "../../../components/ui/text-format.ts";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";

/** A translation record: the bound, the binary, and the translation as it was made when saved. */

export const num = (x: number) => sciText(x, 3);
export const unit = (u: string) => (u.trim() === "1" || u.trim() === "" ? "" : unitLabel(u));

export function boundText(r: TranslationRecord): string {
  const b = r.bound;
  const symbol = b.parameter === "ppe_beta" ? "β" : `δφ_${b.k}`;
  const [lo, hi] = b.interval ?? [null, null];
  const value =
    b.upper !== undefined ? `|${symbol}| ≤ ${num(b.upper)}` : lo !== null && hi !== null ? `${symbol} ∈ [${num(lo)}, ${num(hi)}]` : lo !== null ? `${symbol} ≥ ${num(lo)}` : `${symbol} ≤ ${num(hi ?? Number.NaN)}`;
  const what = b.parameter === "ppe_beta" ? `${value} at b = ${b.b}${b.sign_convention === "minus" ? " (exp(−iΨ))" : ""}` : value;
  return `${what}, ${Math.round(b.credibility * 1000) / 10}% credibility`;
}

function binaryText(r: TranslationRecord): string {
  const x = r.binary;
  const spins = x.chi1 || x.chi2 ? `, χ = ${x.chi1}, ${x.chi2}` : "";
  return `${x.m1} + ${x.m2} M☉ (${x.frame} frame)${spins}, ${x.bodies.join("–")}${x.z === undefined ? "" : `, z = ${x.z}`}`;
}

function bestSentence(r: ConvertResult): string | undefined {
  const comparable = r.reference_bounds.filter((c) => c.ratio !== null);
  const best = comparable.reduce<(typeof comparable)[number] | undefined>((acc, c) => (!acc || (c.ratio ?? 0) < (acc.ratio ?? 0) ? c : acc), undefined);
  return best?.sentence;
}

export function ValidityBadge({ r }: { r: ConvertResult }) {
  if (!r.valid) return <Badge tone="fail">not valid</Badge>;
  return r.validity.some((v) => !v.ok) ? <Badge tone="caution">valid, with caution</Badge> : <Badge tone="ok">valid</Badge>;
}

function LimitsTable({ label, translation }: { label: string; translation: ConvertResponse }) {
  return (
    <ScrollBox label={`Limits from ${label}`} className="mt-3">
      <table className="w-full border-collapse text-sm">
        <thead className="text-left text-ink-soft">
          <tr>
            <th scope="col" className="sticky left-0 bg-paper py-1 pr-3 font-semibold">
              Theory
            </th>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Limit
            </th>
            <th scope="col" className="py-1 pr-3 font-semibold">
              Validity
            </th>
            <th scope="col" className="py-1 font-semibold">
              Against published bounds · cautions
            </th>
          </tr>
        </thead>
        <tbody>
          {translation.results.map((x) => (
            <tr key={`${x.theory}-${x.coupling_symbol}`} className="border-t border-paper-edge align-top">
              <td className="sticky left-0 min-w-[7rem] bg-paper py-1 pr-3">{x.theory_name}</td>
              <td className="whitespace-nowrap py-1 pr-3 tabular-nums">
                <MathTex tex={x.coupling.latex} label={symbolText(x.coupling.symbol, x.coupling.latex)} /> {x.coupling.side === "upper" ? "≤" : "≥"} {num(x.coupling.value)} {unit(x.coupling.unit)}
                {x.also.map((a) => (
                  <span key={a.symbol} className="block text-ink-soft">
                    <MathTex tex={a.latex} label={symbolText(a.symbol, a.latex)} /> {a.side === "upper" ? "≤" : "≥"} {num(a.value)} {unit(a.unit)}
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
                      {conditionText(c.message)}
                    </span>
                  ))}
              </td>
            </tr>
          ))}
          {translation.results.length === 0 && (
            <tr>
              <td colSpan={4} className="py-1 text-ink-soft">
                No catalogued theory is constrained by this bound.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </ScrollBox>
  );
}

export function CatalogueVersion({ token }: { token: string }) {
  return (
    <span title={`catalogue version ${token}`} className="underline decoration-dotted">
      {catalogueVersionText(token)}
    </span>
  );
}

function entryText(e: EntryChange): string {
  return `${e.name} (${e.was === null ? "new" : `revision ${e.was}`} → ${e.now === null ? "retired" : `revision ${e.now}`})`;
}

function changeCounts(entries: EntryChange[]): string {
  const added = entries.filter((e) => e.was === null).length;
  const retired = entries.filter((e) => e.now === null).length;
  const revised = entries.length - added - retired;
  return [added && `${added} new`, revised && `${revised} revised`, retired && `${retired} retired`].filter(Boolean).join(", ");
}

export function StaleNote({ r, onRetranslate, busy }: { r: Pick<TranslationRecord, "stale">; onRetranslate?: (() => void) | undefined; busy: boolean }) {
  if (!r.stale) return null;
  const entries = r.stale.entries;
  return (
    <div className="mt-2 flex flex-wrap items-baseline gap-3 rounded border border-amber/50 bg-amber-wash px-3 py-2 text-sm" data-testid="record-stale">
      <p className="text-amber">
        <strong>Catalogue changed since this was translated.</strong>{" "}
        {entries.length === 0
          ? "The catalogue version differs from the one it was translated against."
          : entries.length <= 3
            ? `Changed entries: ${entries.map(entryText).join("; ")}.`
            : `${entries.length} entries that bear on this bound changed (${changeCounts(entries)}).`}{" "}
        The saved result below is kept as it was{onRetranslate ? "; re-translate to see what would change." : "."}
      </p>
      {entries.length > 3 && (
        <details className="w-full text-xs text-ink-soft">
          <summary className="cursor-pointer">Which entries</summary>
          <ul className="mt-1 list-disc pl-5">
            {entries.map((e) => (
              <li key={e.theory}>{entryText(e)}</li>
            ))}
          </ul>
        </details>
      )}
      {onRetranslate && (
        <Button onClick={onRetranslate} busy={busy} data-testid="retranslate-record">
          Re-translate…
        </Button>
      )}
    </div>
  );
}

function History({ r }: { r: TranslationRecord }) {
  if (r.history.length === 0) return null;
  return (
    <details className="mt-2 text-sm" data-testid="record-history">
      <summary className="cursor-pointer text-ink-soft">
        {r.history.length} earlier translation{r.history.length === 1 ? "" : "s"} (replaced by re-translation)
      </summary>
      <ol className="mt-2 flex flex-col gap-3">
        {[...r.history].reverse().map((h, i) => (
          <li key={i} className="rounded border border-dashed border-paper-edge p-2">
            <p className="text-xs text-ink-soft">
              Translated {formatDateTime(h.translated_at)} against the catalogue of <CatalogueVersion token={h.translation.catalogue_revision} />; replaced {formatDateTime(h.replaced_at)}.
            </p>
            <LimitsTable label={`${r.label}, earlier translation`} translation={h.translation} />
          </li>
        ))}
      </ol>
    </details>
  );
}

export function TranslationRecordBody({ r, onRetranslate, busy = false }: { r: TranslationRecord; onRetranslate?: (() => void) | undefined; busy?: boolean }) {
  return (
    <>
      <p className="text-sm text-ink-soft">
        {boundText(r)} · {binaryText(r)}
        {r.analysis_method && <> · {r.analysis_method}</>}
      </p>
      <StaleNote r={r} onRetranslate={onRetranslate} busy={busy} />
      <LimitsTable label={r.label} translation={r.translation} />
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
        Translated {formatDateTime(r.translated_at)} against the catalogue of <CatalogueVersion token={r.translation.catalogue_revision} />; H₀ = {r.cosmology.H0}, Ωₘ = {r.cosmology.Omega_m}.
        {!r.stale && onRetranslate && (
          <>
            {" "}
            <button type="button" className="underline" onClick={onRetranslate} data-testid="retranslate-record">
              Re-translate against today's catalogue
            </button>
          </>
        )}
      </p>
      <History r={r} />
    </>
  );
}
