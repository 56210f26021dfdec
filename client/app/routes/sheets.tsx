import { Link } from "react-router-dom";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";
import { SheetList } from "../../features/sheets/components/sheet-list.tsx";
import { paths } from "../../lib/paths.ts";

/** Your saved sheets (analysts). */
export function Component() {
  return (
    <RequireAuth role="analyst">
      <article className="flex flex-col gap-4">
        <h1 className="text-4xl">Sheets</h1>
        <p className="max-w-3xl text-ink-soft">
          A sheet is a named set of bounds, each with where it came from and its translation into every catalogued coupling, ready to share read-only or to download as a
          LaTeX table, BibTeX, CSV or JSON. Add bounds from the <Link to={paths.translate()}>translate page</Link>.
        </p>
        <SheetList />
      </article>
    </RequireAuth>
  );
}
