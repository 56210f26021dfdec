/**
 * Ringdown content of the catalogue: a theory-agnostic ringdown-deviation entry, the Johannsen &
 * Psaltis 2011 spacetime, and the ringdown mappings added to the Johannsen 2013 entry. Written in
 * the submission shape (with QNM modes and coupling ranges), published by seeds/ringdown-catalogue.ts.
 *
 * The light-ring (eikonal) shifts are our own first-order derivation for a static metric
 * ds^2 = -A dt^2 + B dr^2 + C dOmega^2, using the correspondence of Cardoso et al. 2009
 * (omega = Omega_c l - i (n + 1/2) |lambda|): d/dr(A/C) = 0 at the light ring r_c,
 * Omega_c = sqrt(A/C), lambda^2 = -C (A/C)'' / (2 B). They are rough at l = 2.
 */
import type { MappingKind, ReferenceInput, TheoryEntryInput } from "../../common/catalogue.ts";

type MappingInput = TheoryEntryInput["mappings"][number];

const MODE_220 = { l: 2, m: 2, n: 0 };

export const RINGDOWN_REFS = {
  bertiCardosoWill2006: {
    key: "berti-cardoso-will-2006",
    arxiv: "gr-qc/0512160",
    doi: "10.1103/PhysRevD.73.064030",
    authors: ["E. Berti", "V. Cardoso", "C. M. Will"],
    title: "On gravitational-wave spectroscopy of massive black holes with the space interferometer LISA",
    year: 2006,
    journal: "Phys. Rev. D 73, 064030",
    locator: "Table VIII (Kerr QNM fits)",
  },
  cardoso2009: {
    key: "cardoso-et-al-2009",
    arxiv: "0812.1806",
    doi: "10.1103/PhysRevD.79.064016",
    authors: ["V. Cardoso", "A. S. Miranda", "E. Berti", "H. Witek", "V. T. Zanchin"],
    title: "Geodesic stability, Lyapunov exponents and quasinormal modes",
    year: 2009,
    journal: "Phys. Rev. D 79, 064016",
    locator: "eikonal QNMs from the light ring: ω = Ω_c l - i (n + 1/2) |λ|",
    details_from_memory: true,
  },
  gossan2012: {
    key: "gossan-veitch-sathyaprakash-2012",
    arxiv: "1111.5819",
    authors: ["S. Gossan", "J. Veitch", "B. S. Sathyaprakash"],
    title: "Bayesian model selection for testing the no-hair theorem with black hole ringdowns",
    year: 2012,
    journal: "Phys. Rev. D 85, 124056",
    note: "Fractional shifts of the QNM frequencies and damping times as free parameters.",
    details_from_memory: true,
  },
  ghosh2016: {
    key: "ghosh-et-al-2016",
    arxiv: "1602.02453",
    authors: ["A. Ghosh", "A. Ghosh", "N. K. Johnson-McDaniel", "C. K. Mishra", "P. Ajith", "W. Del Pozzo", "D. A. Nichols", "Y. Chen", "A. B. Nielsen", "C. P. L. Berry", "L. London"],
    title: "Testing general relativity using golden black-hole binaries",
    year: 2016,
    journal: "Phys. Rev. D 94, 021101",
    note: "Deviation variables of the remnant's mass and spin between the inspiral and merger-ringdown estimates.",
    details_from_memory: true,
  },
  johannsenPsaltis2011: {
    key: "johannsen-psaltis-2011",
    authors: ["T. Johannsen", "D. Psaltis"],
    title: "Metric for rapidly spinning black holes suitable for strong-field tests of the no-hair theorem",
    year: 2011,
    journal: "Phys. Rev. D 83, 124015",
    details_from_memory: true,
  },
} satisfies Record<string, ReferenceInput>;

const NAMING_TRAP =
  "Naming trap: two metrics call a parameter ε₃. In Johannsen 2013 (the 'johannsen' entry) ε₃ enters Σ and cancels from A/C and C/B, so it leaves the eikonal spectrum unchanged at first order; in Johannsen & Psaltis 2011 (the 'johannsen-psaltis' entry) ε₃ multiplies g_tt and g_rr and shifts Ω_c by +ε₃/54. Bounds on the two are not interchangeable.";

const ringdownMapping = (kind: MappingKind, coupling: string, expression: string, latex: string, extra: Partial<MappingInput>): MappingInput => ({
  kind,
  mode: MODE_220,
  coupling,
  expression,
  latex,
  ...extra,
});

