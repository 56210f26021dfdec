import { queryOptions, useQuery } from "@tanstack/react-query";
import { theoryDetailSchema } from "../../../../common/catalogue.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { theoryKeys } from "./get-theories.ts";

export function theoryQuery(slug: string) {
  return queryOptions({
    queryKey: theoryKeys.detail(slug),
    queryFn: ({ signal }) => apiRequest(apiPaths.theory(slug), theoryDetailSchema, { signal }),
  });
}

export function useTheory(slug: string) {
  return useQuery(theoryQuery(slug));
}
