import { queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/** POST /api/v1/expressions/check: the engine's verdict on one expression in its context. */
export const expressionCheckRequestSchema = z.object({
  expression: z.string(),
  target: z.string(),
  b: z.number().optional(),
  a: z.number().optional(),
  pn_order: z.number().optional(),
  couplings: z.array(z.object({ symbol: z.string(), dimension: z.number(), gr_value: z.enum(["zero", "infinity"]).optional() })),
  definitions: z.array(z.object({ symbol: z.string(), expression: z.string() })),
  /** The mapping's stated change of energy/flux/drift, so the engine re-derives beta and compares. */
  derivation: z
    .object({
      energy: z.object({ order: z.number(), coefficient: z.string() }).optional(),
      flux: z.object({ order: z.number(), coefficient: z.string() }).optional(),
      frequency_drift: z.object({ order: z.number(), coefficient: z.string() }).optional(),
      /** A dispersion E^2 = p^2 + A p^alpha_md the signal propagates with (A as a power of length). */
      propagation: z.object({ alpha_md: z.number(), coefficient: z.string(), order: z.number().optional() }).optional(),
    })
    .optional(),
});
export type ExpressionCheckRequest = z.infer<typeof expressionCheckRequestSchema>;

export const expressionCheckResponseSchema = z.object({
  ok: z.boolean(),
  checks: z.array(z.object({ name: z.string(), ok: z.boolean(), severity: z.string().optional(), message: z.string() })),
  /** Null when the expression does not parse (the "parse" check says why). */
  latex: z.string().nullable(),
});
export type ExpressionCheckResponse = z.infer<typeof expressionCheckResponseSchema>;

export function expressionCheckQuery(req: ExpressionCheckRequest) {
  return queryOptions({
    // The whole request is the key: the same expression in the same context is checked once.
    queryKey: ["expressions", "check", req] as const,
    queryFn: ({ signal }) => apiRequest(apiPaths.expressionCheck(), expressionCheckResponseSchema, { method: "POST", body: req, signal }),
    staleTime: 5 * 60_000,
    retry: false,
    placeholderData: (previous) => previous,
  });
}

export function useExpressionCheck(req: ExpressionCheckRequest | undefined) {
  return useQuery({ ...expressionCheckQuery(req ?? emptyRequest), enabled: req !== undefined });
}

const emptyRequest: ExpressionCheckRequest = { expression: "", target: "", couplings: [], definitions: [] };