/** A bound on a fractional QNM shift is itself the parameter: the translator's identity, and the generic input of the coupling-exclusion method. */
export const ringdownDeviation: TheoryEntryInput = {
  slug: "ringdown-deviation",
  name: "Parameterised ringdown deviation, (2,2,0) mode (theory-agnostic)",
  kind: "theory",
  family: "other",
  summary:
    "The fractional shifts of the (2,2,0) quasinormal-mode frequency and damping time away from their Kerr values at the remnant's mass and spin, f = f_Kerr (1 + δf̂₂₂₀), τ = τ_Kerr (1 + δτ̂₂₂₀). Not a theory: the entry lets a ringdown bound be shown beside the theories, and lets the consistency page ask which shift a test would exclude.",
  assumptions: [
    "shifts defined at the true remnant mass and spin (a GR template fitted to a shifted mode infers a different remnant)",
    "small shifts: a mode far from Kerr is no longer a perturbed Kerr mode",
  ],
  couplings: [
    { symbol: "dfreq220", latex: "\\delta\\hat f_{220}", dimension: 0, unit: "1", range: "any_sign", gr_value: "zero", description: "fractional frequency shift of the (2,2,0) mode" },
    { symbol: "dtau220", latex: "\\delta\\hat\\tau_{220}", dimension: 0, unit: "1", range: "any_sign", gr_value: "zero", description: "fractional damping-time shift of the (2,2,0) mode" },
  ],
  mappings: [
    ringdownMapping("ringdown_frequency", "dfreq220", "dfreq220", "\\delta f/f = \\delta\\hat f_{220}", {
      held_fixed: { dtau220: 0 },
      validity: [{ expression: "abs(dfreq220)", max: 0.5, label: "shift small against the Kerr frequency", kind: "rule_of_thumb", reference: "project choice" }],
      source_status: "confirmed",
      references: ["gossan-veitch-sathyaprakash-2012", "berti-cardoso-will-2006"],
      notes: "Identity mapping: the coupling is the shift.",
    }),
    ringdownMapping("ringdown_damping", "dtau220", "dtau220", "\\delta\\tau/\\tau = \\delta\\hat\\tau_{220}", {
      held_fixed: { dfreq220: 0 },
      validity: [{ expression: "abs(dtau220)", max: 0.5, label: "shift small against the Kerr damping time", kind: "rule_of_thumb", reference: "project choice" }],
      source_status: "confirmed",
      references: ["gossan-veitch-sathyaprakash-2012", "berti-cardoso-will-2006"],
      notes: "Identity mapping: the coupling is the shift.",
    }),
  ],
  references: [RINGDOWN_REFS.gossan2012, RINGDOWN_REFS.bertiCardosoWill2006],
  needs_source_confirmation: true,
};

/**
 * The remnant counterpart of ringdown-deviation: a theory's shift of the true remnant's mass and spin,
 * as free parameters. With it the consistency page can ask which remnant shift a test would exclude,
 * and a theory's remnant mappings have a theory-agnostic reference point.
 */
export const remnantDeviation: TheoryEntryInput = {
  slug: "remnant-deviation",
  name: "Parameterised remnant deviation (theory-agnostic)",
  kind: "theory",
  family: "other",
  summary:
    "Fractional shifts of the remnant black hole's mass and spin away from the values general relativity predicts for the same binary, M_f = M_f,GR (1 + δM̂_f), χ_f = χ_f,GR (1 + δχ̂_f). Not a theory: the entry lets the consistency page ask which remnant shift an inspiral-merger-ringdown test would exclude.",
  assumptions: [
    "the remnant is still a Kerr black hole (its modes are Kerr modes at the shifted mass and spin)",
    "small shifts, read against the GR remnant fits for the same binary",
  ],
  couplings: [
    { symbol: "dMf_rem", latex: "\\delta\\hat M_f", dimension: 0, unit: "1", range: "any_sign", gr_value: "zero", description: "fractional shift of the remnant mass" },
    { symbol: "dchif_rem", latex: "\\delta\\hat\\chi_f", dimension: 0, unit: "1", range: "any_sign", gr_value: "zero", description: "fractional shift of the remnant spin" },
  ],
  mappings: [
    {
      kind: "remnant_mass",
      coupling: "dMf_rem",
      expression: "dMf_rem",
      latex: "\\delta M_f/M_f = \\delta\\hat M_f",
      held_fixed: { dchif_rem: 0 },
      validity: [{ expression: "abs(dMf_rem)", max: 0.3, label: "shift small against the remnant mass", kind: "rule_of_thumb", reference: "project choice" }],
      source_status: "confirmed",
      references: ["ghosh-et-al-2016"],
      notes: "Identity mapping: the coupling is the shift.",
    },
    {
      kind: "remnant_spin",
      coupling: "dchif_rem",
      expression: "dchif_rem",
      latex: "\\delta\\chi_f/\\chi_f = \\delta\\hat\\chi_f",
      held_fixed: { dMf_rem: 0 },
      validity: [{ expression: "abs(dchif_rem)", max: 0.3, label: "shift small against the remnant spin", kind: "rule_of_thumb", reference: "project choice" }],
      source_status: "confirmed",
      references: ["ghosh-et-al-2016"],
      notes: "Identity mapping: the coupling is the shift.",
    },
  ],
  references: [RINGDOWN_REFS.ghosh2016],
  needs_source_confirmation: true,
};

