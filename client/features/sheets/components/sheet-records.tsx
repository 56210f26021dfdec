import { formatDateTime } from "../../../../common/dates.ts";
import type { Sheet, SheetRecord } from "../../../../common/sheets.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { ConsistencyRecordBody, SamplesRecordBody, StackRecordBody } from "./result-records.tsx";
import { RingdownRecordBody } from "./ringdown-record.tsx";
import { TranslationRecordBody } from "./translation-record.tsx";

export { ValidityBadge } from "./translation-record.tsx";

/** A sheet's records, each as stored when it was saved (owner and shared readers alike). */

function hostOf(link: string): string {
  try {
    return new URL(link).host;
  } catch {
    return link;
  }
}

const KIND_LABEL: Record<SheetRecord["kind"], string> = {
  translation: "translated bound",
  samples_job: "posterior samples",
  stack: "stacked events",
  consistency: "IMR consistency",
  ringdown: "ringdown bound",
};

interface Props {
  sheet: Sheet;
  /** Owner only: remove a record. */
  onRemove?: (record: SheetRecord) => void;
  /** Owner only: preview re-translating a translation or ringdown record against today's catalogue. */
  onRetranslate?: (record: SheetRecord) => void;
  busy?: boolean;
}

export function SheetRecords({ sheet, onRemove, onRetranslate, busy = false }: Props) {
  if (sheet.records.length === 0) return <p className="rounded border border-dashed border-paper-edge p-4 text-ink-soft">No records yet: translate a bound, or run a samples job or a consistency test, and save it to this sheet.</p>;
  return (
    <ol className="flex flex-col gap-6" data-testid="sheet-records">
      {sheet.records.map((r) => (
        <li key={r.id} className="rounded border border-paper-edge bg-white/40 p-4" data-testid={`record-${r.label}`} data-kind={r.kind}>
          <div className="flex flex-wrap items-baseline justify-between gap-3">
            <h3 className="text-lg">
              {r.label}
              {r.detector_network && <span className="ml-2 text-sm font-normal text-ink-soft">{r.detector_network}</span>}
              <Badge tone="info" className="ml-2 align-middle">
                {KIND_LABEL[r.kind]}
              </Badge>
            </h3>
            {onRemove && (
              <Button kind="danger" onClick={() => onRemove(r)} busy={busy}>
                Remove record
              </Button>
            )}
          </div>
          {r.kind === "translation" && <TranslationRecordBody r={r} busy={busy} onRetranslate={onRetranslate ? () => onRetranslate(r) : undefined} />}
          {r.kind === "samples_job" && <SamplesRecordBody r={r} />}
          {r.kind === "stack" && <StackRecordBody r={r} />}
          {r.kind === "consistency" && <ConsistencyRecordBody r={r} />}
          {r.kind === "ringdown" && <RingdownRecordBody r={r} busy={busy} onRetranslate={onRetranslate ? () => onRetranslate(r) : undefined} />}
          {r.data_link && (
            <p className="text-sm">
              data:{" "}
              <a href={r.data_link} rel="noreferrer noopener" target="_blank">
                {hostOf(r.data_link)}
              </a>
            </p>
          )}
          {r.notes && <p className="mt-1 text-sm italic text-ink-soft">{r.notes}</p>}
          {r.kind !== "translation" && r.kind !== "ringdown" && <p className="mt-2 text-xs text-ink-faint">Saved {formatDateTime(r.saved_at)}; kept as computed.</p>}
        </li>
      ))}
    </ol>
  );
}
