/** Small text formatting used by more than one feature (units, author names, numbers). */

/** "Yunes, Nicolas" → "Nicolas Yunes", so a list of names can be joined with commas unambiguously. */
export function displayName(name: string): string {
  const m = /^([^,]+),\s*(.+)$/.exec(name.trim());
  return m ? `${m[2]} ${m[1]}` : name.trim();
}

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "/": "ᐟ" };

/** "km^2" → "km²", "1/km" stays; a unit of "1" reads "dimensionless". */
export function unitLabel(unit: string): string {
  if (unit.trim() === "1" || unit.trim() === "") return "dimensionless";
  return unit.replace(/\^(-?[0-9/]+)/g, (_, p: string) => [...p].map((ch) => SUPERSCRIPT[ch] ?? ch).join(""));
}

/** A number short enough to read, long enough to check: 4 significant figures, exponent when tiny or huge. */
export function shortNumber(x: number): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  return a < 0.01 || a >= 1e5 ? x.toExponential(3) : String(Number(x.toPrecision(4)));
}

export { sciText, thresholdText } from "../../../common/number-text.ts";

const GREEK: Record<string, string> = {
  alpha: "α", beta: "β", gamma: "γ", delta: "δ", epsilon: "ε", varepsilon: "ε", zeta: "ζ", eta: "η", theta: "θ", kappa: "κ", lambda: "λ", mu: "μ", nu: "ν",
  xi: "ξ", pi: "π", rho: "ρ", sigma: "σ", tau: "τ", phi: "φ", varphi: "φ", chi: "χ", psi: "ψ", omega: "ω", Gamma: "Γ", Delta: "Δ", Theta: "Θ", Lambda: "Λ",
  Phi: "Φ", Psi: "Ψ", Omega: "Ω", ell: "ℓ",
};
const SUBSCRIPT: Record<string, string> = { "0": "₀", "1": "₁", "2": "₂", "3": "₃", "4": "₄", "5": "₅", "6": "₆", "7": "₇", "8": "₈", "9": "₉", "+": "₊", "-": "₋", a: "ₐ", e: "ₑ", o: "ₒ", x: "ₓ", h: "ₕ", k: "ₖ", l: "ₗ", m: "ₘ", n: "ₙ", p: "ₚ", s: "ₛ", t: "ₜ", i: "ᵢ", r: "ᵣ", u: "ᵤ", v: "ᵥ" };

/**
 * A symbol's TeX as plain text for places KaTeX cannot reach (plot labels, SVG downloads):
 * "\sqrt{\alpha}" → "√α", "\dot{M}_{\rm loss}" → "Ṁ_loss", "m_g" → "m_g" with a subscript where
 * Unicode has one. Anything it does not know is kept, minus the backslash.
 */
export function texText(tex: string): string {
  let s = tex.trim();
  s = s.replace(/\\(?:mathrm|rm|text|mathit|operatorname)\s*\{([^{}]*)\}/g, "$1").replace(/\\(?:rm|it)\s+/g, "");
  s = s.replace(/\\dot\s*\{?\s*([A-Za-z])\s*\}?/g, "$1\u0307").replace(/\\ddot\s*\{?\s*([A-Za-z])\s*\}?/g, "$1\u0308");
  s = s.replace(/\\bar\s*\{?\s*([A-Za-z])\s*\}?/g, "$1\u0304").replace(/\\tilde\s*\{?\s*([A-Za-z])\s*\}?/g, "$1\u0303");
  s = s.replace(/\\sqrt\s*\{([^{}]*)\}/g, (_, inner: string) => (inner.length === 1 || /^\\[A-Za-z]+$/.test(inner) ? `√${inner}` : `√(${inner})`));
  s = s.replace(/\\([A-Za-z]+)/g, (m, name: string) => GREEK[name] ?? (name === "cdot" ? "·" : name === "times" ? "×" : name === "infty" ? "∞" : name));
  s = s.replace(/_\{([^{}]*)\}|_([A-Za-z0-9])/g, (_, group: string | undefined, one: string | undefined) => {
    const t = (group ?? one ?? "").trim();
    const all = [...t].every((ch) => SUBSCRIPT[ch] !== undefined);
    return all && t.length > 0 ? [...t].map((ch) => SUBSCRIPT[ch]).join("") : `_${t}`;
  });
  s = s.replace(/\^\{([^{}]*)\}|\^([A-Za-z0-9])/g, (_, group: string | undefined, one: string | undefined) => {
    const t = (group ?? one ?? "").trim();
    const all = [...t].every((ch) => SUPERSCRIPT[ch] !== undefined);
    return all && t.length > 0 ? [...t].map((ch) => SUPERSCRIPT[ch]).join("") : `^${t}`;
  });
  return s.replace(/[{}]/g, "").replace(/\\,|\\;|\\!/g, "").replace(/\s+/g, " ").trim();
}

/**
 * A condition written in plain ASCII ("16 pi alpha^2 / m1^4 below 1/6", "omega_BD >> 1") as a
 * physicist writes it: Greek letters by name become letters, powers become superscripts, a mass or
 * spin index becomes a subscript, and >> / << / <= / >= become their signs.
 */
export function conditionText(text: string): string {
  let s = text.replace(/\b(m|chi|q|M)(\d)\b/g, (_, v: string, d: string) => `${v}${SUBSCRIPT[d]}`);
  s = s.replace(/(?<![A-Za-z])([A-Za-z]+)(?![A-Za-z])/g, (w: string) => GREEK[w] ?? w);
  s = s.replace(/\b(χ|m|q|M)(\d)/g, (_, v: string, d: string) => `${v}${SUBSCRIPT[d]}`);
  s = s.replace(/\^\((-?[0-9/ ]+)\)|\^(-?[0-9/]+)/g, (_, g: string | undefined, one: string | undefined) => [...(g ?? one ?? "").replace(/\s+/g, "")].map((ch) => SUPERSCRIPT[ch] ?? ch).join(""));
  s = s.replace(/([A-Za-zα-ωΑ-Ω])_(\d+)(?![\w])/g, (_, v: string, d: string) => `${v}${[...d].map((ch) => SUBSCRIPT[ch]).join("")}`);
  return s.replace(/>>/g, "≫").replace(/<</g, "≪").replace(/<=/g, "≤").replace(/>=/g, "≥").replace(/\s\*\s|\*/g, " ");
}
