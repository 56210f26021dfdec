/**
 * Second batch, effects on how the wave travels: dispersion with alpha = 3.5, a frequency-independent
 * speed of gravitational waves, and the massive graviton at two orders (propagation at b = -3 and the
 * Yukawa binding at b = -9). Written in the submission shape; published by seeds/catalogue-wave2.ts.
 *
 * Propagation terms follow Mirshekari, Yunes & Will 2012 with the particle speed p/E, re-derived by the
 * engine from the dispersion relation: beta = pi^(2 - a) D_a Acal Mc^(1 - a) / (a - 1), b = 3 (a - 1),
 * Acal = A / h^(2 - a), Mc source frame.
 *
 * alpha = 1 is not seeded: there the phase is 3 pi D_1 Acal ln u, a logarithm rather than a power of
 * u, so no ppE bound at one b constrains it (the engine's derivation refuses it and says so).
 */
import type { TheoryEntryInput } from "../../common/catalogue.ts";
import { defineEntry, intervalBounds, ruleOfThumb } from "./entry-parts.ts";
import { FIRST, WAVE2_LIBRARY, WAVE2_REFS } from "./references-wave2.ts";

/**
 * The GW170817 speed interval has no credibility on purpose: it is not a credible interval but the range
 * allowed by the 1.74 s delay and an assumed emission delay of 0 to 10 s, asymmetric for that reason.
 */
const GW170817_SPEED_NOTE =
  "no credibility on purpose: not a credible interval, but the range allowed by the 1.74 s delay between the signals and an assumed emission delay of 0 to 10 s (hence asymmetric)";

const FRAME_NOTE =
  "ℳ is the source-frame chirp mass and D_α carries the (1+z) factors (Mirshekari, Yunes & Will 2012); the converter derives source-frame masses from detector-frame input, so both inputs agree.";

export const dispersionA35: TheoryEntryInput = defineEntry({
  slug: "dispersion-a3p5",
  name: "Modified dispersion relation, α = 3.5",
  family: "lorentz-violating",
  summary:
    "Generic dispersion E² = p² + A p^3.5 (c = 1) for gravitational waves, one of the exponents tested on GW catalogues. High frequencies travel at a different speed, a +6.25PN-like phase term (b = 7.5) that grows with distance.",
  assumptions: [
    "A p^(α - 2) ≪ 1 over the band; generation unchanged",
    "A may take either sign; λ_A carries the sign of A, |A| = (h/|λ_A|)^(2 - α)",
    "particle speed v = p/E, as Mirshekari, Yunes & Will 2012 (the group velocity would multiply β by 1 - α = -2.5)",
    "flat ΛCDM distance D_α (cosmology stored with each bound)",
  ],
  couplings: [
    {
      symbol: "lambda_A35",
      latex: "\\lambda_A^{(3.5)}",
      dimension: 1,
      unit: "km",
      description: "length scale λ_A = h |A|^(1/(α - 2)), signed like A; for α > 2, GR is λ_A → 0",
      quoted: { form: "dispersion_length", symbol: "lambda_A35", latex: "\\lambda_A", unit: "km", alpha_md: 3.5 },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 6.25,
      b: 7.5,
      alpha_md: 3.5,
      expression: "pi^(-1.5)*D_alpha*Mc^(-2.5)*lambda_A35/(2.5*abs(lambda_A35)^(-0.5))",
      latex: "\\beta = \\frac{\\pi^{-3/2}\\,D_{3.5}\\,\\mathcal{M}^{-5/2}\\,\\mathrm{sgn}(\\lambda_A)\\,|\\lambda_A|^{3/2}}{5/2}",
      frame_note: FRAME_NOTE,
      derivation: {
        kind: "propagation",
        order: 6.25,
        A: "lambda_A35*abs(lambda_A35)^(0.5)",
        note: "A/h^(2 - α) = sgn(λ_A) |λ_A|^(α - 2) = sgn(λ_A) |λ_A|^1.5; the engine re-derives β from the dispersion relation",
      },
      validity: [
        ruleOfThumb(
          "(abs(lambda_A35)/(6^(3/2)*pi*M))^(1.5)",
          "A p^(α - 2) ≪ 1 over the band, evaluated at the GW wavelength of the ISCO where it is largest (α > 2)",
          { max: 0.01 },
        ),
      ],
      source_status: "derived",
      references: [FIRST.mirshekari.key],
      notes: "Upper bound on |λ_A| and on |A|; a signed interval on β maps to a signed interval on A.",
    },
  ],
}, WAVE2_LIBRARY, [FIRST.lvkGwtc3]);

