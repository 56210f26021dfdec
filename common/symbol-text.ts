/**
 * Symbols and formulas as a physicist writes them in plain text, for every place KaTeX does not reach
 * (CSV cells, sentences, cautions, SVG labels, e-mails), on the server and in the client alike:
 * - latexText / latexRuns: "\sqrt{\alpha}" -> "√α", "\lambda_g" -> "λ_g", "\dot G/G" -> "Ġ/G",
 *   "\omega_{BD}" -> "ω_BD", "\Lambda^2" -> "Λ²";
 * - texText: the same with Unicode sub- and superscripts where every character has one (plot labels);
 * - identifierText / symbolText: a stored identifier (sqrt_alpha, lambda_g) read as its symbol;
 * - conditionText: ASCII mathematics in prose ("16 pi alpha^2 / m1^4 below 1/6") typeset in Unicode.
 * The stored identifiers are for machines; people read these.
 */

const GREEK: Readonly<Record<string, string>> = {
  alpha: "α", beta: "β", gamma: "γ", delta: "δ", epsilon: "ε", varepsilon: "ε", zeta: "ζ", eta: "η", theta: "θ",
  vartheta: "ϑ", iota: "ι", kappa: "κ", lambda: "λ", mu: "μ", nu: "ν", xi: "ξ", pi: "π", rho: "ρ", sigma: "σ",
  tau: "τ", upsilon: "υ", phi: "φ", varphi: "φ", chi: "χ", psi: "ψ", omega: "ω", Gamma: "Γ", Delta: "Δ",
  Theta: "Θ", Lambda: "Λ", Xi: "Ξ", Pi: "Π", Sigma: "Σ", Phi: "Φ", Psi: "Ψ", Omega: "Ω", ell: "ℓ",
};

const SUPER: Readonly<Record<string, string>> = {
  "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "-": "⁻", "+": "⁺",
};

/** \mathcal letters. */
const SCRIPT: Readonly<Record<string, string>> = Object.fromEntries(
  [..."ABCDEFGHIJKLMNOPQRSTUVWXYZ"].map((c, i) => [c, [..."𝒜ℬ𝒞𝒟ℰℱ𝒢ℋℐ𝒥𝒦ℒℳ𝒩𝒪𝒫𝒬ℛ𝒮𝒯𝒰𝒱𝒲𝒳𝒴𝒵"][i]!]),
);

/** Characters Unicode writes as subscripts (enough for indices, "loss", "max", "GR" stays "_GR"). */
const SUB: Readonly<Record<string, string>> = {
  "0": "₀", "1": "₁", "2": "₂", "3": "₃", "4": "₄", "5": "₅", "6": "₆", "7": "₇", "8": "₈", "9": "₉", "+": "₊", "-": "₋",
  a: "ₐ", e: "ₑ", o: "ₒ", x: "ₓ", h: "ₕ", k: "ₖ", l: "ₗ", m: "ₘ", n: "ₙ", p: "ₚ", s: "ₛ", t: "ₜ", i: "ᵢ", r: "ᵣ", u: "ᵤ", v: "ᵥ",
};

const ACCENT: Readonly<Record<string, string>> = { dot: "\u0307", ddot: "\u0308", hat: "\u0302", tilde: "\u0303", bar: "\u0304" };

/** One run of a label: plain, subscript or superscript (an SVG writes the last two as shifted tspans). */
export interface TextRun {
  text: string;
  shift: "none" | "sub" | "super";
}

/** Reads one argument: a {group} or a single token (command or character). */
function readArg(src: string, i: number): { arg: string; next: number } {
  while (src[i] === " ") i++;
  if (src[i] === "{") {
    let depth = 1;
    let j = i + 1;
    while (j < src.length && depth > 0) {
      if (src[j] === "{") depth++;
      else if (src[j] === "}") depth--;
      j++;
    }
    return { arg: src.slice(i + 1, j - 1), next: j };
  }
  if (src[i] === "\\") {
    const m = /^\\([A-Za-z]+|.)/.exec(src.slice(i));
    const tok = m ? m[0] : "\\";
    return { arg: tok, next: i + tok.length };
  }
  return { arg: src[i] ?? "", next: i + 1 };
}