export const johannsenPsaltis: TheoryEntryInput = {
  slug: "johannsen-psaltis",
  name: "Johannsen-Psaltis parameterized black-hole spacetime (static, leading order)",
  kind: "parameterized_spacetime",
  family: "parameterized-black-hole",
  summary:
    "A Kerr-like metric deformed by h = ε₃ M³ r/Σ², which multiplies g_tt and g_rr only. In the static limit -g_tt = (1 - 2M/r)(1 + ε₃ M³/r³), g_rr = (1 + ε₃ M³/r³)/(1 - 2M/r). " +
    NAMING_TRAP,
  metric_latex: "-g_{tt} = \\left(1 - \\frac{2M}{r}\\right)\\left(1 + \\epsilon_3 \\frac{M^3}{r^3}\\right),\\quad g_{rr} = \\frac{1 + \\epsilon_3 M^3/r^3}{1 - 2M/r}",
  assumptions: [
    "static (non-spinning) limit, leading order in ε₃",
    "the same ε₃ for both bodies and the remnant",
    "inspiral: test-body binding energy and quadrupole flux with the modified Kepler law",
    "ringdown: eikonal (light-ring) estimate, rough at l = 2; a deformed metric without field equations has no unique perturbation equation",
    "metric functions as written are from memory",
  ],
  couplings: [{ symbol: "eps3", latex: "\\epsilon_3^{\\rm JP}", dimension: 0, unit: "1", range: "any_sign", gr_value: "zero", quoted: { form: "identity", symbol: "eps3", latex: "\\epsilon_3^{\\rm JP}", unit: "1" } }],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 2,
      b: -1,
      coupling: "eps3",
      expression: "(75/64)*eps3*eta^(-4/5)",
      latex: "\\beta = \\frac{75}{64}\\,\\epsilon_3\\,\\eta^{-4/5}",
      derivation: {
        kind: "energy_flux",
        order: 2,
        A: "eps3",
        B: "-2*eps3",
        note: "test-body binding energy E = E_GR [1 + ε₃ v⁴] and quadrupole flux with the modified Kepler law F = F_GR [1 - 2ε₃ v⁴] (our own derivation); the engine re-derives β",
      },
      body_rules: [{ kind: "derived_for", description: "a deformed black-hole metric", bodies: ["bh"] }],
      validity: [{ expression: "abs(eps3)", max: 1, label: "small deformation: |ε₃| below 1", kind: "rule_of_thumb", reference: "project choice" }],
      source_status: "derived",
      references: ["johannsen-psaltis-2011"],
      notes: "Our own derivation: E_b = -(1/2) μ v² [1 + ... + ε₃ v⁴], F = F_N [1 - 2ε₃ v⁴], giving a 2PN (b = -1) term.",
    },
    ringdownMapping("ringdown_frequency", "eps3", "eps3/54", "\\delta f_{220}/f_{220} \\approx \\epsilon_3/54", {
      validity: [{ expression: "abs(eps3)", max: 1, label: "small deformation: |ε₃| below 1", kind: "rule_of_thumb", reference: "project choice" }],
      source_status: "derived",
      references: ["cardoso-et-al-2009", "johannsen-psaltis-2011"],
      locator: "light ring r_c = 3M - ε₃ M/18, Ω_c shifted by +ε₃/54, Lyapunov exponent unchanged (our own derivation)",
      notes: "Eikonal estimate at first order: the damping time is unchanged at this order (no damping mapping). " + NAMING_TRAP,
    }),
  ],
  references: [RINGDOWN_REFS.johannsenPsaltis2011, RINGDOWN_REFS.cardoso2009],
  needs_source_confirmation: true,
};