export const gwSpeed: TheoryEntryInput = defineEntry({
  slug: "gw-speed",
  name: "Speed of gravitational waves (frequency independent)",
  family: "lorentz-violating",
  summary:
    "Gravitational waves travelling at a constant speed c_g different from c: the dispersion E² = (1 + A) p² with A = -2 (c_g - c)/c, the α = 2 case. The arrival time shifts by the same amount at every frequency, which the coalescence time absorbs: a GW signal alone cannot bound it (b = 3). The bound comes from comparing the arrival of a gravitational and an electromagnetic signal.",
  assumptions: [
    "|c_g - c| ≪ c, independent of frequency",
    "particle speed v = p/E = 1 - A/2 (Mirshekari, Yunes & Will 2012 at α = 2)",
    "the phase term at b = 3 is degenerate with the coalescence time: no phase bound exists; the reference bound is multimessenger",
  ],
  couplings: [
    {
      symbol: "delta_cg",
      latex: "(c_g - c)/c",
      dimension: 0,
      unit: "1",
      description: "fractional difference of the speed of gravitational waves from the speed of light",
      quoted: { form: "identity", symbol: "delta_cg", latex: "(c_g - c)/c", unit: "1" },
      range: "any_sign",
      gr_value: "zero",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 4,
      b: 3,
      alpha_md: 2,
      expression: "-2*D_alpha*delta_cg/Mc",
      latex: "\\beta = -\\frac{2\\,D_{2}}{\\mathcal{M}}\\,\\frac{c_g - c}{c}",
      frame_note: FRAME_NOTE,
      derivation: {
        kind: "propagation",
        order: 4,
        A: "-2*delta_cg",
        note: "E² = (1 + A) p² gives v = 1 - A/2, so A = -2 (c_g - c)/c at α = 2; the engine re-derives β and notes the degeneracy",
      },
      validity: [ruleOfThumb("abs(delta_cg)", "|c_g - c| ≪ c", { max: 0.01 })],
      source_status: "derived",
      references: [FIRST.mirshekari.key],
      notes: "b = 3 is degenerate with the coalescence time: this mapping documents the term, and the translator gives no limit from a phase bound. Use the GW-EM arrival-time bound.",
    },
  ],
  reference_bounds: intervalBounds(
    {
      coupling: "delta_cg",
      quoted_symbol: "delta_cg",
      unit: "1",
      data: "GW170817 and GRB 170817A arrival times, emission delay 0-10 s assumed",
      reference: WAVE2_REFS.gw170817Grb.key,
      source_status: "memory",
      note: GW170817_SPEED_NOTE,
    },
    -3e-15,
    7e-16,
  ),
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);

export const massiveGravitonTwoOrders: TheoryEntryInput = defineEntry({
  slug: "massive-graviton-yukawa",
  name: "Massive graviton at two orders: propagation and Yukawa binding",
  family: "massive-gravity",
  summary:
    "A graviton mass both delays low frequencies on the way (b = -3, 1PN) and, in theories without screening, turns the Newtonian potential into a Yukawa potential -(M/r) exp(-r/λ_g), which changes the binding energy and Kepler's law at -2PN (b = -9). One coupling, two mappings: a ppE bound at one b uses the term at that b only.",
  assumptions: [
    "dispersion E² = p² + m_g² (c = 1) for the propagation term",
    "static potential -(M/r) exp(-r/λ_g) with the orbit well inside λ_g, expanded to (r/λ_g)²; the constant term exerts no force and the 1/r normalisation is absorbed in the measured masses",
    "quadrupole flux of GR evaluated on the modified orbit; the mass correction to the radiation itself enters at -3PN (b = -11) and is not included",
    "no Vainshtein screening: in nonlinear massive gravity (dRGT) screening suppresses the Yukawa term inside the Vainshtein radius and the b = -9 mapping does not apply",
  ],
  couplings: [
    {
      symbol: "lambda_g",
      latex: "\\lambda_g",
      dimension: 1,
      unit: "km",
      description: "graviton Compton wavelength h/(m_g c); GR at λ_g → infinity",
      quoted: { form: "graviton_wavelength", symbol: "lambda_g", latex: "\\lambda_g", unit: "km" },
      range: "positive",
      gr_value: "infinity",
    },
  ],
  mappings: [
    {
      kind: "inspiral_phase",
      pn_order: 1,
      b: -3,
      alpha_md: 0,
      expression: "-pi^2*D_0*Mc/lambda_g^2",
      latex: "\\beta_{-3} = -\\frac{\\pi^2 D_0\\,\\mathcal{M}}{\\lambda_g^2}",
      frame_note: FRAME_NOTE,
      derivation: { kind: "propagation", order: 1, A: "1/lambda_g^2", note: "A = m_g² = (h/λ_g)² at α = 0 (Will 1998)" },
      validity: [ruleOfThumb("1/(f_low*lambda_g)", "h f ≫ m_g c² over the band: the GW wavelength at f_low far below λ_g", { max: 0.01 })],
      source_status: "derived",
      references: [FIRST.will1998.key],
      notes: "The same term as the 'massive-graviton' entry, listed here beside the binding term of the same coupling.",
    },
    {
      kind: "inspiral_phase",
      pn_order: -2,
      b: -9,
      expression: "-(5/576)*eta^(4/5)*M^2/lambda_g^2",
      latex: "\\beta_{-9} = -\\frac{5}{576}\\,\\eta^{4/5}\\,\\frac{M^2}{\\lambda_g^2}",
      derivation: {
        kind: "energy_flux",
        order: -2,
        A: "(5/3)*M^2/lambda_g^2",
        B: "-(2/3)*M^2/lambda_g^2",
        note: "Potential -(M/r)(1 + r²/(2λ_g²)) up to a constant: ω² = (M/r³)(1 - x/2), x = r²/λ_g²; then M/r = v² (1 + x/6), E = -(1/2) μ v² [1 + (5/3) x] and the quadrupole flux (32/5) η² v¹⁰ [1 - (2/3) x], x = M² v⁻⁴/λ_g² (our own derivation)",
      },
      validity: [ruleOfThumb("M*(pi*M*f_low)^(-2/3)/lambda_g", "orbit well inside the Yukawa range: r/λ_g small at the band's low end, r = M (π M f_low)^(-2/3)")],
      source_status: "derived",
      references: [WAVE2_REFS.deRham2017.key, FIRST.will1998.key],
      notes:
        "Our own derivation from a pure Yukawa potential. Applies only to massive-gravity theories without screening: in dRGT-type theories the Vainshtein mechanism suppresses this term. A ppE bound at b = -9 constrains it alone, the b = -3 term is left out (and vice versa); the propagation term is the usual GW bound.",
    },
  ],
  reference_bounds: [
    {
      coupling: "lambda_g",
      quoted_symbol: "m_g",
      value: 6.8e-23,
      unit: "eV",
      side: "upper",
      credibility: 0.9,
      data: "planetary ephemeris INPOP (Yukawa potential in the Solar System)",
      reference: WAVE2_REFS.bernus2019.key,
      source_status: "memory",
      note: "a static (Yukawa) bound, comparable with the b = -9 mapping, not with the propagation term",
    },
  ],
  needs_source_confirmation: true,
}, WAVE2_LIBRARY);
