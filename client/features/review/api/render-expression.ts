import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * The engine's TeX for a submitted expression, so the reviewer reads it typeset. Uses the public
 * check route; its checks are ignored here because the review judges the checks stored at the save.
 */
const latexOnly = z.object({ latex: z.string().nullable() });

export interface RenderRequest {
  expression: string;
  target: "ppe_phase" | "ppe_amplitude" | "ringdown_frequency" | "ringdown_damping" | "remnant_mass" | "remnant_spin" | "validity";
  couplings: { symbol: string; dimension: number }[];
  definitions: { symbol: string; expression: string }[];
}

export function renderExpressionQuery(req: RenderRequest) {
  return queryOptions({
    queryKey: ["expressions", "latex", req] as const,
    queryFn: ({ signal }) => apiRequest(apiPaths.expressionCheck(), latexOnly, { method: "POST", body: req, signal }),
    staleTime: Infinity,
    retry: false,
  });
}

export function useRenderedExpression(req: RenderRequest) {
  return useQuery(renderExpressionQuery(req));
}
