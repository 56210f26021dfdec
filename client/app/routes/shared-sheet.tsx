import { useParams } from "react-router-dom";
import { useSharedSheet } from "../../features/sheets/api/get-shared-sheet.ts";
import { ExportLinks } from "../../features/sheets/components/export-links.tsx";
import { SheetRecords } from "../../features/sheets/components/sheet-records.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { apiPaths } from "../../lib/paths.ts";
import { formatDateTime } from "../../../common/dates.ts";

/** A sheet opened through its share link: read-only, no sign-in needed. */
export function Component() {
  const { token = "" } = useParams();
  const query = useSharedSheet(token);
  if (query.isPending) return <Loading what="the shared sheet" />;
  if (query.isError) return <ErrorNote error={query.error} title="This share link does not open a sheet." />;
  const sheet = query.data;
  return (
    <article className="flex flex-col gap-6" data-testid="shared-sheet">
      <header className="flex flex-col gap-1">
        <p className="text-sm uppercase tracking-wide text-ink-faint">Shared sheet · read-only</p>
        <h1 className="text-3xl" data-page-title={`Shared sheet: ${sheet.name}`}>
          {sheet.name}
        </h1>
        <p className="text-sm text-ink-faint">
          by {sheet.owner.name} · version {sheet.version} · updated {formatDateTime(sheet.updated_at)}
        </p>
        {sheet.description && <p className="max-w-3xl text-ink-soft">{sheet.description}</p>}
      </header>
      <ExportLinks hrefFor={(f) => apiPaths.sharedSheetExport(token, f)} />
      <SheetRecords sheet={sheet} />
    </article>
  );
}
