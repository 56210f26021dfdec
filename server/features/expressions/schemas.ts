import { z } from "zod";

/** Request and response shapes of the expression routes (also the source of the API document). */
const symbolName = z.string().regex(/^[A-Za-z][A-Za-z0-9_]*$/, "must be a name like alpha or chi_s");

export const couplingDeclaration = z.strictObject({
  symbol: symbolName,
  dimension: z.number().finite(),
  /** Where GR lies for this coupling; the GR-limit check sends it there (an upside-down coupling fails). */
  gr_value: z.enum(["zero", "infinity"]).optional(),
  range: z.enum(["positive", "non_negative", "any_sign"]).optional(),
});

/** E^2 = p^2 + A p^alpha_md: the coefficient is A / h^(2 - alpha_md), a power of length with its sign. */
const propagationInput = z.strictObject({
  alpha_md: z.number().finite(),
  coefficient: z.string().min(1).max(2000),
  order: z.number().finite().optional(),
});

export const definitionDeclaration = z.strictObject({
  symbol: symbolName,
  expression: z.string().min(1).max(2000),
});

export const checkRequest = z.strictObject({
  // The length cap lives in the expression guard, so its message names the position; this cap only
  // keeps absurd bodies out of the parser.
  expression: z.string().max(200_000),
  target: z.enum(["ppe_phase", "ppe_amplitude", "ringdown_frequency", "ringdown_damping", "remnant_mass", "remnant_spin", "validity"]),
  b: z.number().finite().optional(),
  a: z.number().finite().optional(),
  pn_order: z.number().finite().optional(),
  couplings: z.array(couplingDeclaration).max(50),
  definitions: z.array(definitionDeclaration).max(50).optional(),
  derivation: z
    .strictObject({
      energy: z.strictObject({ order: z.number().finite(), coefficient: z.string().max(2000) }).optional(),
      flux: z.strictObject({ order: z.number().finite(), coefficient: z.string().max(2000) }).optional(),
      frequency_drift: z.strictObject({ order: z.number().finite(), coefficient: z.string().max(2000) }).optional(),
      propagation: propagationInput.optional(),
    })
    .optional(),
});

export const checkResponse = z.object({
  ok: z.boolean(),
  checks: z.array(
    z.object({
      name: z.enum(["parse", "symbols", "dimension", "gr_limit", "pn_order", "symmetry", "derivation", "propagation", "evaluation"]),
      ok: z.boolean(),
      severity: z.enum(["error", "warning", "inconclusive"]).optional(),
      message: z.string(),
    }),
  ),
  latex: z.string().nullable(),
});

const term = z.strictObject({ order: z.number().finite(), coefficient: z.string().min(1).max(2000) });

export const deriveRequest = z.strictObject({
  energy: term.optional(),
  flux: term.optional(),
  frequency_drift: term.optional(),
  propagation: propagationInput.optional(),
  couplings: z.array(couplingDeclaration).max(50),
  definitions: z.array(definitionDeclaration).max(50).optional(),
  evaluate_at: z.record(symbolName, z.number().finite()).optional(),
});

export const deriveResponse = z.object({
  terms: z.array(
    z.object({ b: z.number(), pn_order: z.number(), beta: z.string(), beta_latex: z.string(), value: z.number().optional(), source: z.enum(["energy_flux", "frequency_drift", "propagation"]) }),
  ),
  amplitude: z.array(z.object({ a: z.number(), alpha: z.string(), alpha_latex: z.string(), value: z.number().optional(), note: z.string().optional() })).optional(),
  steps: z.array(z.string()),
  notes: z.array(z.string()),
});
