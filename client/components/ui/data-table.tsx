import { flexRender, type Table } from "@tanstack/react-table";
import type { ReactNode } from "react";
import { ScrollBox } from "./scroll-box.tsx";

interface Props<Row> {
  table: Table<Row>;
  caption: string;
  /** Shown in place of the body when there are no rows. */
  empty?: ReactNode;
  rowTestId?: (row: Row) => string;
  /** Shown under the first cell on narrow screens only: what must stay in view (a verdict) when the other columns scroll away. */
  pinnedOnSmall?: (row: Row) => ReactNode;
}

// The first column (the theory, the event) stays in view while a wide table scrolls sideways.
const STICKY = "sticky left-0 z-[1] shadow-[1px_0_0_var(--color-paper-edge)]";

const sortLabel = { asc: "ascending", desc: "descending" } as const;

/**
 * Renders any TanStack table (v8 API). Sortable headers are buttons, so the keyboard reaches them,
 * and aria-sort tells screen readers the current order.
 */
export function DataTable<Row>({ table, caption, empty, rowTestId, pinnedOnSmall }: Props<Row>) {
  const rows = table.getRowModel().rows;
  const columns = table.getVisibleLeafColumns().length;
  return (
    <ScrollBox label={caption} className="rounded border border-paper-edge bg-white/40">
      <table className="w-full border-collapse text-[0.95rem]">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep text-left text-sm">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                const canSort = header.column.getCanSort();
                const label = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={sorted ? sortLabel[sorted] : canSort ? "none" : undefined}
                    className={`border-b border-paper-edge px-3 py-2 font-semibold text-ink whitespace-nowrap ${header.index === 0 ? STICKY : ""} ${header.index === 0 ? "bg-paper-deep" : ""}`}
                  >
                    {canSort ? (
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-sea">
                        {label}
                        <span aria-hidden="true" className="text-ink-faint text-xs w-3">
                          {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}
                        </span>
                      </button>
                    ) : (
                      label
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={columns} className="px-3 py-6 text-center text-ink-soft">
                {empty ?? "Nothing to show."}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} data-testid={rowTestId?.(row.original)} className="border-b border-paper-edge/70 last:border-b-0 align-top hover:bg-paper-deep/40">
                {row.getVisibleCells().map((cell, i) => (
                  <td key={cell.id} className={`px-3 py-2 ${i === 0 ? `${STICKY} bg-paper` : ""}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    {i === 0 && pinnedOnSmall && <div className="mt-1 md:hidden">{pinnedOnSmall(row.original)}</div>}
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </ScrollBox>
  );
}
