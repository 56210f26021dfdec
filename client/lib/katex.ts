import type katexDefault from "katex";
import type { KatexOptions } from "katex";

/**
 * KaTeX is ~270 kB of JavaScript; only pages that show formulas should pay for it. The module is
 * imported once on first use and shared; its stylesheet is already in index.css.
 */
type Katex = typeof katexDefault;

let pending: Promise<Katex> | undefined;
let loaded: Katex | undefined;

export function loadKatex(): Promise<Katex> {
  pending ??= import("katex").then((m) => {
    loaded = m.default;
    return m.default;
  });
  return pending;
}

/** Synchronous access once loaded, so re-renders after the first never flash the raw source. */
export function katexIfLoaded(): Katex | undefined {
  return loaded;
}

export interface RenderedTex {
  html: string;
  /** KaTeX's own message when the source is not valid TeX (the source is then shown in red). */
  error?: string;
}

const baseOptions: KatexOptions = {
  throwOnError: false,
  // User-typed TeX: no \href, \url or \includegraphics, and no macro definitions that leak between formulas.
  trust: false,
  strict: "ignore",
  maxSize: 20,
  maxExpand: 200,
  output: "htmlAndMathml",
};

export function renderTex(katex: Katex, tex: string, displayMode = false): RenderedTex {
  try {
    return { html: katex.renderToString(tex, { ...baseOptions, displayMode, throwOnError: true }) };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    return { html: katex.renderToString(tex, { ...baseOptions, displayMode }), error: message };
  }
}