/** Flat text of a LaTeX fragment, with its sub- and superscripts as runs. */
export function latexRuns(latex: string): TextRun[] {
  const runs: TextRun[] = [];
  const push = (text: string, shift: TextRun["shift"]) => {
    if (!text) return;
    const last = runs[runs.length - 1];
    if (last && last.shift === shift) last.text += text;
    else runs.push({ text, shift });
  };
  const walk = (src: string, shift: TextRun["shift"]) => {
    let i = 0;
    while (i < src.length) {
      const ch = src[i]!;
      if (ch === "\\") {
        const m = /^\\([A-Za-z]+|.)/.exec(src.slice(i));
        const name = m?.[1] ?? "";
        i += m?.[0].length ?? 1;
        // TeX eats the spaces after a control word.
        if (/^[A-Za-z]/.test(name)) while (src[i] === " ") i++;
        if (GREEK[name]) push(GREEK[name], shift);
        else if (name === "sqrt") {
          const { arg, next } = readArg(src, i);
          i = next;
          const inner = latexText(arg);
          push(inner.length === 1 || /^[^\s+\-*/]$/u.test(inner) ? `√${inner}` : `√(${inner})`, shift);
        } else if (name === "frac") {
          const a = readArg(src, i);
          const b = readArg(src, a.next);
          i = b.next;
          const wrap = (s: string) => (/[+\-\s]/.test(s) ? `(${s})` : s);
          push(`${wrap(latexText(a.arg))}/${wrap(latexText(b.arg))}`, shift);
        } else if (ACCENT[name]) {
          const { arg, next } = readArg(src, i);
          i = next;
          const inner = latexText(arg);
          push(`${inner}${ACCENT[name]}`.normalize("NFC"), shift);
        } else if (name === "mathcal" || name === "mathscr") {
          const { arg, next } = readArg(src, i);
          i = next;
          push([...arg].map((c) => SCRIPT[c] ?? c).join(""), shift);
        } else if (name === "mathrm" || name === "text" || name === "mathit" || name === "mathbf" || name === "operatorname") {
          const { arg, next } = readArg(src, i);
          i = next;
          walk(arg, shift);
        } else if (name === "rm" || name === "left" || name === "right" || name === "displaystyle") {
          // Style switches and delimiter sizing carry no text.
        } else if (name === "," || name === ";" || name === ":" || name === "quad" || name === "qquad" || name === " ") push(" ", shift);
        else if (name === "cdot") push("·", shift);
        else if (name === "times") push("×", shift);
        else if (name === "le" || name === "leq") push("≤", shift);
        else if (name === "ge" || name === "geq") push("≥", shift);
        else if (name === "prime") push("′", shift);
        else if (name === "{" || name === "}" || name === "|") push(name, shift);
        else push(name, shift);
        continue;
      }
      if (ch === "_" || ch === "^") {
        const { arg, next } = readArg(src, i + 1);
        i = next;
        const text = latexText(arg);
        if (ch === "^" && [...text].every((c) => SUPER[c])) push([...text].map((c) => SUPER[c]).join(""), shift);
        else walk(arg, ch === "_" ? "sub" : "super");
        continue;
      }
      if (ch === "{" || ch === "}") {
        i++;
        continue;
      }
      if (ch === "'") push("′", shift);
      else push(ch, shift);
      i++;
    }
  };
  walk(latex, "none");
  return runs.map((r) => ({ ...r, text: r.text.replace(/\s+/g, " ").replace(/ - /g, " − ") })).filter((r) => r.text !== "");
}

