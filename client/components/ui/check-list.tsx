import { conditionText } from "../../../common/symbol-text.ts";
import { Badge, type Tone } from "./badge.tsx";

/** The engine's verdict on one expression, as the API reports it. */
export interface CheckResult {
  name: string;
  ok: boolean;
  severity?: string | undefined;
  message: string;
}

export type CheckOutcome = "ok" | "warning" | "inconclusive" | "failed";

/**
 * A warning is a warning whether or not the check passed (the engine marks passed-but-read-this checks
 * with severity "warning"); "inconclusive" is a check stopped by its time limit, neither passed nor
 * failed; otherwise a check that did not pass is a failure.
 */
export function checkOutcome(check: CheckResult): CheckOutcome {
  const s = check.severity?.toLowerCase();
  if (s === "inconclusive") return "inconclusive";
  if (s === "warning") return "warning";
  if (check.ok) return "ok";
  return s === "info" ? "warning" : "failed";
}

const RANK: Record<CheckOutcome, number> = { ok: 0, warning: 1, inconclusive: 2, failed: 3 };

/** The worst outcome of a set: what a single badge beside an expression should say. */
export function worstOutcome(checks: readonly CheckResult[]): CheckOutcome {
  let worst: CheckOutcome = "ok";
  for (const c of checks) {
    const o = checkOutcome(c);
    if (RANK[o] > RANK[worst]) worst = o;
  }
  return worst;
}

const outcomeTone: Record<CheckOutcome, Tone> = { ok: "ok", warning: "caution", inconclusive: "info", failed: "fail" };
const outcomeMark: Record<CheckOutcome, string> = { ok: "✓", warning: "!", inconclusive: "?", failed: "✗" };

export function CheckBadge({ outcome, title }: { outcome: CheckOutcome; title?: string }) {
  return (
    <Badge tone={outcomeTone[outcome]} title={title}>
      <span aria-hidden="true">{outcomeMark[outcome]}</span>
      {outcome}
    </Badge>
  );
}

/** Humanises engine check names like "gr_limit" → "GR limit" for the list. */
export function checkLabel(name: string): string {
  const words = name.replace(/[_-]+/g, " ").trim();
  const spaced = words.replace(/\bgr\b/gi, "GR").replace(/\bpn\b/gi, "PN");
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

interface ListProps {
  checks: readonly CheckResult[];
  /** Hide passing checks (for compact summaries); failures and warnings always show. */
  onlyProblems?: boolean;
  testId?: string;
}

export function CheckList({ checks, onlyProblems = false, testId }: ListProps) {
  const shown = onlyProblems ? checks.filter((c) => checkOutcome(c) !== "ok") : checks;
  if (checks.length === 0) return <p className="text-sm text-ink-faint">No checks have run yet.</p>;
  if (shown.length === 0) return <p className="text-sm text-moss">All {checks.length} checks passed.</p>;
  return (
    <ul className="flex flex-col gap-1 text-sm" data-testid={testId}>
      {shown.map((c, i) => {
        const outcome = checkOutcome(c);
        return (
          <li key={`${c.name}-${i}`} className="flex items-baseline gap-2" data-check={c.name} data-outcome={outcome}>
            <CheckBadge outcome={outcome} />
            <span className="font-semibold">{checkLabel(c.name)}</span>
            <span className="text-ink-soft">{conditionText(c.message)}</span>
          </li>
        );
      })}
    </ul>
  );
}
