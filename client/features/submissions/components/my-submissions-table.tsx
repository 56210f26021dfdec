import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { useState } from "react";
import { Link } from "react-router-dom";
import type { SubmissionSummary } from "../../../../common/catalogue.ts";
import { CheckBadge } from "../../../components/ui/check-list.tsx";
import { DataTable } from "../../../components/ui/data-table.tsx";
import { paths } from "../../../lib/paths.ts";
import { StatusBadge } from "./status-badge.tsx";

const col = createColumnHelper<SubmissionSummary>();
const day = (iso: string | null) => (iso ? iso.slice(0, 10) : "—");

const columns = [
  col.accessor("name", {
    header: "Entry",
    cell: (info) => {
      const s = info.row.original;
      return (
        <div>
          <Link to={paths.editSubmission(s.id)} className="font-semibold">
            {s.name}
          </Link>
          <p className="text-xs text-ink-faint font-mono">
            {s.target_slug ? `change to ${s.target_slug}` : `new: ${s.slug}`} · #{s.id}
          </p>
        </div>
      );
    },
  }),
  col.accessor("status", { header: "Status", cell: (info) => <StatusBadge status={info.getValue()} /> }),
  col.accessor("version", { header: "Version", cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  col.accessor("checks_ok", { header: "Checks", cell: (info) => <CheckBadge outcome={info.getValue() ? "ok" : "failed"} /> }),
  col.accessor("created_at", { header: "Started", cell: (info) => <span className="tabular-nums whitespace-nowrap">{day(info.getValue())}</span> }),
  col.accessor("updated_at", { header: "Last saved", cell: (info) => <span className="tabular-nums whitespace-nowrap">{day(info.getValue())}</span> }),
  col.accessor("submitted_at", { header: "Submitted", sortUndefined: "last", cell: (info) => <span className="tabular-nums whitespace-nowrap">{day(info.getValue())}</span> }),
  col.accessor("decided_at", {
    header: "Decided",
    cell: (info) => {
      const s = info.row.original;
      return (
        <span className="tabular-nums whitespace-nowrap">
          {day(info.getValue())}
          {s.revision !== null && (
            <Link to={paths.theory(s.slug)} className="ml-2 text-sm">
              revision {s.revision}
            </Link>
          )}
        </span>
      );
    },
  }),
];

export function MySubmissionsTable({ submissions }: { submissions: SubmissionSummary[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "updated_at", desc: true }]);
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
  return <DataTable table={table} caption="Your submissions" empty="You have not started a submission yet." rowTestId={(s) => `submission-row-${s.id}`} />;
}
