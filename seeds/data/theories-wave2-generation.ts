/**
 * Second batch, effects generated at the binary: a varying G with body sensitivities, vector and
 * scalar dipole charges, scalar-Gauss-Bonnet with a general coupling function, quadrupole deviations
 * of black-hole mimickers, and their tidal deformability. Written in the submission shape; published
 * by seeds/catalogue-wave2.ts.
 *
 * Energy balance (Yunes & Pretorius 2009): a change E = E_GR [1 + A v^(2k)], F = F_GR [1 + B v^(2k)]
 * gives beta = 15 [(k + 1) A - B] eta^(-2k/5) / [16 (2k - 8)(2k - 5)] at b = 2k - 5; a change of the
 * frequency drift df/dt = GR [1 + gamma u^(b+5)] gives beta = -15 gamma / [16 b (b - 3)]. The engine
 * re-derives every beta below that states its inputs. A 2PN change of the phase coefficient phi_4 by
 * d phi_4 gives beta = (3/128) eta^(-4/5) d phi_4 at b = -1.
 */
import type { TheoryEntryInput } from "../../common/catalogue.ts";
import { defineEntry, dipoleAtLowEnd, dipoleMapping, QM_PREFACTOR, ruleOfThumb } from "./entry-parts.ts";
import { FIRST, WAVE2_LIBRARY, WAVE2_REFS } from "./references-wave2.ts";