/** Plain text of a LaTeX symbol: numeric subscripts as ₁₃, others with "_" ("λ_g", "ω_BD"), superscripts as ^ or ². */
export function latexText(latex: string): string {
  return latexRuns(latex)
    .map((r) => (r.shift === "sub" && /^\d+$/.test(r.text) ? scriptText(r.text, SUB) : r.shift === "sub" ? `_${r.text.length > 1 && /[^A-Za-z0-9]/.test(r.text) ? `(${r.text})` : r.text}` : r.shift === "super" ? `^${r.text.length > 1 && !/^\(.*\)$/.test(r.text) ? `(${r.text})` : r.text}` : r.text))
    .join("")
    .trim();
}

/**
 * The readable form of a stored identifier when no LaTeX is at hand: "sqrt_alpha" -> "√α",
 * "lambda_g" -> "λ_g", "Gdot" -> "Ġ", "omega_BD" -> "ω_BD", "m_g" stays "m_g".
 */
export function identifierText(symbol: string): string {
  let s = symbol;
  let root = false;
  if (s.startsWith("sqrt_")) {
    root = true;
    s = s.slice(5);
  }
  const [head = "", ...rest] = s.split("_");
  const dotted = /^(.+)dot$/.exec(head);
  let first = dotted ? dotted[1]! : head;
  first = GREEK[first] ?? first;
  if (dotted) first = `${first}\u0307`.normalize("NFC");
  const text = [first, ...rest.map((p) => GREEK[p] ?? p)].join("_");
  return root ? (first.length === 1 && rest.length === 0 ? `√${text}` : `√(${text})`) : text;
}

/** A symbol for people: from its LaTeX when known, else from its identifier. */
export function symbolText(symbol: string, latex?: string | null): string {
  const fromLatex = latex ? latexText(latex) : "";
  return fromLatex || identifierText(symbol);
}

/** A run as Unicode sub- or superscript when every character has one, else null. */
function scriptText(text: string, table: Readonly<Record<string, string>>): string | null {
  const chars = [...text];
  return chars.length > 0 && chars.every((c) => table[c] !== undefined) ? chars.map((c) => table[c]).join("") : null;
}

/**
 * A symbol's TeX as plain text for places KaTeX cannot reach (plot labels, SVG downloads), with
 * Unicode sub- and superscripts where every character has one: "\sqrt{\alpha}" -> "√α",
 * "\dot{M}_{\rm loss}" -> "Ṁₗₒₛₛ", "\xi^{1/4}" -> "ξ¹ᐟ⁴", "\lambda_g" -> "λ_g" (no subscript g).
 */
export function texText(tex: string): string {
  const SUPER_SLASH = { ...SUPER, "/": "ᐟ" };
  return latexRuns(tex.trim())
    .map((r) => {
      if (r.shift === "none") return r.text;
      const t = r.text.trim();
      const script = scriptText(t, r.shift === "sub" ? SUB : SUPER_SLASH);
      if (script !== null) return script;
      return r.shift === "sub" ? `_${t}` : `^${t.length > 1 ? `(${t})` : t}`;
    })
    .join("")
    .trim();
}

/** Identifiers that prose writes in code style, and how a physicist writes them. */
const PROSE_NAMES: ReadonlyArray<readonly [RegExp, string]> = [
  [/\bLambda-CDM\b/g, "ΛCDM"],
  [/\bOmega_L0\b/g, "Ω_Λ,0"],
  [/\bOmega_L\b/g, "Ω_Λ"],
  [/\bh-bar\b/g, "ħ"],
  [/\bln_Mc\b/g, "ln ℳ"],
  [/\bMc_z\b/g, "ℳ_z"],
  [/\bMc\b/g, "ℳ"],
  [/\bln_eta\b/g, "ln η"],
  [/\bln_A\b/g, "ln A"],
  [/\bH0\b/g, "H₀"],
  [/\bLambda-tilde\b/g, "Λ\u0303"],
  [/\bsum_i\b/g, "Σᵢ"],
  [/\beps(\d)\b/g, "epsilon_$1"],
  [/\bsqrt_([A-Za-z]+)\b/g, "sqrt($1)"],
];

