import type { QueryClient } from "@tanstack/react-query";
import { useMemo } from "react";
import { Link } from "react-router-dom";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { useTheories, theoriesQuery } from "../../features/catalogue/api/get-theories.ts";
import { CatalogueFilters } from "../../features/catalogue/components/catalogue-filters.tsx";
import { SourceStatusLegend } from "../../features/catalogue/components/source-status.tsx";
import { TheoryTable } from "../../features/catalogue/components/theory-table.tsx";
import { useCatalogueFilters } from "../../features/catalogue/components/use-catalogue-filters.ts";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { paths } from "../../lib/paths.ts";

/** Starts the unfiltered list before the page renders; the page shows its own loading and error states. */
export function loader(queryClient: QueryClient) {
  return () => {
    void queryClient.prefetchQuery(theoriesQuery({}));
    return null;
  };
}

function distinct(values: (number | null)[]): number[] {
  return [...new Set(values.filter((v): v is number => v !== null))].sort((a, b) => a - b);
}

export function Component() {
  const { hasRole } = useAuth();
  const { filters, rawText, update } = useCatalogueFilters();
  const all = useTheories({});
  const shown = useTheories(filters);
  const options = useMemo(() => {
    const mappings = (all.data?.theories ?? []).flatMap((t) => t.mappings);
    return { b: distinct(mappings.map((m) => m.b)), pn: distinct(mappings.map((m) => m.pn_order)) };
  }, [all.data]);

  return (
    <div>
      <div className="flex flex-wrap items-baseline justify-between gap-4 mb-2">
        <h1 className="text-3xl">Catalogue</h1>
        {hasRole(["contributor", "editor"]) && (
          <Link to={paths.submit()} className="text-sm">
            Propose a new entry
          </Link>
        )}
      </div>
      <p className="mb-6 max-w-prose text-ink-soft">
        Reviewed mappings from theories of gravity onto ppE deviation parameters. Each entry is a numbered revision accepted by an editor;
        open one for its couplings, conventions, validity conditions and sources.
      </p>
      <CatalogueFilters filters={filters} rawText={rawText} bValues={options.b} pnValues={options.pn} onChange={update} />
      <div className="mt-5" aria-live="polite" aria-busy={shown.isFetching}>
        {shown.isPending ? (
          <Loading what="the catalogue" />
        ) : shown.isError ? (
          <ErrorNote error={shown.error} retry={() => void shown.refetch()} />
        ) : (
          <>
            <div className="mb-2 flex flex-wrap items-baseline justify-between gap-x-6 gap-y-1">
              <p className="text-sm text-ink-soft tabular-nums" data-testid="theory-count">
                {shown.data.theories.length} of {all.data?.theories.length ?? shown.data.theories.length} entries
                {shown.isFetching && " · updating…"}
              </p>
              <SourceStatusLegend />
            </div>
            <TheoryTable theories={shown.data.theories} />
          </>
        )}
      </div>
    </div>
  );
}
