/**
 * Amplitude entries: effects that change the wave's amplitude rather than (only) its phase. Published
 * once by the seed step "catalogue-amplitude" (seeds/amplitude-catalogue.ts).
 *
 * - amplitude birefringence from gravitational parity violation (one circular polarisation grows,
 *   the other decays as the wave travels): a ppE amplitude term at a = 3;
 * - modified friction / a running Planck mass: the luminosity distance read from the wave differs from
 *   the electromagnetic one. A ratio r = d_L^GW / d_L^EM is the amplitude term at a = 0,
 *   alpha = 1/r - 1 (derived: the wave's amplitude is GR's at d_L^EM times d_L^EM / d_L^GW), so both
 *   parametrisations of the literature are amplitude mappings at a = 0;
 * - the amplitude of dipole radiation (a flux change at -1PN): the frequency-drift piece, derived by the
 *   engine from the flux, at a = -2.
 *
 * What the abstracts we could read confirm is marked confirmed; the rest says "from memory".
 */
import type { ReferenceInput, TheoryEntryInput } from "../../common/catalogue.ts";
import { asInput } from "./references-wave2.ts";
import { REFS } from "./references.ts";

type Ref = ReferenceInput & { key: string };

export const AMPLITUDE_REFS = {
  alexanderFinnYunes2008: {
    key: "alexander-finn-yunes-2008",
    arxiv: "0712.2542",
    doi: "10.1103/PhysRevD.78.066005",
    authors: ["S. Alexander", "L. S. Finn", "N. Yunes"],
    title: "A gravitational-wave probe of effective quantum gravity",
    year: 2008,
    journal: "Phys. Rev. D",
    volume: "78",
    pages: "066005",
    locator: "amplitude birefringence of a Chern-Simons term accumulating with distance",
    note: "Title, authors and arXiv id confirmed from the abstract; journal details from memory.",
    details_from_memory: true,
  },
  yunesOShaughnessyOwenAlexander2010: {
    key: "yunes-oshaughnessy-owen-alexander-2010",
    arxiv: "1005.3310",
    doi: "10.1103/PhysRevD.82.064017",
    authors: ["N. Yunes", "R. O'Shaughnessy", "B. J. Owen", "S. Alexander"],
    title: "Testing gravitational parity violation with coincident gravitational waves and short gamma-ray bursts",
    year: 2010,
    journal: "Phys. Rev. D",
    volume: "82",
    pages: "064017",
    locator: "left/right circular polarisations with different amplitude evolution; GW vs EM distance",
    note: "Title, authors and arXiv id confirmed from the abstract; journal details from memory.",
    details_from_memory: true,
  },
  okounkova2022: {
    key: "okounkova-farr-isi-stein-2022",
    arxiv: "2101.11153",
    doi: "10.1103/PhysRevD.106.044067",
    authors: ["M. Okounkova", "W. M. Farr", "M. Isi", "L. C. Stein"],
    title: "Constraining gravitational wave amplitude birefringence and Chern-Simons gravity with GWTC-2",
    year: 2022,
    journal: "Phys. Rev. D",
    volume: "106",
    pages: "044067",
    locator: "opacity parameter κ ≲ 0.74/Gpc (abstract)",
    note: "The bound on κ is confirmed from the abstract; the arXiv id, author list and journal details are from memory.",
    details_from_memory: true,
  },
  ngIsiWongFarr2023: {
    key: "ng-isi-wong-farr-2023",
    arxiv: "2305.05844",
    authors: ["K. K. Y. Ng", "M. Isi", "K. W. K. Wong", "W. M. Farr"],
    title: "Constraining gravitational wave amplitude birefringence with GWTC-3",
    year: 2023,
    locator: "κ = -0.019 +0.038 -0.029/Gpc at 100 Hz, 90% credibility, 71 binary black holes (abstract)",
    note: "Title, arXiv id and the bound are confirmed from the abstract; the first authors' initials and the journal are from memory.",
    details_from_memory: true,
  },
  belgacem2018: {
    key: "belgacem-dirian-foffa-maggiore-2018",
    arxiv: "1805.08731",
    doi: "10.1103/PhysRevD.98.023510",
    authors: ["E. Belgacem", "Y. Dirian", "S. Foffa", "M. Maggiore"],
    title: "Modified gravitational-wave propagation and standard sirens",
    year: 2018,
    journal: "Phys. Rev. D",
    volume: "98",
    pages: "023510",
    locator: "the (Ξ₀, n) parametrisation of d_L^GW/d_L^EM",
    note: "The two-parameter (Ξ₀, n) parametrisation is confirmed from the abstract; its formula, the authors' list and the journal details are from memory.",
    details_from_memory: true,
  },
  lagos2019: {
    key: "lagos-fishbach-landry-holz-2019",
    arxiv: "1901.03321",
    doi: "10.1103/PhysRevD.99.083504",
    authors: ["M. Lagos", "M. Fishbach", "P. Landry", "D. E. Holz"],
    title: "Standard sirens with a running Planck mass",
    year: 2019,
    journal: "Phys. Rev. D",
    volume: "99",
    pages: "083504",
    locator: "c_M = -9 +21 -28 from GW170817 (68.3% credibility, abstract)",
    note: "Title, authors, arXiv id and the GW170817 bound are confirmed from the abstract; the α_M parametrisation and the journal details are from memory.",
    details_from_memory: true,
  },
} as const satisfies Record<string, Ref>;