/**
 * ASCII mathematics in prose ("16 pi alpha^2 / m1^4 below 1/6", "omega_BD >> 1", "Gdot/G",
 * "sqrt(2 omega_BD + 3)", "1.03e13 km") as a physicist writes it: Greek letters by name become
 * letters, Gdot becomes Ġ, integer powers become superscripts, numeric indices subscripts, >> / << /
 * <= / >= / <~ / +/- / -> their signs, 1.03e13 becomes 1.03 × 10¹³. Text already in Unicode passes
 * through unchanged, so it is safe on stored labels written either way.
 */
export function conditionText(text: string): string {
  let s = text;
  for (const [re, to] of PROSE_NAMES) s = s.replace(re, to);
  // Indexed masses, spins, charges, sensitivities and aether constants: m1 -> m₁, chi2 -> χ₂, alpha13 -> α₁₃, c13 -> c₁₃.
  s = s.replace(/\b(m|M|q|Q|s|a|c|chi|sigma|alpha|epsilon)(\d{1,2})\b/g, (_, v: string, d: string) => `${GREEK[v] ?? v}${scriptText(d, SUB)}`);
  // Dotted rates: Gdot -> Ġ, Mdot_loss -> Ṁ_loss, mdot_i -> ṁ_i.
  s = s.replace(/\b([A-Za-z])dot(?=\b|_)/g, (_, v: string) => `${v}\u0307`.normalize("NFC"));
  s = s.replace(/\bsqrt\(([^()]*)\)/g, (_, inner: string) => {
    const t = conditionText(inner);
    return [...t].length === 1 ? `√${t}` : `√(${t})`;
  });
  // Greek letters by name, as whole words (not inside "alphabet"; "alpha_13" and "omega_BD" are words here).
  s = s.replace(/(?<![A-Za-z])([A-Za-z]+)(?![A-Za-z])/g, (w: string) => GREEK[w] ?? w);
  // Integer powers: ^2, ^-2, ^(-8) -> superscripts; fractional powers keep their caret, ^(1/3).
  s = s.replace(/\^\((-?\d+)\)|\^(-?\d+)(?!\d|\.\d)/g, (_, g: string | undefined, one: string | undefined) => scriptText(g ?? one ?? "", SUPER) ?? `^${g ?? one}`);
  // Numeric and i indices: D_0 -> D₀, epsilon_3 -> ε₃, m_i -> mᵢ.
  s = s.replace(/([A-Za-zα-ωΑ-ΩħĠġṀṁ])_(\d+|i)(?![\w])/g, (_, v: string, d: string) => `${v}${scriptText(d, SUB)}`);
  // Scientific notation: 1.03e13 -> 1.03 × 10¹³.
  s = s.replace(/\b(\d+(?:\.\d+)?)e([+-]?)(\d+)\b/g, (_, m: string, sign: string, e: string) => `${m} × 10${scriptText(`${sign === "-" ? "-" : ""}${String(Number(e))}`, SUPER)}`);
  s = s.replace(/>>/g, "≫").replace(/<</g, "≪").replace(/<=/g, "≤").replace(/>=/g, "≥").replace(/<~/g, "≲").replace(/>~/g, "≳");
  s = s.replace(/\+\/-|\+-(?=\s)/g, "±").replace(/!=/g, "≠").replace(/(\d\)?) x (?=10)/g, "$1 × ").replace(/ -> /g, " → ").replace(/\s\*\s|\*/g, " ");
  // "16 π α²" -> "16π α²"; "α² / m₁⁴" -> "α²/m₁⁴" (a quotient of symbols reads as one term).
  s = s.replace(/(\d) (?=[α-ωΑ-Ω])/g, "$1");
  s = s.replace(/([^\s([,;:]) \/ (?=[^\s\d])/g, "$1/");
  return s;
}
