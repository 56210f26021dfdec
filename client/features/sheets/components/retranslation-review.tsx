import { useEffect, useRef } from "react";
import { catalogueVersionText } from "../../../../common/catalogue-version.ts";
import type { LimitChange, LimitSnapshot, RetranslationPreview } from "../../../../common/sheets.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { ScrollBox } from "../../../components/ui/scroll-box.tsx";
import { num, unit } from "./translation-record.tsx";
import { symbolText } from "../../../../common/symbol-text.ts";

/**
 * What a re-translation would change, record by record, before the owner accepts it: each limit old
 * and new (value, verdict), the entries whose revision moved, and the catalogue versions. Nothing is
 * saved until "Accept"; the replaced translation then stays in the record's history.
 */

const VERDICT: Record<LimitSnapshot["verdict"], string> = { valid: "valid", outside_validity: "not valid", not_assessed: "not assessed" };

function limitText(l: LimitSnapshot | null) {
  if (!l) return <span className="text-ink-faint">—</span>;
  const value = l.signed_interval ? `∈ [${l.signed_interval.lower === null ? "−∞" : num(l.signed_interval.lower)}, ${l.signed_interval.upper === null ? "∞" : num(l.signed_interval.upper)}]` : `${l.side === "upper" ? "≤" : "≥"} ${num(l.value)}`;
  return (
    <>
      <MathTex tex={l.latex} label={symbolText(l.symbol, l.latex)} /> {value} {unit(l.unit)} <span className="text-ink-soft">({VERDICT[l.verdict]})</span>
    </>
  );
}

function changeBadge(c: LimitChange) {
  if (c.status === "same") return <Badge>same</Badge>;
  if (c.status === "added") return <Badge tone="info">new limit</Badge>;
  if (c.status === "removed") return <Badge tone="caution">no longer given</Badge>;
  return <Badge tone={c.verdict_changed ? "fail" : "caution"}>{c.verdict_changed ? "verdict changed" : "value changed"}</Badge>;
}

interface Props {
  preview: RetranslationPreview;
  onAccept: () => void;
  onDismiss: () => void;
  busy: boolean;
}

export function RetranslationReview({ preview, onAccept, onDismiss, busy }: Props) {
  const ref = useRef<HTMLElement>(null);
  useEffect(() => {
    ref.current?.focus();
  }, [preview]);
  const anyChange = preview.records.some((r) => r.changed);
  return (
    <section ref={ref} tabIndex={-1} aria-labelledby="retranslation-title" className="flex flex-col gap-4 rounded border-2 border-sea/40 bg-sea-wash/30 p-4" data-testid="retranslation-review">
      <h3 id="retranslation-title" className="text-lg">
        Re-translation against the catalogue of {catalogueVersionText(preview.catalogue_revision)}: not saved yet
      </h3>
      <p className="text-sm text-ink-soft" role="status">
        {anyChange
          ? "Some limits would change. Check them below; accepting replaces the saved translations and keeps the old ones in each record's history."
          : "Every limit and verdict reads the same as the saved one. Accepting only records the new catalogue version (the old translation stays in the history)."}
      </p>
      {preview.records.map((r) => (
        <article key={r.id} className="flex flex-col gap-2" data-testid={`retranslation-${r.label}`}>
          <h4 className="font-semibold">
            {r.label}{" "}
            <span className="text-sm font-normal text-ink-soft">
              (saved against{" "}
              <span title={`catalogue version ${r.old_catalogue_revision}`} className="underline decoration-dotted">
                {catalogueVersionText(r.old_catalogue_revision)}
              </span>
              )
            </span>
          </h4>
          {catalogueVersionText(r.old_catalogue_revision) === catalogueVersionText(preview.catalogue_revision) && r.old_catalogue_revision !== preview.catalogue_revision && (
            <p className="text-xs text-ink-soft">
              Catalogue version {r.old_catalogue_revision} then, {preview.catalogue_revision} now.
            </p>
          )}
          {r.entries.length > 0 && (
            <p className="text-sm">
              Entries changed: {r.entries.map((e) => `${e.name} ${e.was === null ? "(new)" : `revision ${e.was}`} → ${e.now === null ? "retired" : `revision ${e.now}`}`).join("; ")}.
            </p>
          )}
          <ScrollBox label={`Changes for ${r.label}`}>
            <table className="w-full border-collapse text-sm">
              <thead className="text-left text-ink-soft">
                <tr>
                  <th scope="col" className="sticky left-0 bg-paper py-1 pr-3 font-semibold">
                    Theory
                  </th>
                  <th scope="col" className="py-1 pr-3 font-semibold">
                    Saved
                  </th>
                  <th scope="col" className="py-1 pr-3 font-semibold">
                    Re-translated
                  </th>
                  <th scope="col" className="py-1 font-semibold">
                    Change
                  </th>
                </tr>
              </thead>
              <tbody>
                {r.limits.map((c) => (
                  <tr key={`${c.theory}-${c.coupling_symbol}`} className="border-t border-paper-edge align-top" data-status={c.status}>
                    <td className="sticky left-0 min-w-[7rem] bg-paper py-1 pr-3">{c.theory_name}</td>
                    <td className="whitespace-nowrap py-1 pr-3 tabular-nums">{limitText(c.old)}</td>
                    <td className="whitespace-nowrap py-1 pr-3 tabular-nums">{limitText(c.new)}</td>
                    <td className="py-1">
                      {changeBadge(c)}
                      {c.ratio !== null && c.status === "changed" && <span className="block text-xs text-ink-soft">new / saved = {num(c.ratio)}</span>}
                      {c.reason && <span className="block text-xs text-ink-soft">{c.reason}</span>}
                    </td>
                  </tr>
                ))}
                {r.limits.length === 0 && (
                  <tr>
                    <td colSpan={4} className="py-1 text-ink-soft">
                      No limits before or after.
                    </td>
                  </tr>
                )}
              </tbody>
            </table>
          </ScrollBox>
        </article>
      ))}
      <div className="flex flex-wrap gap-3">
        <Button kind="primary" onClick={onAccept} busy={busy} data-testid="accept-retranslation">
          Accept the new version{preview.records.length === 1 ? "" : "s"}
        </Button>
        <Button onClick={onDismiss} disabled={busy} data-testid="keep-saved">
          Keep the saved version{preview.records.length === 1 ? "" : "s"}
        </Button>
      </div>
    </section>
  );
}
