/**
 * How TeX becomes KaTeX markup, the same in the browser (client/lib/katex.ts) and on the server (the
 * catalogue list arrives with its few formulas already rendered, so /catalogue needs no KaTeX code).
 * User-typed TeX: no \href, \url or \includegraphics, and no macro definitions that leak between formulas.
 */
export const TEX_RENDER_OPTIONS = {
  throwOnError: false,
  trust: false,
  strict: "ignore",
  maxSize: 20,
  maxExpand: 200,
  output: "htmlAndMathml",
} as const;
