/**
 * A coupling's symbol as a physicist writes it in plain text (CSV cells, sentences, SVG labels):
 * "\sqrt{\alpha}" -> "√α", "\lambda_g" -> "λ_g", "\dot G/G" -> "Ġ/G", "\omega_{BD}" -> "ω_BD",
 * "\Lambda^2" -> "Λ²". The stored identifier (sqrt_alpha, lambda_g) is for machines; people read this.
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

/** Plain text of a LaTeX symbol: subscripts written with "_" ("λ_g", "ω_BD"), superscripts as ^ or ². */
export function latexText(latex: string): string {
  return latexRuns(latex)
    .map((r) => (r.shift === "sub" ? `_${r.text.length > 1 && /[^A-Za-z0-9]/.test(r.text) ? `(${r.text})` : r.text}` : r.shift === "super" ? `^${r.text.length > 1 && !/^\(.*\)$/.test(r.text) ? `(${r.text})` : r.text}` : r.text))
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
