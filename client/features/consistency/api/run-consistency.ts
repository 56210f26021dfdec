import { queryOptions, skipToken, useQuery } from "@tanstack/react-query";
import {
  consistencyResultSchema,
  couplingExclusionResponseSchema,
  type ConsistencyRequest,
  type CouplingExclusionRequest,
} from "../../../../common/consistency.ts";
import { ringdownConvertResponseSchema, type RingdownConvertRequest } from "../../../../common/ringdown.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * The consistency test, the coupling-exclusion forecast and ringdown translations are pure functions
 * of their requests and the catalogue: queries keyed by the request, skipped until a form is submitted.
 */
export const consistencyKeys = {
  all: ["consistency"] as const,
  gaussian: (r: ConsistencyRequest | undefined) => [...consistencyKeys.all, "gaussian", r ?? null] as const,
  coupling: (r: CouplingExclusionRequest | undefined) => [...consistencyKeys.all, "coupling", r ?? null] as const,
  ringdown: (r: RingdownConvertRequest | undefined) => [...consistencyKeys.all, "ringdown", r ?? null] as const,
};

export const consistencyQuery = (request: ConsistencyRequest | undefined) =>
  queryOptions({
    queryKey: consistencyKeys.gaussian(request),
    queryFn: request ? ({ signal }) => apiRequest(apiPaths.consistency(), consistencyResultSchema, { method: "POST", body: request, signal }) : skipToken,
    staleTime: 60_000,
    retry: false,
  });

export const couplingExclusionQuery = (request: CouplingExclusionRequest | undefined) =>
  queryOptions({
    queryKey: consistencyKeys.coupling(request),
    queryFn: request ? ({ signal }) => apiRequest(apiPaths.consistencyCoupling(), couplingExclusionResponseSchema, { method: "POST", body: request, signal }) : skipToken,
    staleTime: 60_000,
    retry: false,
  });

export const ringdownConvertQuery = (request: RingdownConvertRequest | undefined) =>
  queryOptions({
    queryKey: consistencyKeys.ringdown(request),
    queryFn: request ? ({ signal }) => apiRequest(apiPaths.convert(), ringdownConvertResponseSchema, { method: "POST", body: request, signal }) : skipToken,
    staleTime: 60_000,
    retry: false,
  });

export const useConsistency = (r: ConsistencyRequest | undefined) => useQuery(consistencyQuery(r));
export const useCouplingExclusion = (r: CouplingExclusionRequest | undefined) => useQuery(couplingExclusionQuery(r));
export const useRingdownConvert = (r: RingdownConvertRequest | undefined) => useQuery(ringdownConvertQuery(r));
