/** One changed path of a structured diff between two entry documents. */
export interface DiffChange {
  path: string;
  kind: "added" | "removed" | "changed";
  before?: unknown;
  after?: unknown;
}

function show(value: unknown): string {
  if (value === undefined) return "—";
  if (typeof value === "string") return value;
  return JSON.stringify(value, null, 1);
}

const kindStyle = {
  added: { label: "added", cls: "text-moss", mark: "+" },
  removed: { label: "removed", cls: "text-brick", mark: "−" },
  changed: { label: "changed", cls: "text-amber", mark: "~" },
} as const;

/** A readable list of what changed: one row per path, old value struck through beside the new one. */
export function DiffView({ changes, testId }: { changes: readonly DiffChange[]; testId?: string }) {
  if (changes.length === 0) return <p className="text-sm text-ink-faint">No differences.</p>;
  return (
    <table className="w-full table-fixed border-collapse text-sm" data-testid={testId}>
      <colgroup>
        <col className="w-1/5" />
        <col className="w-2/5" />
        <col className="w-2/5" />
      </colgroup>
      <thead className="text-left text-ink-soft">
        <tr>
          <th scope="col" className="py-1 pr-3 font-semibold">
            Field
          </th>
          <th scope="col" className="py-1 pr-3 font-semibold">
            Before
          </th>
          <th scope="col" className="py-1 font-semibold">
            After
          </th>
        </tr>
      </thead>
      <tbody>
        {changes.map((c) => {
          const k = kindStyle[c.kind];
          return (
            <tr key={`${c.kind}:${c.path}`} className="border-t border-paper-edge align-top">
              <td className="py-1 pr-3 font-mono text-xs break-all">
                <span className={`${k.cls} mr-1`} aria-label={k.label}>
                  {k.mark}
                </span>
                {c.path}
              </td>
              <td className="py-1 pr-3">
                {c.kind !== "added" && <pre className="whitespace-pre-wrap break-words font-mono text-xs text-brick/90 line-through decoration-brick/40">{show(c.before)}</pre>}
              </td>
              <td className="py-1">{c.kind !== "removed" && <pre className="whitespace-pre-wrap break-words font-mono text-xs text-moss">{show(c.after)}</pre>}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

interface DiffPath {
  path: string;
  before?: unknown;
  after?: unknown;
}

/** Flattens the API's { added, removed, changed } diff into rows, ordered by path. */
export function changesFromDiff(diff: { added: readonly DiffPath[]; removed: readonly DiffPath[]; changed: readonly DiffPath[] }): DiffChange[] {
  const rows: DiffChange[] = [
    ...diff.added.map((d) => ({ ...d, kind: "added" as const })),
    ...diff.removed.map((d) => ({ ...d, kind: "removed" as const })),
    ...diff.changed.map((d) => ({ ...d, kind: "changed" as const })),
  ];
  return rows.sort((a, b) => a.path.localeCompare(b.path, "en", { numeric: true }));
}