export const varyingGSensitivities: TheoryEntryInput = defineEntry({
  slug: "varying-g-sensitivities",
  name: "Time-varying Newton constant with body sensitivities",
  family: "varying-constants",
  summary:
    "A drift of G changes the orbit and the radiation reaction; compact bodies respond with their own mass change, mᵢ proportional to G^(-sᵢ), with the sensitivity sᵢ = -d ln mᵢ/d ln G (1/2 for a black hole). The leading phase correction is a -4PN term proportional to (dG/dt/G) times the chirp mass, with a sensitivity-dependent factor.",
  assumptions: [
    "Ġ/G constant over the observed inspiral and evaluated at the source (source-frame ℳ)",
    "bodies keep their momentum while their masses change (Nordtvedt 1990): the orbital frequency changes as d ln ω = (Ġ/G)[2 - 3(s₁ + s₂) + (m₁ s₁ + m₂ s₂)/M] dt",
    "radiation reaction as in GR with G(t) and mᵢ(t): df/dt proportional to (G ℳ)^(5/3)",
    "s₁ = s₂ = 0 gives the 'varying-g' entry, -(275/851968) (Ġ/G) ℳ",
  ],
  couplings: [
    {
      symbol: "Gdot",
      latex: "\\dot G/G",
      dimension: -1,
      unit: "1/km",
      description: "fractional rate of change of G in geometric units (a rate r in 1/s is r/c in 1/km)",
      quoted: { form: "per_year", symbol: "Gdot_over_G", latex: "\\dot G/G", unit: "1/yr" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: -4,
      b: -13,
      expression: "-(25/851968)*Gdot*Mc*(11 - 21*(sigma1 + sigma2) + 7*(m1*sigma1 + m2*sigma2)/M)",
      latex: "\\beta = -\\frac{25}{851968}\\,\\frac{\\dot G}{G}\\,\\mathcal{M}\\left[11 - 21(s_1 + s_2) + 7\\,\\frac{m_1 s_1 + m_2 s_2}{M}\\right]",
      frame_note: "Ġ/G is the rate at the source and ℳ the source-frame chirp mass.",
      derivation: {
        kind: "frequency_drift",
        order: -4,
        gamma: "(1/768)*Gdot*Mc*(55 - 105*(sigma1 + sigma2) + 35*(m1*sigma1 + m2*sigma2)/M)",
        note: "conservative: d ln f/dt = (Ġ/G)[2 - 3 S + X] (Nordtvedt 1990), S = s₁ + s₂, X = (m₁ s₁ + m₂ s₂)/M, times f/(df/dt)_GR = (5/96) ℳ u⁻⁸; dissipative: (G ℳ)^(5/3) with d ln(G ℳ)/dt = (Ġ/G)[1 - 3S/5 + X/5] over t_c - t = (5/256) ℳ u⁻⁸, a factor -(25/768). γ = (Ġ/G) ℳ [55 - 105 S + 35 X]/768 (our own derivation)",
      },
      body_rules: [
        {
          kind: "charge",
          description: "sensitivity s = -d ln m/d ln G at fixed baryon number: 1/2 for a black hole, about 0.1 to 0.3 for a neutron star (equation of state); supplied as σ₁, σ₂",
          bodies: ["bh", "ns"],
          reference: FIRST.will1994.key,
        },
      ],
      validity: [
        ruleOfThumb("abs(Gdot)*tau", "G changes little while the signal is in band: |Ġ/G| τ below 0.1, τ = (5/256) ℳ (π ℳ f_low)^(-8/3)", {
          reference: "in-band time at leading order (common practice); project choice: 0.1 stands for 'much less than 1'",
        }),
      ],
      source_status: "derived",
      references: [WAVE2_REFS.nordtvedt1990.key, FIRST.tahuraYagi.key, FIRST.yps2010.key],
      notes:
        "Our own derivation under the stated assumptions; Tahura & Yagi 2018 give a general form with sensitivities that an editor should compare (value from memory that it exists). For two black holes (s = 1/2): 11 - 21 + 3.5 = -6.5, the opposite sign to the no-sensitivity case.",
    },
  ],
  reference_bounds: [
    {
      coupling: "Gdot",
      quoted_symbol: "Gdot_over_G",
      value: 1.5e-13,
      unit: "1/yr",
      side: "upper",
      credibility: 0.68,
      data: "lunar laser ranging (Earth-Moon: weak-field bodies, sensitivities near 0)",
      reference: WAVE2_REFS.hofmannMuller2018.key,
      source_status: "memory",
      note: "recalled as Ġ/G = (7.1 ± 7.6) × 10⁻¹⁴ /yr (1σ); the value shown is the centre plus 1σ. Value from memory.",
    },
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);

/** The difference of the bodies' vector charge-to-mass ratios, shared by the massless and massive vector-charge entries. */
export const DQ_COUPLING = {
  symbol: "dq",
  latex: "|q_1 - q_2|",
  dimension: 0,
  unit: "1",
  description: "difference of the bodies' charge-to-mass ratios (a property of the binary)",
  quoted: { form: "identity", symbol: "dq", latex: "|q_1 - q_2|", unit: "1" },
  range: "non_negative",
  gr_value: "zero",
} as const;

/** The -1PN Larmor dipole of vector charges, (2/3) eta^2 v^8 (q1 - q2)^2 against (32/5) eta^2 v^10, with its body rule and validity. */
export function larmorDipole(fields: { references: string[]; notes: string; caution?: string }) {
  return dipoleMapping({
    coupling: "dq",
    expression: "-(5/3584)*eta^(2/5)*dq^2",
    latex: "\\beta = -\\frac{5}{3584}\\,\\eta^{2/5}\\,(q_1 - q_2)^2",
    B: "(5/48)*dq^2",
    flux_note: "F_dip = (2/3) η² v⁸ (q₁ - q₂)² against (32/5) η² v¹⁰: B = (5/48)(q₁ - q₂)² (our own derivation; Larmor formula)",
    body_rules: [
      {
        kind: "charge",
        description: "any body may carry a charge (black holes keep a gauge charge); astrophysical black holes are expected to be nearly neutral electrically, so the electric case mostly tests exotic charging",
        bodies: ["bh", "ns"],
      },
    ],
    validity: [
      dipoleAtLowEnd("(5/48)*dq^2"),
      {
        expression: "dq/2",
        max: 1,
        label: "each black hole below extremality: |qᵢ| ≤ 1, so |q₁ - q₂| ≤ 2",
        kind: "hard",
        reference: "Reissner-Nordstrom extremality (common practice)",
      },
    ],
    source_status: "derived",
    ...fields,
  });
}

export const vectorCharges: TheoryEntryInput = defineEntry({
  slug: "vector-charges",
  name: "Massless vector charges (electric or dark U(1)) on compact bodies",
  family: "other",
  summary:
    "Compact bodies carrying charges of a massless vector field, electric or a dark-sector U(1) (minicharged dark matter), attract or repel each other and radiate vector dipole waves when their charge-to-mass ratios differ: a -1PN phase term in the squared difference of the charge-to-mass ratios.",
  assumptions: [
    "charge-to-mass ratios qᵢ = Qᵢ/(√G mᵢ) in Gaussian units with G = c = 1 (|q| ≤ 1 for a black hole); for a dark U(1), Q in that sector's Gaussian units",
    "the Coulomb-like force changes Kepler's law by (1 - q₁ q₂) at 0PN, which the measured chirp mass absorbs; corrections to the dipole of order q₁ q₂ (q₁ - q₂)² are dropped",
    "dipole flux (2/3) μ² (q₁ - q₂)² (M/r²)² (Larmor), twice the scalar dipole flux for the same charges",
  ],
  couplings: [DQ_COUPLING],
  mappings: [
    larmorDipole({
      references: [WAVE2_REFS.cardosoMacedoPaniFerrari2016.key],
      notes: "The coupling is the charge difference of the binary analysed: a limit holds for that binary, not for a universal charge.",
    }),
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY, [FIRST.yyp2016]);

export const scalarGaussBonnetGeneral: TheoryEntryInput = defineEntry({
  slug: "sgb-general",
  name: "Scalar-Gauss-Bonnet gravity with a general coupling function f(φ)",
  family: "quadratic-gravity",
  summary:
    "A scalar coupled to the Gauss-Bonnet invariant through α f(φ). At leading order in the coupling the black-hole scalar charge depends only on f'(φ₀), φ₀ the asymptotic value, so the -1PN dipole term is the one of the linear (shift-symmetric) theory with α replaced by α f'(φ₀). Couplings with f'(φ₀) = 0 (the quadratic couplings of spontaneous scalarization) give no leading dipole and are not covered.",
  action_latex:
    "S = \\int d^4x\\,\\sqrt{-g}\\left[\\frac{R}{16\\pi} + \\alpha f(\\phi)\\,\\mathcal{G} - \\frac{1}{2}\\nabla_\\mu\\phi\\nabla^\\mu\\phi\\right]",
  assumptions: [
    "f'(φ₀) ≠ 0; leading order in α f'(φ₀)",
    "normalisation of convention A (canonical scalar, R/16π): α f(φ) = α φ gives the 'edgb' entry",
    "neutron stars carry no scalar charge at this order (the Gauss-Bonnet integral over a star without horizon vanishes)",
  ],
  couplings: [
    {
      symbol: "alpha_f",
      latex: "|\\alpha f'(\\phi_0)|",
      dimension: 2,
      unit: "km^2",
      description: "effective linear coupling |α f'(φ₀)| in convention A; the mapping depends on its square",
      quoted: { form: "sqrt", symbol: "sqrt_alpha_f", latex: "\\sqrt{|\\alpha f'(\\phi_0)|}", unit: "km" },
      convention: "A",
      range: "non_negative",
      gr_value: "zero",
    },
  ],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha_f^2/M^4", latex: "\\zeta = 16\\pi\\,[\\alpha f'(\\phi_0)]^2/M^4" }],
  mappings: [
    dipoleMapping({
      expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
      latex: "\\beta = -\\frac{5}{7168}\\,\\zeta\\,\\frac{(m_1^2 s_2 - m_2^2 s_1)^2}{M^4\\,\\eta^{18/5}}",
      B: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)",
      flux_note: "scalar dipole flux of the black holes' charges, as in the linear theory with α → α f'(φ₀)",
      body_rules: [
        {
          kind: "charge",
          description: "black holes carry the spin-dependent charge factor s = 2 (√(1 - χ²) - 1 + χ²)/χ² (value from memory); neutron stars s = 0 at leading order",
          bodies: ["bh", "ns"],
        },
      ],
      validity: ([1, 2] as const).map((i) =>
        ruleOfThumb(`16*pi*alpha_f^2/m${i}^4`, `small coupling on body ${i}: 16π (α f′)²/m${i === 1 ? "₁" : "₂"}⁴ ≪ 1`, { body: i, applies_to: ["bh"] }),
      ),
      source_status: "derived",
      references: [WAVE2_REFS.julieBerti2019.key, FIRST.yyp2016.key],
      notes: "Equal-mass, equal-spin black holes give β = 0 (no constraint). Higher orders in α depend on f''(φ₀) and beyond.",
    }),
  ],
  reference_bounds: [
    {
      coupling: "alpha_f",
      quoted_symbol: "sqrt_alpha_f",
      value: 1.33,
      unit: "km",
      side: "upper",
      credibility: 0.9,
      data: "neutron-star - black-hole events",
      reference: FIRST.lyu2022.key,
      source_status: "confirmed",
      convention: "A",
      note: "published for the linear coupling; applies to |α f'(φ₀)| at leading order",
    },
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);

export const spinInducedQuadrupole: TheoryEntryInput = defineEntry({
  slug: "spin-induced-quadrupole",
  name: "Spin-induced quadrupole moment (black-hole mimickers)",
  kind: "parameterized_spacetime",
  family: "parameterized-black-hole",
  summary:
    "A spinning body's quadrupole Qᵢ = -κᵢ χᵢ² mᵢ³ has κ = 1 for a Kerr black hole and larger values for neutron stars and boson stars. A deviation δκ of both bodies changes the 2PN quadrupole-monopole term of the phase.",
  assumptions: [
    "aligned spins; the same deviation for both bodies (δκ₁ = δκ₂ = δκ_s, δκ_a = 0)",
    "2PN quadrupole-monopole term only; κ terms at 3PN and beyond not included",
    "the term is linear in κ, so no small-coupling expansion is involved; the binary must spin to say anything",
  ],
  couplings: [
    {
      symbol: "dkappa_s",
      latex: "\\delta\\kappa_s",
      dimension: 0,
      unit: "1",
      description: "deviation of the spin-induced quadrupole coefficient from its Kerr value 1",
      quoted: { form: "identity", symbol: "dkappa_s", latex: "\\delta\\kappa_s", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 2,
      b: -1,
      expression: `${QM_PREFACTOR}*dkappa_s*(m1^2*chi1^2 + m2^2*chi2^2)/M^2`,
      latex: "\\beta = -\\frac{75}{64}\\,\\eta^{-4/5}\\,\\delta\\kappa_s\\,\\frac{m_1^2\\chi_1^2 + m_2^2\\chi_2^2}{M^2}",
      body_rules: [{ kind: "derived_for", description: "compact objects whose quadrupole follows their spin; Kerr black holes have δκ = 0", bodies: ["bh", "ns"] }],
      validity: [
        ruleOfThumb(
          "50*abs(dkappa_s)*(m1^2*chi1^2 + m2^2*chi2^2)/(36*M^2)",
          "the deviation stays a perturbation of the phase at the ISCO: 50 |δκ| Σᵢ (mᵢ χᵢ/M)² v⁴ below 0.1 at v² = 1/6",
        ),
      ],
      source_status: "derived",
      references: [WAVE2_REFS.krishnendu2017.key, WAVE2_REFS.poisson1998.key],
      notes:
        "From the 2PN coefficient φ₄ = ... - Σᵢ (50κᵢ + 5/8) (mᵢ/M)² χᵢ² (aligned spins): δφ₄ = -50 δκ Σᵢ (mᵢ/M)² χᵢ² and β = (3/128) η^(-4/5) δφ₄. Non-spinning binaries give β = 0 (no constraint).",
    },
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);

export const quasiKerrQuadrupole: TheoryEntryInput = defineEntry({
  slug: "quasi-kerr-quadrupole",
  name: "Quasi-Kerr quadrupole deviation (bumpy black holes)",
  kind: "parameterized_spacetime",
  family: "parameterized-black-hole",
  summary:
    "A black-hole spacetime whose mass quadrupole differs from Kerr's: Q = -M (a² + ε M²). The extra quadrupole -ε mᵢ³ of each body enters the 2PN quadrupole-monopole term of the phase even without spin.",
  assumptions: [
    "the same ε for both bodies; the quadrupole axis along the orbital angular momentum (aligned spins)",
    "leading order in ε; 2PN quadrupole-monopole term only",
  ],
  couplings: [
    {
      symbol: "eps_Q",
      latex: "\\epsilon",
      dimension: 0,
      unit: "1",
      description: "quadrupole deviation: Qᵢ = -mᵢ³ (χᵢ² + ε)",
      quoted: { form: "identity", symbol: "eps_Q", latex: "|\\epsilon|", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 2,
      b: -1,
      expression: `${QM_PREFACTOR}*eps_Q*(m1^2 + m2^2)/M^2`,
      latex: "\\beta = -\\frac{75}{64}\\,\\eta^{-4/5}\\,\\epsilon\\,\\frac{m_1^2 + m_2^2}{M^2}",
      body_rules: [{ kind: "derived_for", description: "deformed black holes (each with its own quadrupole deviation ε mᵢ³)", bodies: ["bh"] }],
      validity: [ruleOfThumb("abs(eps_Q)", "small deformation: |ε| below 1", { max: 1, reference: "project choice" })],
      source_status: "derived",
      references: [WAVE2_REFS.glampedakisBabak2006.key, WAVE2_REFS.poisson1998.key],
      notes:
        "The quadrupole-monopole term of φ₄ is -50 (-Qᵢ/mᵢ³)(mᵢ/M)² per body; with -Qᵢ/mᵢ³ = χᵢ² + ε the ε part is δφ₄ = -50ε (m₁² + m₂²)/M², so β = (3/128) η^(-4/5) δφ₄ (our own derivation).",
    },
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);

export const scalarizedNeutronStar: TheoryEntryInput = defineEntry({
  slug: "scalarized-neutron-star",
  name: "Scalar-tensor theory with a scalarized neutron star (neutron-star - black-hole binaries)",
  family: "scalar-tensor",
  summary:
    "In scalar-tensor theories of the Damour-Esposito-Farese type a neutron star can carry a large effective scalar coupling α_A (spontaneous scalarization) while a black hole carries none. A neutron-star - black-hole binary then radiates scalar dipole waves in proportion to α_A²: a -1PN term. Turning a limit on α_A into (α₀, β₀) needs the star's structure (equation of state and mass), which the catalogue does not hold.",
  action_latex:
    "S = \\frac{1}{16\\pi}\\int d^4x\\,\\sqrt{-g_*}\\left[R_* - 2 g_*^{\\mu\\nu}\\partial_\\mu\\varphi\\,\\partial_\\nu\\varphi\\right] + S_m[\\psi_m, A^2(\\varphi) g_*],\\quad \\ln A = \\alpha_0 (\\varphi - \\varphi_0) + \\tfrac12 \\beta_0 (\\varphi - \\varphi_0)^2",
  assumptions: [
    "massless scalar; leading order in the dipole flux; the black hole has α_BH = 0 (no scalar hair)",
    "the effective gravitational constant G (1 + α_A α_B) equals G for a black-hole companion",
    "dipole flux (1/3) η² v⁸ (α_A - α_B)² (Damour & Esposito-Farese 1996, value from memory)",
  ],
  couplings: [
    {
      symbol: "alpha_NS",
      latex: "\\alpha_A",
      dimension: 0,
      unit: "1",
      description: "effective scalar coupling of the neutron star, d ln m_A/d φ",
      quoted: { form: "identity", symbol: "alpha_NS", latex: "|\\alpha_A|", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    dipoleMapping({
      expression: "-(5/7168)*eta^(2/5)*alpha_NS^2",
      latex: "\\beta = -\\frac{5}{7168}\\,\\eta^{2/5}\\,\\alpha_A^2",
      B: "(5/96)*alpha_NS^2",
      flux_note: "F_dip = (1/3) η² v⁸ α_A² against (32/5) η² v¹⁰: B = (5/96) α_A² (derived from the dipole flux)",
      body_rules: [
        { kind: "derived_for", description: "a neutron star with a black-hole companion (α_BH = 0); for two neutron stars the difference α_A - α_B enters instead", bodies: ["bh", "ns"] },
      ],
      validity: [dipoleAtLowEnd("(5/96)*alpha_NS^2")],
      source_status: "derived",
      references: [WAVE2_REFS.damourEspositoFarese1996.key, WAVE2_REFS.damourEspositoFarese1993.key],
      notes: "The same flux normalisation as the Brans-Dicke entry, where α_A = (1 - 2 s_A)/√(2ω_BD + 3).",
    }),
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY, [FIRST.will1994]);

export const ecoTidal: TheoryEntryInput = defineEntry({
  slug: "eco-tidal-deformability",
  name: "Tidal deformability of black-hole mimickers (exotic compact objects)",
  family: "other",
  summary:
    "Black holes have zero tidal Love numbers; horizonless compact objects (boson stars, gravastars, wormholes, objects with a surface near the would-be horizon) do not. A common dimensionless tidal deformability Λ of both bodies adds the 5PN tidal term of the phase.",
  assumptions: [
    "both bodies have the same Λ = (2/3) k₂ (R/m)⁵ (objects of the same kind and compactness; then Λ does not depend on the mass)",
    "leading (5PN) tidal term; the 6PN tidal term is not included",
    "Λ may be negative for some objects (Cardoso et al. 2017)",
  ],
  couplings: [
    {
      symbol: "Lambda_eco",
      latex: "\\Lambda",
      dimension: 0,
      unit: "1",
      description: "dimensionless tidal deformability of each body; 0 for black holes",
      quoted: { form: "identity", symbol: "Lambda_eco", latex: "\\Lambda", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 5,
      b: 5,
      expression: "-(9/16)*Lambda_eco*((m1 + 12*m2)*m1^4 + (m2 + 12*m1)*m2^4)/(M^5*eta^2)",
      latex: "\\beta = -\\frac{117}{256}\\,\\frac{\\tilde\\Lambda}{\\eta^2},\\quad \\tilde\\Lambda = \\frac{16}{13}\\,\\Lambda\\,\\frac{(m_1 + 12 m_2) m_1^4 + (m_2 + 12 m_1) m_2^4}{M^5}",
      derivation: {
        kind: "energy_flux",
        order: 5,
        A: "-9*Lambda_eco*(m2*m1^4 + m1*m2^4)/M^5",
        B: "6*Lambda_eco*((M + 2*m2)*m1^4 + (M + 2*m1)*m2^4)/M^5",
        note: "tidal binding energy -9 (m_j/mᵢ) Λᵢ (mᵢ/M)⁵ v¹⁰ and flux 6 (1 + 2 m_j/M)(mᵢ/M)⁴ Λᵢ v¹⁰ per deformed body (Flanagan & Hinderer 2008; Vines, Flanagan & Hinderer 2011; values from memory); they reproduce the -(39/2) Λ-tilde v¹⁰ phase coefficient",
      },
      body_rules: [{ kind: "derived_for", description: "horizonless compact objects of one kind; a black hole has Λ = 0", bodies: ["bh", "ns"] }],
      validity: [ruleOfThumb("(39/2)*abs(Lambda_eco)/6^5", "the tidal term stays a correction at the ISCO: (39/2) |Λ| v¹⁰ below 0.1 at v² = 1/6")],
      source_status: "memory",
      references: [WAVE2_REFS.flanaganHinderer2008.key, WAVE2_REFS.vinesFlanaganHinderer2011.key, WAVE2_REFS.cardosoEtAl2017.key],
      notes: "For equal masses Λ-tilde = Λ. A neutron star is such an object too, but its Λ depends on its mass: use a tidal analysis for neutron stars.",
    },
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);

export const scalarCharges: TheoryEntryInput = defineEntry({
  slug: "scalar-charges",
  name: "Massless scalar charges (dark scalar fifth force) on compact bodies",
  family: "scalar-tensor",
  summary:
    "A massless scalar coupled to matter with composition-dependent strength (a dark-sector fifth force, scalar hair of exotic compact objects): bodies with different scalar charge-to-mass ratios radiate scalar dipole waves, a -1PN term in the squared difference of the ratios. The scalar analogue of the vector-charge entry, with half its dipole flux.",
  assumptions: [
    "scalar charge-to-mass ratios qᵢ normalised so that the scalar force is q₁ q₂ m₁ m₂/r² (G = c = 1)",
    "the 0PN change of Kepler's law (1 + q₁ q₂) is absorbed in the measured chirp mass; corrections of order q₁ q₂ (q₁ - q₂)² are dropped",
    "dipole flux (1/3) μ² (q₁ - q₂)² (M/r²)²",
  ],
  couplings: [
    {
      symbol: "dqs",
      latex: "|q^{s}_1 - q^{s}_2|",
      dimension: 0,
      unit: "1",
      description: "difference of the bodies' scalar charge-to-mass ratios (a property of the binary)",
      quoted: { form: "identity", symbol: "dqs", latex: "|q^{s}_1 - q^{s}_2|", unit: "1" },
      range: "non_negative",
      gr_value: "zero",
    },
  ],
  mappings: [
    dipoleMapping({
      expression: "-(5/7168)*eta^(2/5)*dqs^2",
      latex: "\\beta = -\\frac{5}{7168}\\,\\eta^{2/5}\\,(q^{s}_1 - q^{s}_2)^2",
      B: "(5/96)*dqs^2",
      flux_note: "F_dip = (1/3) η² v⁸ (q₁ - q₂)² against (32/5) η² v¹⁰: B = (5/96)(q₁ - q₂)² (derived)",
      body_rules: [{ kind: "charge", description: "any body may carry a scalar charge in such a theory; Kerr black holes of GR carry none", bodies: ["bh", "ns"] }],
      validity: [dipoleAtLowEnd("(5/96)*dqs^2")],
      source_status: "derived",
      references: [FIRST.will1994.key, FIRST.yyp2016.key],
      notes: "The coupling is the charge difference of the binary analysed: a limit holds for that binary. Brans-Dicke is the case qᵢ = (1 - 2 sᵢ)/√(2ω_BD + 3).",
    }),
  ],
}, WAVE2_LIBRARY);
