import { queryOptions, skipToken, useQuery } from "@tanstack/react-query";
import { eventsResponseSchema, type EventsRequest } from "../../../../common/convert-samples.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";
import { convertKeys } from "./convert-bound.ts";

/** Several events are a pure function of the request and the catalogue: a query keyed by the request. */
export const convertEventsKeys = {
  events: (request: EventsRequest | undefined) => [...convertKeys.all, "events", request ?? null] as const,
};

export const convertEventsQuery = (request: EventsRequest | undefined) =>
  queryOptions({
    queryKey: convertEventsKeys.events(request),
    queryFn: request ? ({ signal }) => apiRequest(apiPaths.convertEvents(), eventsResponseSchema, { method: "POST", body: request, signal }) : skipToken,
    staleTime: 60_000,
    retry: false,
  });

export function useConvertEvents(request: EventsRequest | undefined) {
  return useQuery(convertEventsQuery(request));
}
