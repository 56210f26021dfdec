import type katexDefault from "katex";
import type { KatexOptions } from "katex";
import { TEX_RENDER_OPTIONS } from "../../common/tex-options.ts";

/**
 * KaTeX is ~260 kB of JavaScript and 23 kB of CSS (plus fonts fetched only for glyphs in use); only
 * pages that show formulas pay for it. The module and its stylesheet are imported once on first use
 * and shared. Markup typeset on the server (the catalogue list) needs the stylesheet only.
 */
type Katex = typeof katexDefault;

let pending: Promise<Katex> | undefined;
let loaded: Katex | undefined;
let cssPending: Promise<void> | undefined;
let cssLoaded = false;

export function loadKatexCss(): Promise<void> {
  cssPending ??= import("katex/dist/katex.min.css").then(() => {
    cssLoaded = true;
  });
  return cssPending;
}

export function katexCssIfLoaded(): boolean {
  return cssLoaded;
}

export function loadKatex(): Promise<Katex> {
  pending ??= Promise.all([import("katex"), loadKatexCss()]).then(([m]) => {
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

// The server typesets with the same options (common/tex-options.ts).
const baseOptions: KatexOptions = TEX_RENDER_OPTIONS;

export function renderTex(katex: Katex, tex: string, displayMode = false): RenderedTex {
  try {
    return { html: katex.renderToString(tex, { ...baseOptions, displayMode, throwOnError: true }) };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    return { html: katex.renderToString(tex, { ...baseOptions, displayMode }), error: message };
  }
}
