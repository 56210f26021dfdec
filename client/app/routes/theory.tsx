import type { QueryClient } from "@tanstack/react-query";
import { Link, useParams, type LoaderFunctionArgs } from "react-router-dom";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { theoryQuery, useTheory } from "../../features/catalogue/api/get-theory.ts";
import { RetirementPanel } from "../../features/catalogue/components/retirement.tsx";
import { TheoryView } from "../../features/catalogue/components/theory-view.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { ApiError } from "../../lib/api-client.ts";
import { paths } from "../../lib/paths.ts";

export function loader(queryClient: QueryClient) {
  return ({ params }: LoaderFunctionArgs) => {
    if (params.slug) void queryClient.prefetchQuery(theoryQuery(params.slug));
    return null;
  };
}

export function Component() {
  const { slug = "" } = useParams();
  const theory = useTheory(slug);
  const { hasRole } = useAuth();
  if (theory.isPending) return <Loading what="the entry" />;
  if (theory.isError) {
    if (theory.error instanceof ApiError && theory.error.status === 404) {
      return (
        <div>
          <h1 className="text-2xl mb-2">No entry called “{slug}”</h1>
          <p className="text-ink-soft mb-4">It may not have been accepted yet, or the address is mistyped.</p>
          <Link to={paths.catalogue()}>Back to the catalogue</Link>
        </div>
      );
    }
    return <ErrorNote error={theory.error} retry={() => void theory.refetch()} />;
  }
  return (
    <TheoryView
      theory={theory.data}
      editorTools={hasRole(["editor"]) ? <RetirementPanel theory={theory.data} /> : undefined}
      proposeChange={
        hasRole(["contributor", "editor"]) ? (
          <Link to={paths.submit({ target: theory.data.slug })} className="rounded border border-sea/50 px-3 py-1.5 text-sm font-semibold no-underline hover:bg-sea-wash">
            Propose a change
          </Link>
        ) : undefined
      }
    />
  );
}
