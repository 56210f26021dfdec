/**
 * Catalogue entries whose correction is generated at the binary (dipole or curvature-induced
 * scalar radiation): EdGB, dCS, Brans-Dicke and generic dipole radiation.
 * Formulas and statuses follow the project's physics primer, section 2.
 */
import { REFS } from "./references.ts";
import type { TheoryEntry, ValidityEntry } from "./theory-entry.ts";

/** Body indices as subscripts in labels (m₁, χ₂). */
const SUB = { 1: "₁", 2: "₂" } as const;

/** Horizon regularity / small coupling on each black hole with its own mass. */
function perBlackHoleCoupling(theory: string): ValidityEntry[] {
  return ([1, 2] as const).map((i) => ({
    expression: `16*pi*alpha^2/m${i}^4`,
    max: 1 / 6,
    label: `${theory} coupling on body ${i}: 16π α²/m${SUB[i]}⁴ < 1/6`,
    kind: "hard" as const,
    reference: "small-coupling expansion; 1/6 as the regular-horizon limit is a value from memory (to confirm)",
    source_status: "memory" as const,
    body: i,
    applies_to: ["bh"] as const,
  }));
}

export const edgb: TheoryEntry = {
  slug: "edgb",
  name: "Einstein-dilaton-Gauss-Bonnet gravity (linear, shift-symmetric coupling)",
  family: "quadratic gravity",
  summary:
    "A scalar coupled linearly to the Gauss-Bonnet invariant. Black holes carry a scalar charge that depends on their spin; neutron stars carry none at leading order. Unequal charges radiate scalar dipole waves, a -1PN correction to the phase.",
  action_latex:
    "S = \\int d^4x\\,\\sqrt{-g}\\left[\\frac{R}{16\\pi} + \\alpha\\,\\phi\\,\\mathcal{G} - \\frac{1}{2}\\nabla_\\mu\\phi\\nabla^\\mu\\phi\\right],\\quad \\mathcal{G} = R^2 - 4R_{\\mu\\nu}R^{\\mu\\nu} + R_{\\mu\\nu\\rho\\sigma}R^{\\mu\\nu\\rho\\sigma}",
  assumptions: [
    "small coupling: 16π α²/m⁴ ≪ 1 for every black hole",
    "leading PN order of the scalar dipole flux; conservative corrections are higher order",
    "aligned spins; spin enters only through the black-hole charge factor s(χ)",
  ],
  couplings: [
    {
      symbol: "alpha",
      latex: "\\alpha",
      dimension: "L^2",
      unit: "km^2",
      description: "Gauss-Bonnet coupling in convention A; its sign can be absorbed into the scalar (φ → -φ), so α ≥ 0",
      quoted: { form: "sqrt", symbol: "sqrt_alpha", latex: "\\sqrt{\\alpha}", unit: "km" },
      range: "non_negative",
      gr_value: "zero",
      convention: "A",
      conventions: [
        {
          name: "A",
          action_latex: "\\int\\sqrt{-g}\\,[R/16\\pi + \\alpha\\,\\phi\\,\\mathcal{G} - \\tfrac12(\\partial\\phi)^2]",
          factor: 1,
          factor_expression: "1",
        },
        {
          name: "SZ",
          action_latex: "\\frac{1}{8\\pi}\\int\\sqrt{-g}\\,[R/2 - \\tfrac12(\\partial\\phi)^2 + \\alpha\\,\\phi\\,\\mathcal{G}]",
          factor: 1 / Math.sqrt(8 * Math.PI),
          factor_expression: "1/sqrt(8*pi)",
          source_status: "derived",
          note: "rescale φ to a canonical kinetic term with R/(16π) in front",
        },
        {
          name: "JB",
          action_latex: "\\frac{1}{16\\pi}\\int\\sqrt{-g}\\,[R - 2(\\partial\\phi)^2 + \\alpha f(\\phi)\\,\\mathcal{G}],\\ f = 2\\phi",
          factor: 1 / Math.sqrt(16 * Math.PI),
          factor_expression: "1/sqrt(16*pi)",
          reference: REFS.sanger2024.key,
          source_status: "derived",
          note: "check: l_GB = 0.51 M_sun in JB is √(α_A) = 0.28 km (Sanger et al. 2024)",
        },
      ],
    },
  ],
  definitions: [
    { symbol: "zeta", expression: "16*pi*alpha^2/M^4", latex: "\\zeta = 16\\pi\\alpha^2/M^4", description: "dimensionless coupling" },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: -1,
      b: -7,
      expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
      latex: "\\beta = -\\frac{5}{7168}\\,\\zeta\\,\\frac{(m_1^2 s_2 - m_2^2 s_1)^2}{M^4\\,\\eta^{18/5}}",
      derivation: {
        kind: "energy_flux",
        order: -1,
        A: "0",
        B: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)",
        note: "dipole flux F = F_GR [1 + B v⁻²]; the derivation check compares this B with β",
      },
      gimr_equivalent: { k: -2, expression: "-(10*pi/21)*alpha^2*(s1/m1^2 - s2/m2^2)^2", source_status: "derived" },
      body_rules: [
        {
          kind: "charge",
          description:
            "black holes carry the spin-dependent charge factor s = 2 (√(1 - χ²) - 1 + χ²)/χ² (spinning-hole charge: Yagi, Stein & Yunes 2016, value from memory, to be confirmed); neutron stars s = 0 at leading order (Yagi 2012)",
          bodies: ["bh", "ns"],
          reference: REFS.yagiSteinYunes2016.key,
        },
      ],
      validity: perBlackHoleCoupling("EdGB"),
      source_status: "derived",
      references: [REFS.yunesYagiPretorius2016.key, REFS.yagi2012.key, REFS.yagiSteinYunes2016.key],
      notes:
        "Normalisation derived from the dipole flux; that Yunes, Yagi & Pretorius 2016 Table I prints this form is from memory. β < 0 always; equal-mass, equal-spin black holes give β = 0 (no constraint).",
    },
  ],
  references: [REFS.yunesYagiPretorius2016, REFS.yagi2012, REFS.yagiSteinYunes2016, REFS.perkins2021, REFS.lyuJiangYagi2022, REFS.sanger2024],
  reference_bounds: [
    {
      coupling: "alpha",
      quoted_symbol: "sqrt_alpha",
      value: 1.9,
      unit: "km",
      side: "upper",
      reference: REFS.yagi2012.key,
      source_status: "memory",
      convention: "A",
      note: "orbital decay of a low-mass X-ray binary (A0620-00). No credibility: the abstract calls it a conservative bound and states no credible level.",
    },
    {
      coupling: "alpha",
      quoted_symbol: "sqrt_alpha",
      value: 1.7,
      unit: "km",
      side: "upper",
      reference: REFS.perkins2021.key,
      source_status: "confirmed",
      convention: "A",
      note: "stacking GWTC-1/2 events. No credibility yet: the abstract states the value without its credible level; to be read in the paper.",
    },
    {
      coupling: "alpha",
      quoted_symbol: "sqrt_alpha",
      value: 1.33,
      unit: "km",
      side: "upper",
      reference: REFS.lyuJiangYagi2022.key,
      source_status: "confirmed",
      credibility: 0.9,
      convention: "A",
      note: "neutron-star - black-hole events (90% credible, abstract)",
    },
  ],
  needs_source_confirmation: true,
};