/** Ringdown mappings added to the Johannsen 2013 entry (its inspiral mappings stay as published). */
export const johannsenRingdownMappings: MappingInput[] = [
  ringdownMapping("ringdown_frequency", "alpha13", "-alpha13/27", "\\delta f_{220}/f_{220} \\approx -\\alpha_{13}/27", {
    held_fixed: { eps3: 0 },
    validity: [{ expression: "abs(alpha13)", max: 1, label: "small deformation: |α₁₃| below 1", kind: "rule_of_thumb", reference: "project choice" }],
    source_status: "derived",
    references: ["cardoso-et-al-2009"],
    locator: "light ring r_c = 3M + α₁₃ M/9, Ω_c shifted by -α₁₃/27 (our own derivation)",
    notes: "Eikonal estimate at first order, α₅₂ = 0. " + NAMING_TRAP,
  }),
  ringdownMapping("ringdown_damping", "alpha13", "alpha13/27", "\\delta\\tau_{220}/\\tau_{220} \\approx \\alpha_{13}/27", {
    held_fixed: { eps3: 0 },
    validity: [{ expression: "abs(alpha13)", max: 1, label: "small deformation: |α₁₃| below 1", kind: "rule_of_thumb", reference: "project choice" }],
    source_status: "derived",
    references: ["cardoso-et-al-2009"],
    locator: "Lyapunov exponent shifted by -α₁₃/27 - α₅₂/18; τ ~ 1/λ (our own derivation)",
    notes: "Eikonal estimate at first order with α₅₂ = 0 (α₅₂ would add +α₅₂/18). " + NAMING_TRAP,
  }),
];

const EDGB_RINGDOWN_NOTE =
  "Eikonal (light-ring) estimate for a non-rotating remnant, our own first-order computation from the small-coupling static EdGB metric of Yunes & Stein 2011 " +
  "(-g_tt = f (1 + h), g_rr = (1 + k)/f, f = 1 - 2M/r; h = ζ/(3f) (M/r)³ [1 + 26 M/r + 66/5 (M/r)² + 96/5 (M/r)³ - 80 (M/r)⁴], " +
  "k = -ζ/f (M/r)² [1 + M/r + 52/3 (M/r)² + 2 (M/r)³ + 16/5 (M/r)⁴ - 368/3 (M/r)⁵]), with ζ = 16π α²/M⁴ at the remnant. " +
  "The metric coefficients are recalled from memory (source to be confirmed). Published QNM computations (Blazquez-Salcedo et al. 2016, Phys. Rev. D 94, 104024) " +
  "were not transcribed: their fits should replace this estimate once confirmed. Axial modes follow the light ring in EdGB at this order (Bryant et al. 2021, as we read its abstract); polar modes mix with the scalar.";

/**
 * Ringdown mappings added to the EdGB entry: Omega_c shifts by h(3M)/2 = (4397/21870) zeta_f (derived in
 * closed form from h above); the Lyapunov exponent by -0.0843 zeta_f (numerical light-ring computation of
 * the metric above; tests/api/convert-ringdown.test.ts repeats it), so tau by +0.0843 zeta_f.
 */
export const edgbRingdownMappings: MappingInput[] = [
  ringdownMapping("ringdown_frequency", "alpha", "(4397/21870)*16*pi*alpha^2/M_f^4", "\\delta f_{220}/f_{220} \\approx \\frac{4397}{21870}\\,\\zeta_f,\\ \\zeta_f = 16\\pi\\alpha^2/M_f^4", {
    validity: [
      { expression: "16*pi*alpha^2/M_f^4", max: 0.1, label: "small coupling at the remnant: 16π α²/M_f⁴ well below 1", kind: "rule_of_thumb", reference: "project choice" },
      { expression: "chi_f", max: 0.3, label: "non-rotating result: the remnant must spin slowly", kind: "hard", reference: "project choice: the shift was computed for a static black hole" },
    ],
    source_status: "memory",
    references: ["cardoso-et-al-2009"],
    locator: "light ring of the small-coupling static metric: Ω_c shifted by h(3M)/2 (our own derivation)",
    notes: EDGB_RINGDOWN_NOTE,
  }),
  ringdownMapping("ringdown_damping", "alpha", "0.0843*16*pi*alpha^2/M_f^4", "\\delta\\tau_{220}/\\tau_{220} \\approx 0.0843\\,\\zeta_f", {
    validity: [
      { expression: "16*pi*alpha^2/M_f^4", max: 0.1, label: "small coupling at the remnant: 16π α²/M_f⁴ well below 1", kind: "rule_of_thumb", reference: "project choice" },
      { expression: "chi_f", max: 0.3, label: "non-rotating result: the remnant must spin slowly", kind: "hard", reference: "project choice: the shift was computed for a static black hole" },
    ],
    source_status: "memory",
    references: ["cardoso-et-al-2009"],
    locator: "Lyapunov exponent of the small-coupling static metric, computed numerically (our own computation); τ ~ 1/λ",
    notes: EDGB_RINGDOWN_NOTE,
  }),
];
