import type { SourceStatus } from "../../../../common/catalogue.ts";
import { Badge, type Tone } from "../../../components/ui/badge.tsx";

/**
 * The three statuses of a formula, each with a word, a mark and a tone: the word and the mark carry
 * the meaning, the tone only repeats it (never colour alone).
 */
export const SOURCE_STATUS: Record<SourceStatus, { label: string; mark: string; tone: Tone; text: string; title: string }> = {
  confirmed: { label: "confirmed", mark: "✓", tone: "ok", text: "text-moss", title: "Read in the cited paper." },
  derived: {
    label: "derived",
    mark: "∴",
    tone: "info",
    text: "text-sea",
    title: "Re-derived from the stated assumptions; the engine re-derives it on every save where a derivation is stated.",
  },
  memory: {
    label: "from memory",
    mark: "?",
    tone: "caution",
    text: "text-amber",
    title: "Recalled rather than read in its paper: source to be confirmed by an editor before relying on it.",
  },
};

export const SOURCE_STATUS_ORDER: readonly SourceStatus[] = ["confirmed", "derived", "memory"];

/** One formula's status as a badge; "from memory" also says "source to be confirmed". */
export function SourceStatusBadge({ status }: { status: SourceStatus }) {
  const s = SOURCE_STATUS[status];
  return (
    <Badge tone={s.tone} title={s.title}>
      <span aria-hidden="true">{s.mark}</span>
      {status === "memory" ? "from memory · source to be confirmed" : s.label}
    </Badge>
  );
}

/** One formula's status as a short inline tag (mark and word), for dense lists. */
export function SourceStatusTag({ status }: { status: SourceStatus }) {
  const s = SOURCE_STATUS[status];
  return (
    <span className={`whitespace-nowrap text-xs font-semibold ${s.text}`} title={s.title}>
      <span aria-hidden="true">{s.mark}</span> {s.label}
    </span>
  );
}

/** How many of an entry's formulas have each status, as one line: "✓ 1 confirmed · ∴ 2 derived". */
export function SourceStatusTally({ statuses, className = "" }: { statuses: readonly SourceStatus[]; className?: string }) {
  const counts = SOURCE_STATUS_ORDER.map((s) => [s, statuses.filter((x) => x === s).length] as const).filter(([, n]) => n > 0);
  if (counts.length === 0) return null;
  return (
    <p className={`flex flex-wrap items-baseline gap-x-2 gap-y-0.5 text-xs ${className}`} data-testid="formula-status">
      <span className="text-ink-soft">Formulas:</span>
      {counts.map(([s, n], i) => (
        <span key={s} className={`whitespace-nowrap font-semibold ${SOURCE_STATUS[s].text}`} title={SOURCE_STATUS[s].title}>
          <span aria-hidden="true">{SOURCE_STATUS[s].mark}</span> {n} {SOURCE_STATUS[s].label}
          {i < counts.length - 1 && <span aria-hidden="true" className="ml-2 font-normal text-ink-faint">·</span>}
        </span>
      ))}
    </p>
  );
}

/** What the three statuses mean, once above a list that uses them. */
export function SourceStatusLegend() {
  return (
    <p className="flex flex-wrap items-baseline gap-x-4 gap-y-1 text-sm text-ink-soft" data-testid="formula-status-legend">
      <span>Formula status:</span>
      {SOURCE_STATUS_ORDER.map((s) => (
        <span key={s}>
          <span className={`font-semibold ${SOURCE_STATUS[s].text}`}>
            <span aria-hidden="true">{SOURCE_STATUS[s].mark}</span> {SOURCE_STATUS[s].label}
          </span>{" "}
          {s === "confirmed" ? "read in the cited paper" : s === "derived" ? "re-derived here, checked by the engine" : "recalled: source to be confirmed"}
        </span>
      ))}
    </p>
  );
}
