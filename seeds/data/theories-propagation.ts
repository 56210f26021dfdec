/**
 * Catalogue entries whose correction accumulates during propagation: a massive graviton and
 * generic modified dispersion relations E^2 = p^2 + A p^alpha_md.
 *
 * Frames. The phase term is built from the observed frequency f and the redshifted chirp mass
 * Mc_z = (1+z) Mc, through u^3 = pi Mc_z f. Will 1998 (Phys. Rev. D 57, 2061) writes the massive
 * graviton term as -pi D / (lambda_g^2 (1+z) f) with D = D_0 of server/physics/cosmology.ts (which
 * already carries a (1+z) factor); substituting 1/f = pi Mc_z / u^3 gives
 * beta = -pi^2 D_0 Mc_z / ((1+z) lambda_g^2) = -pi^2 D_0 Mc / lambda_g^2 with Mc in the SOURCE
 * frame. Mirshekari, Yunes & Will 2012 give the same structure for any alpha_md, with
 * Mc_z^(1-alpha_md) / (1+z)^(1-alpha_md) = Mc^(1-alpha_md). The engine always hands mappings
 * source-frame masses, so a detector-frame input with its z gives the same limit as the
 * equivalent source-frame input. Using Mc_z here would overstate beta by (1+z)^(1-alpha_md).
 */
import { conditionText } from "../../common/symbol-text.ts";
import { PLANCK_C_EV_M } from "../../server/physics/units.ts";
import { REFS } from "./references.ts";
import type { TheoryEntry } from "./theory-entry.ts";

/** GW wavelength at the innermost stable circular orbit of the total mass, 6^(3/2) pi M (km). */
const ISCO_WAVELENGTH = "(6^(3/2)*pi*M)";

const FRAME_NOTE =
  "ℳ is the source-frame chirp mass and D₀/D_α carry the (1+z) factors; the converter derives source-frame masses from detector-frame input, so both inputs agree.";

export const massiveGraviton: TheoryEntry = {
  slug: "massive-graviton",
  name: "Massive graviton (propagation)",
  family: "massive gravity",
  summary:
    "A graviton mass m_g makes the group velocity frequency dependent, v_g² = 1 - (m_g c²/h f)². Low frequencies arrive late, a 1PN-like phase term that grows with distance.",
  assumptions: [
    "dispersion E² = p² c² + m_g² c⁴; generation unchanged",
    "h f ≫ m_g c² over the band",
    "flat ΛCDM distance D₀ (cosmology stored with each bound)",
  ],
  couplings: [
    {
      symbol: "lambda_g",
      latex: "\\lambda_g",
      dimension: "L",
      unit: "km",
      description: "graviton Compton wavelength h/(m_g c); m_g c² = h c/λ_g",
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
      latex: "\\beta = -\\frac{\\pi^2 D_0\\,\\mathcal{M}}{\\lambda_g^2}",
      frame_note: FRAME_NOTE,
      derivation: {
        kind: "propagation",
        order: 1,
        A: "1/lambda_g^2",
        note: "E² = p² + m_g², i.e. A = m_g² = (h/λ_g)² at α = 0: arrival-time delay D₀/(2λ_g² f²) in the stationary-phase approximation; the engine re-derives β from the dispersion relation",
      },
      validity: [
        {
          // m_g c^2 / (h f) = lambda_GW / lambda_g is largest at the lowest frequency of the band.
          expression: "1/(f_low*lambda_g)",
          max: 0.01,
          label: "h f ≫ m_g c² over the band: m_g c²/(h f_low) = (c/f_low)/λ_g below 0.01",
          kind: "rule_of_thumb",
          reference: "project choice: 0.01 stands for 'much less than 1'",
        },
      ],
      source_status: "derived",
      references: [REFS.will1998.key],
      notes: "Lower bound on λ_g (β ~ 1/λ_g²), i.e. upper bound on m_g.",
    },
  ],
  references: [REFS.will1998, REFS.lvc2016Tgr, REFS.lvk2021Gwtc3Tgr],
  reference_bounds: [
    {
      coupling: "lambda_g",
      quoted_symbol: "m_g",
      value: 1.2e-22,
      unit: "eV",
      side: "upper",
      reference: REFS.lvc2016Tgr.key,
      source_status: "confirmed",
      credibility: 0.9,
      note: "GW150914; the paper quotes λ_g > 1.03 × 10¹³ km alongside",
    },
    {
      coupling: "lambda_g",
      quoted_symbol: "m_g",
      value: 1.27e-23,
      unit: "eV",
      side: "upper",
      reference: REFS.lvk2021Gwtc3Tgr.key,
      source_status: "confirmed",
      credibility: 0.9,
      note: "GWTC-3 combined",
    },
  ],
};

/** Suffix-safe slug fragment for an exponent: 0.5 -> "0p5". */
function exponentSlug(a: number): string {
  return String(a).replace(".", "p");
}

