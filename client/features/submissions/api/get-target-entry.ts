import { queryOptions, useQuery } from "@tanstack/react-query";
import { revisionDetailSchema, theoryDetailSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * The current accepted entry of a theory, in the submission shape, to start a proposed change from.
 * The detail names the current revision; the revision holds the entry document as it was accepted.
 */
export function targetEntryQuery(slug: string) {
  return queryOptions({
    queryKey: ["theories", "detail", slug, "entry"] as const,
    queryFn: async ({ signal }) => {
      const detail = await apiRequest(apiPaths.theory(slug), theoryDetailSchema, { signal });
      const rev = await apiRequest(apiPaths.theoryRevision(slug, detail.revision.number), revisionDetailSchema, { signal });
      return { revision: rev.number, entry: rev.entry };
    },
  });
}

export function useTargetEntry(slug: string | undefined) {
  return useQuery({ ...targetEntryQuery(slug ?? ""), enabled: Boolean(slug) });
}
