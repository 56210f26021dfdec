import { useState } from "react";
import { useNavigate } from "react-router-dom";
import type { Sheet, SheetRecord } from "../../../../common/sheets.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, TextArea, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { apiPaths, paths } from "../../../lib/paths.ts";
import { useDeleteSheet } from "../api/delete-sheet.ts";
import { useSheet } from "../api/get-sheet.ts";
import { useUpdateSheet } from "../api/update-sheet.ts";
import { useRemoveRecord } from "../api/remove-record.ts";
import { useAcceptRetranslation, useRetranslationPreview } from "../api/retranslation.ts";
import { RetranslationReview } from "./retranslation-review.tsx";
import { ExportLinks } from "./export-links.tsx";
import { SharePanel } from "./share-panel.tsx";
import { SheetRecords } from "./sheet-records.tsx";
import { formatDateTime } from "../../../../common/dates.ts";

function Details({ sheet }: { sheet: Sheet }) {
  const update = useUpdateSheet(sheet.id);
  const [name, setName] = useState(sheet.name);
  const [description, setDescription] = useState(sheet.description);
  const fields = update.error instanceof ApiError ? update.error.fields : {};
  const conflict = update.error instanceof ApiError && update.error.status === 409 ? update.error : undefined;
  return (
    <form
      className="grid gap-3 sm:grid-cols-[1fr_2fr_auto] sm:items-end"
      onSubmit={(e) => {
        e.preventDefault();
        update.mutate({ version: sheet.version, name, description });
      }}
    >
      <Field label="Name" error={fields.name}>
        {(c) => <TextInput {...c} value={name} onChange={(e) => setName(e.target.value)} />}
      </Field>
      <Field label="Description" error={fields.description}>
        {(c) => <TextArea {...c} rows={2} value={description} onChange={(e) => setDescription(e.target.value)} className="font-serif" />}
      </Field>
      <Button type="submit" busy={update.isPending}>
        Save
      </Button>
      {conflict && (
        <p role="alert" className="text-sm text-brick sm:col-span-3">
          {conflict.message} The sheet below has been reloaded.
        </p>
      )}
    </form>
  );
}

/** The owner's view of one sheet: details, records with their translations, share link, downloads. */
export function SheetManager({ id }: { id: number }) {
  const query = useSheet(id);
  const removeOne = useRemoveRecord(id);
  const preview = useRetranslationPreview(id);
  const accept = useAcceptRetranslation(id);
  const remove = useDeleteSheet();
  const navigate = useNavigate();
  if (query.isPending) return <Loading what="the sheet" />;
  if (query.isError) return <ErrorNote error={query.error} retry={() => void query.refetch()} />;
  const sheet = query.data;

  const removeRecord = (record: SheetRecord) => {
    preview.reset();
    removeOne.mutate({ record: record.id, version: sheet.version });
  };
  const retranslate = (ids: number[] | undefined) => {
    accept.reset();
    preview.mutate(ids);
  };
  const translations = sheet.records.filter((r) => r.kind === "translation" || r.kind === "ringdown");
  const stale = translations.filter((r) => (r.kind === "translation" || r.kind === "ringdown") && r.stale !== null).length;
  const writeError = removeOne.error ?? accept.error;

  return (
    <div className="flex flex-col gap-8" data-testid="sheet-page">
      <header className="flex flex-col gap-1">
        <h1 className="text-3xl">{sheet.name}</h1>
        <p className="text-sm text-ink-faint">
          Version {sheet.version} · {sheet.records.length} record{sheet.records.length === 1 ? "" : "s"} · updated {formatDateTime(sheet.updated_at)}
        </p>
        {sheet.description && <p className="max-w-3xl text-ink-soft">{sheet.description}</p>}
      </header>
      <Details key={sheet.version} sheet={sheet} />
      <section aria-labelledby="downloads-title" className="flex flex-col gap-2">
        <h2 id="downloads-title" className="text-xl">
          Download
        </h2>
        <ExportLinks hrefFor={(f) => apiPaths.sheetExport(sheet.id, f)} />
      </section>
      <SharePanel sheet={sheet} />
      <section aria-labelledby="records-title" className="flex flex-col gap-3">
        <h2 id="records-title" className="text-xl">
          Records
        </h2>
        {translations.length > 0 && (
          <div className="flex flex-wrap items-baseline gap-3">
            <p className="text-sm text-ink-soft" data-testid="stale-summary">
              {stale > 0
                ? `${stale} of ${translations.length} translation${translations.length === 1 ? "" : "s"} were made against entries that have changed since.`
                : "Each translation is kept exactly as it was made; re-translating is your call."}
            </p>
            <Button onClick={() => retranslate(undefined)} busy={preview.isPending} data-testid="retranslate-all">
              Re-translate all…
            </Button>
          </div>
        )}
        {writeError && <ErrorNote error={writeError} title={writeError instanceof ApiError && writeError.status === 409 ? "The sheet or the catalogue moved on; it has been reloaded." : "The change was not saved."} />}
        {preview.error && <ErrorNote error={preview.error} title="The re-translation could not be previewed." />}
        {preview.data && (
          <RetranslationReview
            preview={preview.data}
            busy={accept.isPending}
            onDismiss={() => preview.reset()}
            onAccept={() =>
              accept.mutate(
                { version: sheet.version, catalogue_revision: preview.data.catalogue_revision, records: preview.data.records.map((r) => r.id) },
                { onSuccess: () => preview.reset() },
              )
            }
          />
        )}
        <SheetRecords sheet={sheet} onRemove={removeRecord} onRetranslate={(r) => retranslate([r.id])} busy={removeOne.isPending || preview.isPending || accept.isPending} />
      </section>
      <div>
        <Button
          kind="danger"
          busy={remove.isPending}
          onClick={() => {
            if (window.confirm(`Delete the sheet "${sheet.name}" and its ${sheet.records.length} records?`)) {
              remove.mutate({ id: sheet.id, version: sheet.version }, { onSuccess: () => void navigate(paths.sheets()) });
            }
          }}
        >
          Delete this sheet
        </Button>
        {remove.error && <ErrorNote error={remove.error} title="The sheet was not deleted." />}
      </div>
    </div>
  );
}