function dispersionEntry(alphaMd: number, motivation: string): TheoryEntry {
  if (alphaMd === 1 || alphaMd === 2) throw new RangeError("alpha_md = 1 and 2 give b = 0 or 3, which are degenerate");
  const b = 3 * (alphaMd - 1);
  const tag = exponentSlug(alphaMd);
  const lambda = `lambda_A${tag.replace("p", "")}`;
  const power = 2 - alphaMd;
  // lambda_A carries the sign of A (A = sign(lambda_A) (h / |lambda_A|)^(2 - alpha)), so beta is odd in it.
  const expression = `pi^(${power})*D_alpha*Mc^(${1 - alphaMd})*${lambda}/((${alphaMd - 1})*abs(${lambda})^(${power + 1}))`;
  const side = power > 0 ? "lower" : "upper";
  return {
    slug: `dispersion-a${tag}`,
    name: `Modified dispersion relation, α = ${alphaMd}`,
    family: "Lorentz-violating",
    summary: conditionText(`Generic dispersion E² = p² + A p^${alphaMd} (c = 1) for gravitational waves, a frequency-dependent group velocity that dephases the signal over cosmological distances. ${motivation}`),
    assumptions: [
      "A p^(α - 2) ≪ 1 over the band; generation unchanged",
      "A may take either sign; λ_A carries the sign of A, and a signed interval on β maps to a signed interval on A",
      "flat ΛCDM distance D_α (cosmology stored with each bound)",
    ],
    couplings: [
      {
        symbol: lambda,
        latex: `\\lambda_A^{(${alphaMd})}`,
        dimension: "L",
        unit: "km",
        description: `length scale λ_A = h |A|^(1/(α - 2)), signed like A; |A| = (h c/|λ_A|)^(${power}) in eV^(${power}) (h c = ${PLANCK_C_EV_M.toPrecision(10)} eV m)`,
        quoted: { form: "dispersion_length", symbol: lambda, latex: "\\lambda_A", unit: "km", alpha_md: alphaMd },
        range: "any_sign",
        // A -> 0 is lambda_A -> infinity for alpha < 2 and lambda_A -> 0 for alpha > 2.
        gr_value: alphaMd < 2 ? "infinity" : "zero",
      },
    ],
    mappings: [
      {
        kind: "inspiral_phase",
        pn_order: (b + 5) / 2,
        b,
        alpha_md: alphaMd,
        expression,
        latex: `\\beta = \\frac{\\pi^{${power}}\\,D_{${alphaMd}}\\,\\mathcal{M}^{${1 - alphaMd}}}{(${alphaMd - 1})\\,\\lambda_A^{${power}}}`,
        frame_note: FRAME_NOTE,
        derivation: {
          kind: "propagation",
          order: (b + 5) / 2,
          A: `${lambda}*abs(${lambda})^(${alphaMd - 3})`,
          note: "A/h^(2 - α) = sgn(λ_A) |λ_A|^(α - 2) (λ_A signed like A); the engine re-derives β from the dispersion relation (particle speed p/E, as Mirshekari, Yunes & Will 2012)",
        },
        validity: [
          alphaMd < 2
            ? {
                // For alpha < 2 the correction A p^(alpha - 2) grows toward low frequency: evaluate it at f_low.
                expression: `(1/(f_low*abs(${lambda})))^(${power})`,
                max: 0.01,
                label: "A p^(α - 2) ≪ 1 over the band, evaluated at f_low where it is largest",
                kind: "rule_of_thumb" as const,
                reference: "project choice: 0.01 stands for 'much less than 1'",
              }
            : {
                // For alpha > 2 it grows toward high frequency: the ISCO is the end of the inspiral band.
                expression: `(${ISCO_WAVELENGTH}/abs(${lambda}))^(${power})`,
                max: 0.01,
                label: "A p^(α - 2) ≪ 1 over the band, evaluated at the GW wavelength of the ISCO where it is largest",
                kind: "rule_of_thumb" as const,
                reference: "project choice: 0.01 stands for 'much less than 1'",
              },
        ],
        source_status: "derived",
        references: [REFS.mirshekariYunesWill2012.key],
        notes: `${side === "lower" ? "Lower" : "Upper"} bound on |λ_A|; an upper bound on |A| either way, and a signed interval on A from a signed interval on β.`,
      },
    ],
    references: [REFS.mirshekariYunesWill2012, REFS.lvk2021Gwtc3Tgr],
  };
}

export const dispersionEntries: readonly TheoryEntry[] = [
  dispersionEntry(0.5, "Listed among the exponents tested on GW catalogues."),
  dispersionEntry(1.5, "Listed among the exponents tested on GW catalogues."),
  dispersionEntry(2.5, "Motivated by multifractional spacetimes (attribution from memory)."),
  dispersionEntry(3, "Motivated by doubly special relativity (attribution from memory)."),
  dispersionEntry(4, "Motivated by extra-dimensional theories and Horava-Lifshitz gravity (attribution from memory)."),
];