export const dcs: TheoryEntry = {
  slug: "dcs",
  name: "Dynamical Chern-Simons gravity",
  family: "quadratic gravity",
  summary:
    "A pseudo-scalar coupled to the Pontryagin density. Spinning black holes acquire a scalar dipole and a modified quadrupole; the leading inspiral correction enters at 2PN and vanishes for non-spinning binaries.",
  action_latex:
    "S = \\int d^4x\\,\\sqrt{-g}\\left[\\frac{R}{16\\pi} + \\frac{\\alpha}{4}\\,\\vartheta\\,{}^{*}\\!RR - \\frac{1}{2}\\nabla_\\mu\\vartheta\\nabla^\\mu\\vartheta\\right]",
  assumptions: [
    "small coupling ζ = 16π α²/M⁴ ≪ 1",
    "slow rotation: leading order in the spins",
    "derived for binary black holes",
    "action normalisation as written is from memory; the mapping's ζ convention is the one of Yagi, Stein, Yunes & Tanaka 2012",
  ],
  couplings: [
    {
      symbol: "alpha",
      latex: "\\alpha",
      dimension: "L^2",
      unit: "km^2",
      description: "Chern-Simons coupling, normalised so that ζ = 16π α²/M⁴; its sign can be absorbed into the pseudo-scalar, so α ≥ 0",
      quoted: { form: "sqrt", symbol: "sqrt_alpha", latex: "\\sqrt{\\alpha}", unit: "km" },
      range: "non_negative",
      gr_value: "zero",
      convention: "A",
      conventions: [{ name: "A", factor: 1, factor_expression: "1" }],
    },
  ],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4", latex: "\\zeta = 16\\pi\\alpha^2/M^4" }],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 2,
      b: -1,
      expression:
        "(1549225/11812864)*(zeta/eta^(14/5))*((1 - 231808*eta/61969)*chi_s^2 + (1 - 16068*eta/61969)*chi_a^2 - 2*dm*chi_s*chi_a)",
      latex:
        "\\beta = \\frac{1549225}{11812864}\\frac{\\zeta}{\\eta^{14/5}}\\left[\\left(1 - \\frac{231808}{61969}\\eta\\right)\\chi_s^2 + \\left(1 - \\frac{16068}{61969}\\eta\\right)\\chi_a^2 - 2\\delta m\\,\\chi_s\\chi_a\\right]",
      body_rules: [{ kind: "derived_for", description: "derived for binary black holes", bodies: ["bh"] }],
      validity: [
        ...([1, 2] as const).map((i) => ({
          expression: `16*pi*alpha^2/m${i}^4`,
          max: 0.1,
          label: `small coupling on body ${i}: 16π α²/m${SUB[i]}⁴ ≪ 1 (at most 0.1)`,
          kind: "hard" as const,
          reference: "the mapping is a small-coupling expansion in each hole's own 16 pi alpha^2 / m^4; project choice: 0.1 stands for 'much less than 1'",
          body: i,
          applies_to: ["bh"] as const,
        })),
        ...([1, 2] as const).map((i) => ({
          expression: `abs(chi${i})`,
          max: 0.5,
          label: `slow rotation of body ${i}: |χ${SUB[i]}| ≪ 1 (rule of thumb 0.5)`,
          kind: "rule_of_thumb" as const,
          reference: "the mapping is O(chi^2) (slow-rotation expansion); project choice: 0.5 as the rule of thumb",
          body: i,
          applies_to: ["bh"] as const,
        })),
      ],
      source_status: "confirmed",
      references: [REFS.yagiSteinYunesTanaka2012.key],
      notes: "Non-spinning binaries give β = 0 (no constraint).",
    },
  ],
  references: [REFS.yagiSteinYunesTanaka2012, REFS.alexanderYunes2009, REFS.yunesYagiPretorius2016],
};

