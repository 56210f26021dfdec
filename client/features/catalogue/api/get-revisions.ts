import { queryOptions, useQuery } from "@tanstack/react-query";
import { revisionDetailSchema, revisionListResponseSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { theoryKeys } from "./get-theories.ts";

export function revisionsQuery(slug: string) {
  return queryOptions({
    queryKey: theoryKeys.revisions(slug),
    queryFn: ({ signal }) => apiRequest(apiPaths.theoryRevisions(slug), revisionListResponseSchema, { signal }),
  });
}

export function useRevisions(slug: string) {
  return useQuery(revisionsQuery(slug));
}

/** One revision with its diff against the previous one; fetched only when the reader opens it. */
export function revisionQuery(slug: string, n: number) {
  return queryOptions({
    queryKey: theoryKeys.revision(slug, n),
    queryFn: ({ signal }) => apiRequest(apiPaths.theoryRevision(slug, n), revisionDetailSchema, { signal }),
    // A published revision never changes.
    staleTime: Infinity,
  });
}

export function useRevision(slug: string, n: number | undefined) {
  return useQuery({ ...revisionQuery(slug, n ?? 0), enabled: n !== undefined });
}