const A = AMPLITUDE_REFS;
const yunesPretorius2009 = asInput(REFS.yunesPretorius2009);
const tahuraYagi2018 = asInput(REFS.tahuraYagi2018);

// ---------------------------------------------------------------------------------------------
// Amplitude birefringence

/**
 * The right-handed circular polarisation (say) grows as exp(+kappa d_C f / f_ref) and the left-handed
 * one decays as exp(-kappa d_C f / f_ref), with kappa the opacity in 1/Gpc at f_ref = 100 Hz (the units
 * are confirmed by both abstracts; the exponential form with the comoving distance d_C is from memory).
 * To first order the growing polarisation's amplitude is 1 + kappa d_C f / f_ref = 1 + alpha u^3 with
 * u^3 = pi Mc_z f (detector-frame chirp mass, observed frequency), so alpha = kappa d_C / (pi Mc_z f_ref)
 * = kappa D_2 / (pi Mc f_ref) with D_2 = d_C / (1 + z) the distance measure at alpha_md = 2 and Mc the
 * source-frame chirp mass (derived).
 */
export const amplitudeBirefringence: TheoryEntryInput = {
  slug: "amplitude-birefringence",
  name: "Amplitude birefringence (gravitational parity violation)",
  family: "other",
  summary:
    "Parity-violating gravity (a Chern-Simons term, and other parity-odd corrections) makes left- and right-handed circularly polarised waves grow and decay differently as they travel: amplitude birefringence. The effect accumulates with distance and frequency. Its first-order term is a ppE amplitude correction at a = 3, opposite for the two circular polarisations.",
  assumptions: [
    "the circular polarisation amplitudes change as exp(± κ d_C f / 100 Hz) with the comoving distance d_C (form from memory; κ in 1/Gpc at 100 Hz, as the GWTC-2 and GWTC-3 analyses quote it)",
    "to first order in κ d_C f / 100 Hz (the ppE amplitude term); the speed of both polarisations is c (no velocity birefringence)",
    "generation unchanged; flat ΛCDM distances",
  ],
  couplings: [
    {
      symbol: "kappa",
      latex: "\\kappa",
      dimension: "1",
      unit: "1/Gpc",
      description:
        "opacity κ in 1/Gpc at the reference frequency 100 Hz (the number quoted by the literature; the mapping carries the unit conversions 1 Gpc = 3.0857 × 10²² km and 100 Hz = 3.3356 × 10⁻⁴/km, so κ enters as a pure number). Its sign says which circular polarisation grows.",
      quoted: { form: "identity", symbol: "kappa", latex: "\\kappa", unit: "1/Gpc" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  definitions: [
    { symbol: "Gpc_km", expression: "3.0856775814913673e22", description: "kilometres in one gigaparsec (IAU 2015 parsec)" },
    { symbol: "f_ref", expression: "3.3356409519815204e-4", description: "the reference frequency 100 Hz as 1/length in 1/km (100 / 299792.458)" },
  ],
  mappings: [
    {
      kind: "inspiral_amplitude",
      pn_order: 1.5,
      a: 3,
      alpha_md: 2,
      expression: "kappa*D_alpha/(Gpc_km*pi*Mc*f_ref)",
      latex: "\\alpha = \\frac{\\kappa\\, D_{2}}{\\pi\\,\\mathcal{M}\\, f_{\\rm ref}}, \\quad f_{\\rm ref} = 100\\,\\mathrm{Hz},\\ D_2 = d_C/(1+z)",
      frame_note:
        "α multiplies u³ = π ℳ_z f with the detector-frame chirp mass; written with the source-frame ℳ and D₂ = d_C/(1+z), which is the same number.",
      validity: [
        {
          // kappa d_C f / f_ref is largest at the top of the inspiral; at the ISCO u^3 = eta^(3/5) 6^(-3/2),
          // so |alpha| u^3 = |kappa| D_2 / (Gpc_km pi M f_ref 6^(3/2)).
          expression: "abs(kappa)*D_alpha/(Gpc_km*pi*M*f_ref*6^(3/2))",
          max: 0.1,
          label: "first order in the exponent: |κ| d_C f / 100 Hz below 0.1 up to the ISCO frequency",
          kind: "rule_of_thumb",
          reference: "project choice: 0.1 stands for 'much less than 1' (the exponential is linearised)",
        },
      ],
      caution:
        "Amplitude birefringence has opposite signs for the two circular polarisations: this α is the growing one's (the other has -α), so a bound on |α| from a signal dominated by one circular polarisation (a face-on or face-off binary) bounds |κ|; a signal that mixes both needs the mapping at the level of the detector response. The exponential form with d_C is from memory.",
      source_status: "memory",
      references: [A.okounkova2022.key, A.ngIsiWongFarr2023.key, A.yunesOShaughnessyOwenAlexander2010.key, A.alexanderFinnYunes2008.key],
      locator: "first-order expansion of exp(κ d_C f / 100 Hz) (derived); the form and units from the abstracts",
      notes:
        "The Chern-Simons length scale the GWTC-2 analysis also bounds (l₀ ≲ 1.0 × 10³ km) follows from κ through the theory's scalar-field evolution, which is not written here.",
    },
  ],
  references: [A.alexanderFinnYunes2008, A.yunesOShaughnessyOwenAlexander2010, A.okounkova2022, A.ngIsiWongFarr2023, yunesPretorius2009],
  reference_bounds: [
    {
      coupling: "kappa",
      quoted_symbol: "kappa",
      value: 0.74,
      unit: "1/Gpc",
      side: "upper",
      credibility: 0.9,
      data: "GWTC-2 binary black holes",
      reference: A.okounkova2022.key,
      source_status: "memory",
      note: "the value is confirmed from the abstract (κ ≲ 0.74/Gpc); the credible level (90%) and that it bounds |κ| are from memory",
    },
    {
      coupling: "kappa",
      quoted_symbol: "kappa",
      value: 0.048,
      unit: "1/Gpc",
      side: "upper",
      credibility: 0.9,
      data: "GWTC-3, 71 binary black holes",
      reference: A.ngIsiWongFarr2023.key,
      source_status: "confirmed",
      note: "κ = -0.019 +0.038 -0.029/Gpc at 100 Hz (90% credibility, abstract): the interval [-0.048, 0.019]; 0.048 is its wider side, as a bound on |κ|",
    },
  ],
};

// ---------------------------------------------------------------------------------------------
// Modified friction / running Planck mass

/**
 * Two parametrisations of the same effect, each a coupling of its own (one row each; the other is held
 * at its GR value, which is what the translator does for several couplings at one exponent):
 *
 * - c_M (Lagos et al. 2019): alpha_M = dln M_*^2 / dln a = c_M Omega_L(z) / Omega_L0 (form from memory),
 *   d_L^GW / d_L^EM = exp((1/2) int_0^z alpha_M / (1 + z') dz'). With Omega_L(z)/Omega_L0 = 1/E^2 in flat
 *   Lambda-CDM, int_0^z dz' / ((1 + z') E^2) = ln((1 + z)^3 / E^2) / (3 Omega_L0) (derived), so
 *   r = [(1 + z)^3 / E^2(z)]^(c_M / (6 Omega_L0)) and alpha = 1/r - 1.
 * - Xi_0, n (Belgacem et al. 2018): r = Xi_0 + (1 - Xi_0) / (1 + z)^n (form from memory); the coupling is
 *   Xi_0 - 1 (GR: 0) with n held at 5/2, alpha = 1/r - 1.
 */
export const modifiedFriction: TheoryEntryInput = {
  slug: "modified-friction",
  name: "Modified GW friction (running Planck mass)",
  family: "scalar-tensor",
  summary:
    "Theories with a time-varying effective Planck mass (Horndeski-type scalar-tensor dark energy, nonlocal gravity, and others) change the friction term of gravitational waves travelling through the expanding universe, so the luminosity distance read from a wave's amplitude differs from the electromagnetic luminosity distance of its source. With a counterpart or host galaxy, the ratio d_L^GW/d_L^EM at the source's redshift bounds the theory. Two parametrisations: c_M (a running Planck mass that tracks dark energy) and (Ξ₀, n).",
  assumptions: [
    "GWs travel at the speed of light; only the friction (amplitude damping) changes",
    "flat ΛCDM background with the request's Ω_m (the background expansion is GR's)",
    "c_M: α_M = c_M Ω_Λ(z)/Ω_Λ,0 (form from memory); Ξ₀: r = Ξ₀ + (1 - Ξ₀)(1 + z)^(-n) with n = 5/2 (form and value from memory)",
    "a distance ratio r is the ppE amplitude term at a = 0, α = 1/r - 1 (derived)",
  ],
  couplings: [
    {
      symbol: "c_M",
      latex: "c_M",
      dimension: "1",
      unit: "1",
      description: "running of the Planck mass, α_M = c_M Ω_Λ(z)/Ω_Λ,0 (Lagos et al. 2019); c_M = 0 is GR",
      quoted: { form: "identity", symbol: "c_M", latex: "c_M", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
    {
      symbol: "dXi0",
      latex: "\\Xi_0 - 1",
      dimension: "1",
      unit: "1",
      description: "Ξ₀ - 1 of the (Ξ₀, n) parametrisation (Belgacem et al. 2018); GR has Ξ₀ = 1",
      quoted: { form: "identity", symbol: "dXi0", latex: "\\Xi_0 - 1", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  definitions: [
    { symbol: "E2", expression: "Omega_m*(1 + z)^3 + 1 - Omega_m", description: "E²(z) = H²/H₀² of flat ΛCDM" },
    { symbol: "n_Xi", expression: "5/2", description: "the exponent n of the (Ξ₀, n) parametrisation, held at 5/2 (value from memory); at z ≪ 1 a limit on Ξ₀ - 1 scales as 1/n" },
  ],
  mappings: [
    {
      kind: "inspiral_amplitude",
      pn_order: 0,
      a: 0,
      coupling: "c_M",
      expression: "((1 + z)^3/E2)^(-c_M/(6*(1 - Omega_m))) - 1",
      latex: "\\alpha = \\frac{d_L^{\\rm EM}}{d_L^{\\rm GW}} - 1 = \\left[\\frac{(1+z)^3}{E^2(z)}\\right]^{-c_M/(6\\Omega_\\Lambda)} - 1",
      caution:
        "The distance ratio is translated at the source's redshift with the request's Ω_m. c_M and Ξ₀ are alternative parametrisations of one effect: each row is the bound in one of them, not a joint bound.",
      source_status: "memory",
      references: [A.lagos2019.key],
      locator: "d_L^GW/d_L^EM = exp((1/2) int α_M dz/(1+z)) with α_M = c_M Ω_Λ(z)/Ω_Λ,0 (form from memory); the integral in closed form is derived",
      notes:
        "No validity condition: the ratio is exact in c_M for the stated background, so the verdict is 'not assessed'. The parametrisation itself (α_M tracking dark energy) is the assumption.",
    },
    {
      kind: "inspiral_amplitude",
      pn_order: 0,
      a: 0,
      coupling: "dXi0",
      expression: "1/(1 + dXi0*(1 - (1 + z)^(-n_Xi))) - 1",
      latex: "\\alpha = \\frac{1}{1 + (\\Xi_0 - 1)\\left[1 - (1+z)^{-n}\\right]} - 1, \\quad n = 5/2",
      validity: [
        {
          expression: "-dXi0",
          max: 1,
          label: "Ξ₀ > 0: the parametrisation's ratio stays positive at every redshift",
          kind: "hard",
          reference: "the ratio d_L^GW / d_L^EM tends to Xi_0 at high redshift, so Xi_0 must be positive",
        },
      ],
      caution:
        "n is held at 5/2 (value from memory). At low redshift the ratio is 1 + (Ξ₀ - 1) n z, so the limit on Ξ₀ - 1 scales as 1/n: for another n, multiply by 2.5/n.",
      source_status: "memory",
      references: [A.belgacem2018.key],
      locator: "Ξ(z) = Ξ₀ + (1 - Ξ₀)/(1 + z)^n (form from memory)",
    },
  ],
  references: [A.lagos2019, A.belgacem2018, yunesPretorius2009],
  reference_bounds: [
    {
      coupling: "c_M",
      quoted_symbol: "c_M",
      value: 37,
      unit: "1",
      side: "upper",
      credibility: 0.683,
      data: "GW170817 with its host galaxy, Planck H₀ as a prior",
      reference: A.lagos2019.key,
      source_status: "confirmed",
      note: "c_M = -9 +21 -28 (68.3% credibility, abstract): the interval [-37, 12]; 37 is its wider side, as a bound on |c_M|",
    },
  ],
};

// ---------------------------------------------------------------------------------------------
// Dipole radiation: the amplitude

/**
 * A flux change F = F_GR [1 + B v^-2] speeds up the frequency drift: df/dt = GR [1 + gamma u^-2] with
 * gamma = B eta^(2/5); the stationary-phase amplitude goes as (df/dt)^(-1/2), so alpha = -gamma/2 =
 * -(1/2) eta^(2/5) B at a = -2 (derived; the engine re-derives it from the flux). A flux change leaves the
 * Kepler law alone, so the drift piece is the whole correction to the quadrupole harmonic.
 */
export const dipoleAmplitude: TheoryEntryInput = {
  slug: "dipole-amplitude",
  name: "Dipole radiation: amplitude correction",
  family: "scalar-tensor",
  summary:
    "The amplitude companion of the generic dipole entry: an extra dipole flux F = F_GR [1 + B v⁻²] makes the binary sweep faster through each frequency, which lowers the frequency-domain amplitude, α = -(1/2) η^(2/5) B at a = -2. Derived from the flux through the frequency drift (the drift piece); the phase term of the same B is the entry 'Generic dipole radiation' (b = -7).",
  assumptions: [
    "the extra flux is a small correction at every frequency analysed",
    "the binding energy is unchanged at -1PN, so the Kepler law and the wave's own amplitude at a given frequency are GR's",
    "the dipole harmonic at the orbital frequency is left out (it is not part of the ppE quadrupole amplitude)",
  ],
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
      kind: "inspiral_amplitude",
      pn_order: -1,
      a: -2,
      expression: "-(1/2)*eta^(2/5)*B_dip",
      latex: "\\alpha = -\\frac{1}{2}\\,\\eta^{2/5} B",
      derivation: {
        kind: "energy_flux",
        order: -1,
        A: "0",
        B: "B_dip",
        note: "the frequency-drift piece α = -γ/2, γ = [B - (k+1) A] η^(-2k/5) at a = 2k; the Kepler-law piece is absent for a flux change",
      },
      validity: [
        {
          expression: "abs(B_dip)*(pi*M*f_low)^(-2/3)",
          max: 0.1,
          label: "dipole flux small against the quadrupole flux over the band: |B| v⁻² below 0.1 at the band's low end, v = (π M f_low)^(1/3)",
          kind: "rule_of_thumb",
          reference: "project choice: 0.1 stands for 'much less than 1'",
        },
      ],
      caution:
        "Drift piece only: the amplitude follows from the phase's frequency drift, α = -γ/2. For a flux change this is the whole quadrupole-amplitude correction at leading order; for a theory that also changes the binding energy, the conservative (Kepler-law) piece of Tahura & Yagi 2018 is left out.",
      source_status: "derived",
      references: [yunesPretorius2009.key, tahuraYagi2018.key],
      locator: "α = -γ/2 at a = b + 5 from the stationary-phase amplitude (derived)",
    },
  ],
  references: [yunesPretorius2009, tahuraYagi2018],
};

export const THEORIES_AMPLITUDE: readonly TheoryEntryInput[] = [amplitudeBirefringence, modifiedFriction, dipoleAmplitude];