export const bransDicke: TheoryEntry = {
  slug: "brans-dicke",
  name: "Brans-Dicke theory (massless scalar-tensor)",
  family: "scalar-tensor",
  summary:
    "A massless scalar with coupling ω_BD. Bodies radiate scalar dipole waves in proportion to the difference of their sensitivities; black holes all have sensitivity 1/2, so only mixed binaries constrain ω_BD.",
  action_latex:
    "S = \\frac{1}{16\\pi}\\int d^4x\\,\\sqrt{-g}\\left[\\phi R - \\frac{\\omega_{BD}}{\\phi}\\nabla_\\mu\\phi\\nabla^\\mu\\phi\\right] + S_m[g, \\psi_m]",
  assumptions: [
    "ω_BD ≫ 1 (leading order in 1/ω_BD)",
    "sensitivities: black hole 1/2; neutron star from its equation of state (an input)",
    "dipole coefficient stored as 1/(2 + ω_BD); the exact coefficient is 1/(ω_BD + 3/2). Both agree at leading order in 1/ω_BD, but published small-ω_BD numbers differ by up to about 2x depending on which is used",
  ],
  couplings: [
    {
      symbol: "omega_BD",
      latex: "\\omega_{BD}",
      dimension: "1",
      unit: "1",
      quoted: { form: "identity", symbol: "omega_BD", latex: "\\omega_{BD}", unit: "1" },
      range: "positive",
      gr_value: "infinity",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: -1,
      b: -7,
      expression: "-(5/3584)*eta^(2/5)*(sigma1 - sigma2)^2/(2 + omega_BD)",
      latex: "\\beta = -\\frac{5}{3584}\\,\\eta^{2/5}\\,\\frac{(s_1 - s_2)^2}{2 + \\omega_{BD}}",
      derivation: {
        kind: "energy_flux",
        order: -1,
        A: "0",
        B: "(5/48)*(sigma1 - sigma2)^2/(2 + omega_BD)",
        note: "dipole flux (1/3) η² v⁸ (a₁ - a₂)² with scalar charges aᵢ = (1 - 2 sᵢ)/√(2ω_BD + 3), to leading order in 1/ω_BD [derived]",
      },
      body_rules: [
        {
          kind: "charge",
          description: "sensitivity s = 1/2 for a black hole; a neutron star's sensitivity must be supplied",
          bodies: ["bh", "ns"],
          reference: REFS.willZaglauer1989.key,
        },
      ],
      validity: [
        {
          expression: "1/omega_BD",
          max: 0.1,
          label: "ω_BD ≫ 1 (leading order in 1/ω_BD)",
          kind: "rule_of_thumb",
          reference: "project choice: omega_BD >= 10 stands for 'much greater than 1'",
        },
      ],
      source_status: "memory",
      references: [REFS.will1994.key, REFS.yunesYagiPretorius2016.key],
      caution:
        "The dipole coefficient is stored as 1/(2 + ω_BD); the exact one is 1/(ω_BD + 3/2). They agree at leading order in 1/ω_BD, but at small ω_BD published limits differ by up to about 2x depending on the choice.",
      notes:
        "Recalled form, cross-checked by re-deriving the dipole flux. Coefficient 1/(2 + ω_BD) (exact: 1/(ω_BD + 3/2), equal at leading order in 1/ω_BD). Not a power law in ω_BD: the limit is a numeric root.",
    },
  ],
  references: [REFS.will1994, REFS.willZaglauer1989, REFS.bertottiIessTortora2003, REFS.yunesYagiPretorius2016],
  reference_bounds: [
    {
      coupling: "omega_BD",
      quoted_symbol: "omega_BD",
      value: 40000,
      unit: "1",
      side: "lower",
      reference: REFS.bertottiIessTortora2003.key,
      source_status: "memory",
      credibility: 0.95,
      note: "Shapiro delay of the Cassini radio link (Solar System, not a GW bound). 95 %: Alsing, Berti, Will & Zaglauer 2012 (arXiv:1112.4903) quote ω_BD > 40000 to 95 % confidence in their abstract (the massless limit of their theory); it is the 2-σ end of γ - 1 = (2.1 ± 2.3) × 10⁻⁵ (value from memory), since 1 - γ = 1/(2 + ω_BD).",
    },
  ],
  needs_source_confirmation: true,
};


