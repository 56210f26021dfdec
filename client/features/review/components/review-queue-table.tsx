import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { useState } from "react";
import { Link } from "react-router-dom";
import type { SubmissionStatus, SubmissionSummary } from "../../../../common/catalogue.ts";
import { Badge, type Tone } from "../../../components/ui/badge.tsx";
import { CheckBadge } from "../../../components/ui/check-list.tsx";
import { DataTable } from "../../../components/ui/data-table.tsx";
import { paths } from "../../../lib/paths.ts";
import { statusLabel } from "../../../../common/submission-status.ts";

const col = createColumnHelper<SubmissionSummary>();
const day = (iso: string | null) => (iso ? iso.slice(0, 10) : "—");
const statusTone: Partial<Record<SubmissionStatus, Tone>> = { submitted: "info", resubmitted: "caution", in_review: "ok" };

const columns = [
  col.accessor("name", {
    header: "Entry",
    cell: (info) => {
      const s = info.row.original;
      return (
        <div>
          <Link to={paths.review(s.id)} className="font-semibold">
            {s.name}
          </Link>
          <p className="text-xs text-ink-faint font-mono">{s.target_slug ? `change to ${s.target_slug}` : `new entry ${s.slug}`}</p>
        </div>
      );
    },
  }),
  col.accessor((s) => s.author.name, { id: "author", header: "Author" }),
  col.accessor("status", {
    header: "State",
    cell: (info) => <Badge tone={statusTone[info.getValue()] ?? "neutral"}>{statusLabel(info.getValue())}</Badge>,
  }),
  col.accessor("checks_ok", { header: "Checks", cell: (info) => <CheckBadge outcome={info.getValue() ? "ok" : "failed"} /> }),
  col.accessor("version", { header: "Version", cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  col.accessor("submitted_at", { header: "Submitted", cell: (info) => <span className="tabular-nums whitespace-nowrap">{day(info.getValue())}</span> }),
];

export function ReviewQueueTable({ submissions }: { submissions: SubmissionSummary[] }) {
  // Oldest first: whoever waited longest is reviewed next.
  const [sorting, setSorting] = useState<SortingState>([{ id: "submitted_at", desc: false }]);
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: submissions,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (s) => String(s.id),
  });
  return <DataTable table={table} caption="Submissions waiting for an editor" empty="Nothing is waiting for review." rowTestId={(s) => `queue-row-${s.id}`} />;
}
