import { useMutation } from "@tanstack/react-query";
import { z } from "zod";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

const termInput = z.object({ order: z.number(), coefficient: z.string() });

/** POST /api/v1/expressions/derive: beta from a change of binding energy, flux or frequency drift, or from a dispersion relation. */
export const deriveRequestSchema = z.object({
  energy: termInput.optional(),
  flux: termInput.optional(),
  frequency_drift: termInput.optional(),
  /** A dispersion E^2 = p^2 + A p^alpha_md; the coefficient is A / h^(2 - alpha_md), a power of length. */
  propagation: z.object({ alpha_md: z.number(), coefficient: z.string() }).optional(),
  couplings: z.array(z.object({ symbol: z.string(), dimension: z.number() })),
  definitions: z.array(z.object({ symbol: z.string(), expression: z.string() })),
});
export type DeriveRequest = z.infer<typeof deriveRequestSchema>;

export const deriveResponseSchema = z.object({
  terms: z.array(z.object({ b: z.number(), pn_order: z.number(), beta: z.string(), beta_latex: z.string(), source: z.string().optional() })),
  /** The amplitude correction that comes with an energy/flux or frequency-drift change (its drift piece), with what it leaves out. */
  amplitude: z.array(z.object({ a: z.number(), alpha: z.string(), alpha_latex: z.string(), note: z.string().optional() })).optional(),
  steps: z.array(z.string()),
  /** The engine's cautions about the derivation (leading order, degenerate exponents ...). */
  notes: z.array(z.string()).default([]),
});
export type DeriveResponse = z.infer<typeof deriveResponseSchema>;

export function useDeriveBeta() {
  return useMutation({
    mutationFn: (req: DeriveRequest) => apiRequest(apiPaths.expressionDerive(), deriveResponseSchema, { method: "POST", body: req }),
  });
}
