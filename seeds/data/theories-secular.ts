/**
 * Catalogue entries whose correction is a slow secular drift (-4PN, b = -13): a time-varying
 * Newton constant and black-hole mass loss into an extra dimension (Randall-Sundrum II).
 */
import { JULIAN_YEAR_S, SOLAR_MASS_LENGTH_KM, SOLAR_MASS_TIME_S } from "../../server/physics/units.ts";
import { literal } from "./expression-literals.ts";
import { REFS } from "./references.ts";
import type { TheoryEntry } from "./theory-entry.ts";

export const varyingG: TheoryEntry = {
  slug: "varying-g",
  name: "Time-varying Newton constant",
  family: "varying constants",
  summary:
    "A slow drift of G changes the binding energy and the radiation reaction of the binary; the leading phase correction is a -4PN term proportional to (dG/dt/G) times the chirp mass.",
  assumptions: [
    "Ġ/G constant over the observed inspiral and evaluated at the source (source-frame ℳ)",
    "the same drift for the conservative and dissipative sectors (Ġ_C = Ġ_D)",
    "constant masses and zero sensitivities (the general case with sensitivities: Tahura & Yagi 2018)",
  ],
  couplings: [
    {
      symbol: "Gdot",
      latex: "\\dot G/G",
      dimension: "L^-1",
      unit: "1/km",
      description: "fractional rate of change of G in geometric units (a rate r in 1/s is r/c in 1/km)",
      quoted: { form: "per_year", symbol: "Gdot_over_G", latex: "|\\dot G/G|", unit: "1/yr" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: -4,
      b: -13,
      expression: "-(275/851968)*Gdot*Mc",
      derivation: {
        kind: "frequency_drift",
        order: -4,
        gamma: "(55/768)*Gdot*Mc",
        note: "conservative: the orbital angular momentum is an adiabatic invariant, so G M a is constant and the orbital frequency grows as G² (df/dt adds 2 (Ġ/G) f); dissipative: the GR drift goes as (G ℳ)^(5/3) with G(t) = G_c [1 - (Ġ/G)(t_c - t)] and t_c - t = (5/256) ℳ u⁻⁸. γ = 5/48 - 25/768 = 55/768 (derived)",
      },
      latex: "\\beta = -\\frac{275}{851968}\\,\\frac{\\dot G}{G}\\,\\mathcal{M}",
      frame_note:
        "Ġ/G is the rate at the source and ℳ the source-frame chirp mass; the observed rate (1+z)⁻¹ Ġ/G times ℳ_z gives the same product.",
      validity: [
        {
          expression: "abs(Gdot)*tau",
          max: 0.1,
          label: "G changes little while the signal is in band: |Ġ/G| τ below 0.1, τ = (5/256) ℳ (π ℳ f_low)^(-8/3)",
          kind: "rule_of_thumb",
          reference: "in-band time at leading order (common practice); project choice: 0.1 stands for 'much less than 1'",
        },
      ],
      source_status: "derived",
      references: [REFS.tahuraYagi2018.key, REFS.yunesPretoriusSpergel2010.key],
      notes: "General form -(25/851968)(14 Ġ_C/G - 3 Ġ_D/G) ℳ; here Ġ_C = Ġ_D.",
    },
  ],
  references: [REFS.yunesPretoriusSpergel2010, REFS.tahuraYagi2018],
};

/**
 * Mass-loss rate of a brane black hole, mdot_i = -C(ell) / m_i^2 for each hole on its own, with
 * C = 2.8e-7 M_sun^3/yr (ell / 10 um)^2 (Emparan, Garcia-Bellido & Kaloper 2003) [memory], as the
 * dimensionless geometric rate. The binary's total rate is Mdot = -C (1/m1^2 + 1/m2^2), the law for
 * which the Mdot mapping's mass-ratio factor is exact [derived].
 */
const RSII_RATE_AT_UNIT = (2.8e-7 * SOLAR_MASS_TIME_S) / JULIAN_YEAR_S;
const TEN_MICROMETRES_KM = 1e-8;
const mdotOfEll = `${literal(RSII_RATE_AT_UNIT)}*${literal(SOLAR_MASS_LENGTH_KM)}^2*(1/m1^2 + 1/m2^2)*(ell/${literal(TEN_MICROMETRES_KM)})^2`;
const massLossShape = "(3 - 26*eta + 34*eta^2)/(eta^(2/5)*(1 - 2*eta))";
const BLACK_HOLES_ONLY = {
  kind: "only_for" as const,
  description: "black holes only: a neutron star does not lose mass into the bulk, and the mass-ratio factor assumes the per-hole law ṁᵢ = -C/mᵢ² on both bodies",
  bodies: ["bh" as const],
};
const massLossValidity = (rate: string) => [
  {
    expression: `${rate}*tau/M`,
    max: 0.1,
    label: "masses change little while the signal is in band: |Ṁ| τ/M below 0.1, τ = (5/256) ℳ (π ℳ f_low)^(-8/3)",
    kind: "rule_of_thumb" as const,
    reference: "in-band time at leading order (common practice); project choice: 0.1 stands for 'much less than 1'",
  },
];

export const extraDimension: TheoryEntry = {
  slug: "extra-dimension",
  name: "Randall-Sundrum II braneworld: black-hole mass loss",
  family: "extra dimensions",
  summary:
    "With one warped extra dimension of AdS curvature length ℓ, black holes on the brane may lose mass at a rate growing as ℓ²/M². The drift of the masses during the inspiral is a -4PN phase correction.",
  assumptions: [
    "|Ṁ| T_obs ≪ M: the masses change little during the observation",
    "the mass-loss estimate of Emparan, Garcia-Bellido & Kaloper applies (debated in the literature)",
    "the ℓ mapping applies the rate to each hole on its own, ṁᵢ = -C(ℓ)/mᵢ² (the rate formula is from memory)",
    "black holes only: neutron stars do not lose mass into the extra dimension",
  ],
  couplings: [
    {
      symbol: "Mdot_loss",
      latex: "|\\dot M|",
      dimension: "1",
      unit: "1",
      description: "mass-loss rate -dM/dt of the binary (both holes) in geometric units (dimensionless)",
      quoted: { form: "solar_mass_per_year", symbol: "Mdot_loss", latex: "|\\dot M|", unit: "M_sun/yr" },
      range: "non_negative",
      gr_value: "zero",
    },
    {
      symbol: "ell",
      latex: "\\ell",
      dimension: "L",
      unit: "km",
      description: "AdS curvature length of the extra dimension",
      quoted: { form: "micrometre", symbol: "ell", latex: "\\ell", unit: "um" },
      range: "positive",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: -4,
      b: -13,
      coupling: "Mdot_loss",
      expression: `-(25/851968)*Mdot_loss*${massLossShape}`,
      derivation: {
        kind: "frequency_drift",
        order: -4,
        gamma: `(5/768)*Mdot_loss*${massLossShape}`,
        note: "per-hole law ṁᵢ = -C/mᵢ² with Ṁ = ṁ₁ + ṁ₂ = -Ṁ_loss. Conservative: isotropic mass loss keeps the specific angular momentum, so a M is constant and df/dt adds 2 (Ṁ/M) f; dissipative: the GR drift goes as ℳ^(5/3), with d ln ℳ/dt = (Ṁ/M)(3 - 10η + 2η²)/(5η (1 - 2η)) over t_c - t = (5/256) ℳ u⁻⁸ (derived)",
      },
      latex: "\\beta = \\frac{25}{851968}\\,\\dot M\\,\\frac{3 - 26\\eta + 34\\eta^2}{\\eta^{2/5}(1 - 2\\eta)},\\quad \\dot M = -|\\dot M|",
      body_rules: [BLACK_HOLES_ONLY],
      validity: massLossValidity("abs(Mdot_loss)"),
      source_status: "derived",
      references: [REFS.yunesYagiPretorius2016.key],
      notes:
        "Derived; matches the review form [memory]. The sign of β follows 3 - 26η + 34η², which vanishes near η = 0.1416: such a binary constrains nothing.",
    },
    {
      kind: "inspiral_phase",
      pn_order: -4,
      b: -13,
      coupling: "ell",
      expression: `-(25/851968)*(${mdotOfEll})*${massLossShape}`,
      derivation: {
        kind: "frequency_drift",
        order: -4,
        gamma: `(5/768)*(${mdotOfEll})*${massLossShape}`,
        note: "the drift of the Ṁ mapping with Ṁ = -C(ℓ) (1/m₁² + 1/m₂²) (per-hole law; the rate C(ℓ) is from memory)",
      },
      latex:
        "\\beta = -\\frac{25}{851968}\\,C(\\ell)\\left(\\frac{1}{m_1^2} + \\frac{1}{m_2^2}\\right)\\frac{3 - 26\\eta + 34\\eta^2}{\\eta^{2/5}(1 - 2\\eta)},\\quad C(\\ell) = 2.8\\times10^{-7}\\,M_\\odot^3/\\mathrm{yr}\\,(\\ell/10\\,\\mu\\mathrm{m})^2",
      body_rules: [BLACK_HOLES_ONLY],
      validity: massLossValidity(`(${mdotOfEll})`),
      source_status: "memory",
      references: [REFS.emparanGarciaBellidoKaloper2003.key, REFS.yunesYagiPretorius2016.key],
      notes:
        "Per-hole law ṁᵢ = -C(ℓ)/mᵢ², so Ṁ = -C (1/m₁² + 1/m₂²) [derived]; the rate C(ℓ) is from memory: an editor must confirm it.",
    },
  ],
  references: [REFS.emparanGarciaBellidoKaloper2003, REFS.yunesYagiPretorius2016],
  needs_source_confirmation: true,
};