export const scalarDipole: TheoryEntry = {
  slug: "scalar-dipole",
  name: "Generic dipole radiation",
  family: "scalar-tensor",
  summary:
    "Theory-agnostic extra dipole flux F = F_GR [1 + B v⁻²], the common form of scalar or vector dipole emission. A limit on B can be reused for any theory that predicts it.",
  assumptions: ["the extra flux is a small correction at every frequency analysed", "the binding energy is unchanged at -1PN"],
  couplings: [
    {
      symbol: "B_dip",
      latex: "B",
      dimension: "1",
      unit: "1",
      description: "relative dipole flux coefficient (a flux, so B ≥ 0)",
      quoted: { form: "identity", symbol: "B_dip", latex: "B", unit: "1" },
      range: "non_negative",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: -1,
      b: -7,
      expression: "-(3/224)*eta^(2/5)*B_dip",
      latex: "\\beta = -\\frac{3}{224}\\,\\eta^{2/5} B",
      derivation: { kind: "energy_flux", order: -1, A: "0", B: "B_dip" },
      validity: [
        {
          // The dipole-to-quadrupole flux ratio B v^-2 grows toward low frequency, so it is largest at
          // the low end of the band, v = (pi M f_low)^(1/3): that is where it must be small.
          expression: "abs(B_dip)*(pi*M*f_low)^(-2/3)",
          max: 0.1,
          label: "dipole flux small against the quadrupole flux over the band: |B| v⁻² below 0.1 at the band's low end, v = (π M f_low)^(1/3)",
          kind: "rule_of_thumb",
          reference: "project choice: 0.1 stands for 'much less than 1'",
        },
      ],
      source_status: "derived",
      references: [REFS.yunesPretorius2009.key],
      notes: "Energy balance and the stationary-phase approximation (Yunes & Pretorius 2009).",
    },
  ],
  references: [REFS.yunesPretorius2009, REFS.yunesYagiPretorius2016],
};
