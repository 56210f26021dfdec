import type { ChecksReport } from "../../../../common/catalogue.ts";
import { CheckBadge, CheckList } from "../../../components/ui/check-list.tsx";

/** What the server's checks said at the last save, grouped by the part of the entry they concern. */
export function SavedChecks({ checks }: { checks: ChecksReport }) {
  const problems = checks.results.filter((r) => !r.ok);
  const byPath = new Map<string, typeof problems>();
  for (const p of problems) byPath.set(p.path, [...(byPath.get(p.path) ?? []), p]);
  return (
    <div className="rounded border border-paper-edge bg-white/40 p-3" data-testid="saved-checks">
      <p className="flex flex-wrap items-center gap-3 text-sm">
        <CheckBadge outcome={checks.failures > 0 ? "failed" : checks.warnings > 0 ? "warning" : "ok"} />
        <span className="tabular-nums">
          {checks.results.length} checks at the last save: {checks.failures} failed, {checks.warnings} warnings
        </span>
      </p>
      {[...byPath.entries()].map(([path, list]) => (
        <div key={path} className="mt-2">
          <p className="font-mono text-xs text-ink-soft">{path}</p>
          <CheckList checks={list} />
        </div>
      ))}
      {checks.failures > 0 && <p className="mt-2 text-sm text-ink-soft">A draft may be saved with failing checks, but an editor cannot accept it until they pass.</p>}
    </div>
  );
}
