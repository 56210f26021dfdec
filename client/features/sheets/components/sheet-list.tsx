import { useState } from "react";
import { Link, useNavigate } from "react-router-dom";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { Field, TextInput } from "../../../components/ui/field.tsx";
import { Empty, ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { paths } from "../../../lib/paths.ts";
import { useCreateSheet } from "../api/create-sheet.ts";
import { useSheets } from "../api/get-sheets.ts";
import { formatDate } from "../../../../common/dates.ts";

/** Your sheets, newest first, and a way to start an empty one. */
export function SheetList() {
  const list = useSheets();
  const create = useCreateSheet();
  const navigate = useNavigate();
  const [name, setName] = useState("");
  const nameError = create.error instanceof ApiError ? create.error.fields.name : undefined;
  return (
    <div className="flex flex-col gap-6">
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          create.mutate({ name, description: "", records: [] }, { onSuccess: (sheet) => void navigate(paths.sheet(sheet.id)) });
        }}
      >
        <Field label="New sheet" error={nameError} className="min-w-[18rem]">
          {(c) => <TextInput {...c} value={name} placeholder="e.g. first-season -1PN bounds" onChange={(e) => setName(e.target.value)} />}
        </Field>
        <Button type="submit" kind="primary" busy={create.isPending}>
          Create
        </Button>
      </form>
      {list.isPending ? (
        <Loading what="your sheets" />
      ) : list.isError ? (
        <ErrorNote error={list.error} retry={() => void list.refetch()} />
      ) : list.data.sheets.length === 0 ? (
        <Empty>No sheets yet. Translate a bound and save it, or create an empty sheet above.</Empty>
      ) : (
        <ul className="flex flex-col divide-y divide-paper-edge rounded border border-paper-edge bg-white/40" data-testid="sheet-list">
          {list.data.sheets.map((s) => (
            <li key={s.id} className="flex flex-wrap items-baseline justify-between gap-3 px-4 py-3">
              <div>
                <Link to={paths.sheet(s.id)} className="font-semibold">
                  {s.name}
                </Link>
                {s.description && <p className="text-sm text-ink-soft">{s.description}</p>}
              </div>
              <span className="flex items-baseline gap-3 text-sm text-ink-faint">
                {s.shared && <Badge tone="info">shared</Badge>}
                {s.record_count} record{s.record_count === 1 ? "" : "s"} · v{s.version} · {formatDate(s.updated_at)}
              </span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
