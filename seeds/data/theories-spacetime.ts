/**
 * Catalogue entries that deform the spacetime or its geometry at 2PN (b = -1): noncommutative
 * spacetime and the Johannsen parameterized black-hole metric.
 */
import { REFS } from "./references.ts";
import type { MappingEntry, TheoryEntry } from "./theory-entry.ts";

export const noncommutative: TheoryEntry = {
  slug: "noncommutative",
  name: "Noncommutative spacetime",
  family: "noncommutative geometry",
  summary:
    "Coordinates that do not commute, [x^μ, x^ν] = i θ^μν, modify the binary's dynamics at 2PN through the dimensionless Λ² = θ⁰ⁱ θ₀ᵢ/(l_P t_P)² [memory].",
  assumptions: ["Λ² v⁴ ≪ 1 over the band", "leading PN order"],
  couplings: [
    {
      symbol: "Lambda2",
      latex: "\\Lambda^2",
      dimension: "1",
      unit: "1",
      description: "noncommutativity scale in Planck units",
      quoted: { form: "identity", symbol: "Lambda2", latex: "\\Lambda^2", unit: "1" },
      range: "non_negative",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 2,
      b: -1,
      expression: "-(75/256)*eta^(-4/5)*(2*eta - 1)*Lambda2",
      latex: "\\beta = -\\frac{75}{256}\\,\\eta^{-4/5}(2\\eta - 1)\\,\\Lambda^2",
      validity: [
        {
          expression: "Lambda2/36",
          max: 0.1,
          label: "Λ² v⁴ ≪ 1 at the ISCO (v² = 1/6)",
          kind: "rule_of_thumb",
          reference: "project choice: 0.1 stands for 'much less than 1'",
        },
      ],
      caution:
        "The correction depends on the orientation of the noncommutativity tensor relative to the orbit (Jenks, Yagi & Alexander 2020); this mapping takes the orientation-averaged form, so a limit for a specific orientation can differ.",
      source_status: "memory",
      references: [REFS.kobakhidzeLaggerManning2016.key, REFS.jenksYagiAlexander2020.key],
      notes: "2η - 1 < 0 for every binary, so β > 0.",
    },
  ],
  references: [REFS.kobakhidzeLaggerManning2016, REFS.jenksYagiAlexander2020],
  reference_bounds: [
    {
      coupling: "Lambda2",
      quoted_symbol: "Lambda2",
      value: 3.5 ** 4,
      unit: "1",
      side: "upper",
      reference: REFS.kobakhidzeLaggerManning2016.key,
      source_status: "confirmed",
      note: "GW150914: √Λ < 3.5 (abstract), i.e. Λ² < 3.5⁴ = 150. No credibility: the abstract writes the bound as √Λ of order 3.5 or less and states no credible level.",
    },
  ],
  needs_source_confirmation: true,
};

const johannsenShape = "(75/64)*(eps3 - 2*alpha13)*eta^(-4/5)";

export const johannsen: TheoryEntry = {
  slug: "johannsen",
  name: "Johannsen parameterized black-hole spacetime (static, leading order)",
  family: "parameterized black hole",
  summary:
    "A regular, Kerr-like metric with free deformation functions. At leading order for a non-spinning binary the deviations ε₃ and α₁₃ shift the orbital dynamics at 2PN.",
  metric_latex:
    "g_{tt} = -\\frac{\\tilde\\Sigma\\,[\\Delta - a^2 A_2(r)^2 \\sin^2\\theta]}{[(r^2 + a^2) A_1(r) - a^2 A_2(r) \\sin^2\\theta]^2},\\quad A_1 = 1 + \\sum_n \\alpha_{1n} (M/r)^n,\\ f(r) = \\sum_n \\epsilon_n M^n / r^{n-2}",
  assumptions: [
    "test-body estimate: the deformation of the heavier hole's metric drives the orbit",
    "static (non-spinning) limit, leading order in the deformation",
    "one deformation parameter varied at a time, the other held at 0",
    "metric functions as written are from memory",
  ],
  couplings: [
    {
      symbol: "alpha13",
      latex: "\\alpha_{13}",
      dimension: "1",
      unit: "1",
      quoted: { form: "identity", symbol: "alpha13", latex: "|\\alpha_{13}|", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
    {
      symbol: "eps3",
      latex: "\\epsilon_3",
      dimension: "1",
      unit: "1",
      quoted: { form: "identity", symbol: "eps3", latex: "|\\epsilon_3|", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: (["alpha13", "eps3"] as const).map((c): MappingEntry => ({
    kind: "inspiral_phase" as const,
    pn_order: 2,
    b: -1,
    coupling: c,
    held_fixed: c === "alpha13" ? { eps3: 0 } : { alpha13: 0 },
    expression: johannsenShape,
    latex: "\\beta = \\frac{75}{64}\\,(\\epsilon_3 - 2\\alpha_{13})\\,\\eta^{-4/5}",
    derivation: {
      kind: "energy_flux" as const,
      order: 2,
      A: "eps3 - 2*alpha13",
      B: "-2*(eps3 - 2*alpha13)",
      note: "static limit -g_tt = (1 - 2x)(1 + (ε₃ - 2α₁₃) x³) to first order, x = M/r: test-body binding energy E = E_GR [1 + (ε₃ - 2α₁₃) v⁴] and quadrupole flux with the modified Kepler law F = F_GR [1 - 2 (ε₃ - 2α₁₃) v⁴] (derived)",
    },
    body_rules: [{ kind: "derived_for" as const, description: "a deformed black-hole metric", bodies: ["bh" as const] }],
    validity: [
      {
        expression: "abs(eps3 - 2*alpha13)",
        max: 1,
        label: "small deformation: |ε₃ - 2α₁₃| below 1",
        kind: "rule_of_thumb" as const,
        reference: "project choice",
      },
    ],
    source_status: "derived" as const,
    references: [REFS.johannsen2013.key, REFS.cardenasAvendano2020.key],
    notes: "Test-body estimate re-derived for the project; the published mapping (Cardenas-Avendano, Nampalliwar & Yunes 2020) is recalled from memory.",
  })),
  references: [REFS.johannsen2013, REFS.cardenasAvendano2020],
  needs_source_confirmation: true,
};
