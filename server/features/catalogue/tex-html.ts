import katex from "katex";
import { TEX_RENDER_OPTIONS } from "../../../common/tex-options.ts";

/**
 * KaTeX markup for a short formula of an accepted entry (a coupling's symbol), rendered once per
 * catalogue revision with the browser's options, so the catalogue list shows typeset symbols without
 * shipping KaTeX's JavaScript. Null when the TeX does not parse: the client then renders it itself
 * and shows KaTeX's reason.
 */
export function texToHtml(tex: string): string | null {
  try {
    return katex.renderToString(tex, { ...TEX_RENDER_OPTIONS, throwOnError: true });
  } catch {
    return null;
  }
}
