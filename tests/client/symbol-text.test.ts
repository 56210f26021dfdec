import { describe, expect, it } from "vitest";
import { conditionText, identifierText, latexText, symbolText, texText } from "../../common/symbol-text.ts";

describe("symbols and conditions as a physicist writes them (common/symbol-text.ts, used by server and client)", () => {
  it("when a coupling's TeX is shown where KaTeX cannot go (plot labels), then it reads as symbols, not code names", () => {
    expect(texText("\\sqrt{\\alpha}")).toBe("√α");
    expect(texText("\\dot{M}_{\\rm loss}")).toBe("Ṁₗₒₛₛ"); // M with a dot above, then a subscript
    expect(texText("\\lambda_g")).toBe("λ_g");
    expect(texText("\\xi^{1/4}")).toBe("ξ¹ᐟ⁴");
    expect(texText("\\dot G/G")).toBe("Ġ/G");
  });

  it("when TeX is read as running text (CSV, sentences), then subscripts keep their underscore", () => {
    expect(latexText("\\omega_{BD}")).toBe("ω_BD");
    expect(latexText("\\Lambda^2")).toBe("Λ²");
    expect(latexText("\\frac{1}{\\omega_{BD}}")).toBe("1/ω_BD");
    expect(latexText("\\alpha_{13}")).toBe("α₁₃");
  });

  it("when only the stored identifier is at hand, then it still reads as the symbol", () => {
    expect(identifierText("sqrt_alpha")).toBe("√α");
    expect(identifierText("lambda_g")).toBe("λ_g");
    expect(identifierText("Gdot")).toBe("Ġ");
    expect(identifierText("omega_BD")).toBe("ω_BD");
    expect(symbolText("sqrt_alpha", "\\sqrt{\\alpha}")).toBe("√α");
    expect(symbolText("m_g", null)).toBe("m_g");
  });

  it("when a validity condition is written in ASCII, then Greek letters, powers, indices and signs are typeset", () => {
    expect(conditionText("EdGB coupling on body 1: 16 pi alpha^2 / m1^4 below 1/6")).toBe("EdGB coupling on body 1: 16π α²/m₁⁴ below 1/6");
    expect(conditionText("omega_BD >> 1")).toBe("ω_BD ≫ 1");
    expect(conditionText("small deformation: |epsilon_3 - 2 alpha_13| below 1")).toBe("small deformation: |ε₃ - 2α₁₃| below 1");
    expect(conditionText("slow rotation: |chi2| <= 0.5")).toBe("slow rotation: |χ₂| ≤ 0.5");
    // words that merely contain a Greek name are left alone
    expect(conditionText("the alphabet and a phi-meson")).toBe("the alphabet and a φ-meson");
  });

  it("when prose carries code-style mathematics, then rates, roots, exponents and scientific notation read as printed", () => {
    expect(conditionText("|Gdot/G| tau below 0.1, tau = (5/256) Mc (pi Mc f_low)^(-8/3)")).toBe("|Ġ/G| τ below 0.1, τ = (5/256) ℳ (π ℳ f_low)^(-8/3)");
    expect(conditionText("a_i = (1 - 2 s_i)/sqrt(2 omega_BD + 3)")).toBe("aᵢ = (1 - 2 sᵢ)/√(2ω_BD + 3)");
    expect(conditionText("l_GB = 0.51 M_sun is sqrt(alpha) = 0.28 km")).toBe("l_GB = 0.51 M_sun is √α = 0.28 km");
    expect(conditionText("lambda_g > 1.03e13 km; m_s < 2.5e-20 eV")).toBe("λ_g > 1.03 × 10¹³ km; m_s < 2.5 × 10⁻²⁰ eV");
    expect(conditionText("flat Lambda-CDM, phi -> -phi, kappa <~ 0.74 / Gpc, +/- 1")).toBe("flat ΛCDM, φ → -φ, κ ≲ 0.74/Gpc, ± 1");
    expect(conditionText("the weakest combination is 0.71 ln_Mc - 0.70 ln_eta")).toBe("the weakest combination is 0.71 ln ℳ - 0.70 ln η");
  });

  it("when text is already typeset, then it passes through unchanged", () => {
    const typeset = "EdGB coupling on body 1: 16π α²/m₁⁴ < 1/6; ω_BD ≫ 1; |Ġ/G| τ < 0.1";
    expect(conditionText(typeset)).toBe(typeset);
    expect(conditionText(conditionText("16 pi alpha^2 / m2^4 well below 1 (at most 0.1)"))).toBe(conditionText("16 pi alpha^2 / m2^4 well below 1 (at most 0.1)"));
  });
});
