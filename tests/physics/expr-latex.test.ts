import katex from "katex";
import { describe, expect, it } from "vitest";
import { symbolLatex, toLatex } from "../../server/physics/expr/latex.ts";

describe("symbolLatex", () => {
  it.each([
    ["eta", "\\eta"],
    ["alpha", "\\alpha"],
    ["Lambda", "\\Lambda"],
    ["chi1", "\\chi_{1}"],
    ["m1", "m_{1}"],
    ["chi_s", "\\chi_{s}"],
    ["Mc", "\\mathcal{M}"],
    ["D_alpha", "D_{\\alpha}"],
    ["lambda_g", "\\lambda_{g}"],
    ["omega_BD", "\\omega_{\\mathrm{BD}}"],
    ["epsilon_3", "\\epsilon_{3}"],
    ["Gdot_G", "(\\dot{G}/G)"],
    ["Mdot", "\\dot{M}"],
    ["gamma", "\\gamma"],
    ["foo", "\\mathrm{foo}"],
  ])("%s -> %s", (name, tex) => {
    expect(symbolLatex(name)).toBe(tex);
  });
});

describe("toLatex", () => {
  it.each([
    // EdGB beta as printed in the physics primer section 2 (Yunes, Yagi & Pretorius 2016, Table I; value from memory)
    [
      "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
      "-\\frac{5}{7168} \\frac{\\zeta \\left(m_{1}^{2} s_{2} - m_{2}^{2} s_{1}\\right)^{2}}{M^{4} \\eta^{18/5}}",
    ],
    ["16*pi*alpha^2/M^4", "\\frac{16 \\pi \\alpha^{2}}{M^{4}}"],
    ["-pi^2*D_0*Mc/lambda_g^2", "-\\frac{\\pi^{2} D_{0} \\mathcal{M}}{\\lambda_{g}^{2}}"],
    ["sqrt(1 - chi1^2)", "\\sqrt{1 - \\chi_{1}^{2}}"],
    ["eta^(-4/5)", "\\eta^{-4/5}"],
    ["(m1 - m2)/M", "\\frac{m_{1} - m_{2}}{M}"],
    ["exp(-x)*log(abs(y))", "\\exp\\left(-x\\right) \\ln\\left(\\left|y\\right|\\right)"],
    ["1.5e-3*x", "1.5 \\times 10^{-3} x"],
    ["2*3", "2 \\cdot 3"],
    ["a^b^c", "a^{b^{c}}"],
    ["(a + b)^2", "\\left(a + b\\right)^{2}"],
    ["a - (b - c)", "a - \\left(b - c\\right)"],
  ])("%s", (expression, tex) => {
    expect(toLatex(expression)).toBe(tex);
  });

  it("always produces LaTeX that KaTeX renders", () => {
    const samples = [
      "(1549225/11812864)*(zeta/eta^(14/5))*((1 - 231808*eta/61969)*chi_s^2 + (1 - 16068*eta/61969)*chi_a^2 - 2*dm*chi_s*chi_a)",
      "-(25/851968)*(14*Gdot_C - 3*Gdot_D)*Mc",
      "(25/851968)*Mdot*(3 - 26*eta + 34*eta^2)/(eta^(2/5)*(1 - 2*eta))",
      "-(-x)/(-(y))^-2",
      "sin(cos(x))^2/1e10",
    ];
    for (const s of samples) {
      expect(() => katex.renderToString(toLatex(s), { throwOnError: true }), s).not.toThrow();
    }
  });
});
