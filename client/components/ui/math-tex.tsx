import { useEffect, useRef, useState } from "react";
import { katexCssIfLoaded, katexIfLoaded, loadKatex, loadKatexCss, renderTex } from "../../lib/katex.ts";
import { useOverflowing } from "./scroll-box.tsx";
import { latexText } from "../../../common/symbol-text.ts";

interface Props {
  tex: string;
  display?: boolean;
  /** Spoken and shown while KaTeX loads; defaults to the TeX source. */
  label?: string;
  className?: string;
  /** KaTeX markup already typeset on the server from `tex` (same options): then only KaTeX's stylesheet is loaded. */
  html?: string | null;
}

/** One formula rendered by KaTeX (loaded lazily). Invalid TeX shows the source and KaTeX's reason. */
export function MathTex({ tex, display = false, label, className = "", html }: Props) {
  const [katex, setKatex] = useState(katexIfLoaded);
  const [cssReady, setCssReady] = useState(katexCssIfLoaded);
  const typeset = html ?? undefined;
  const box = useRef<HTMLDivElement & HTMLSpanElement>(null);
  // A formula wider than its box scrolls; it then takes a tab stop so the keyboard can scroll it.
  const overflowing = useOverflowing(box);
  useEffect(() => {
    if (katex || (typeset !== undefined && cssReady)) return;
    let live = true;
    if (typeset !== undefined) {
      void loadKatexCss().then(() => {
        if (live) setCssReady(true);
      });
      return () => {
        live = false;
      };
    }
    void loadKatex().then((k) => {
      if (live) setKatex(k);
    });
    return () => {
      live = false;
    };
  }, [katex, typeset, cssReady]);

  const Tag = display ? "div" : "span";
  const scrollProps = overflowing ? { tabIndex: 0, role: "group", "aria-label": label ?? "formula" } : {};
  const base = display ? "block overflow-x-auto py-1" : "inline-block max-w-full overflow-x-auto align-middle";
  if (typeset !== undefined && cssReady && !katex) {
    return (
      <Tag
        ref={box}
        {...scrollProps}
        className={`${base} ${className}`}
        data-tex={tex}
        // Typeset by KaTeX on the server with trust:false (common/tex-options.ts): no user HTML.
        dangerouslySetInnerHTML={{ __html: typeset }}
      />
    );
  }
  if (!katex) {
    return (
      <Tag ref={box} className={`${base} font-mono text-sm text-ink-soft ${className}`} aria-busy="true">
        {label ?? latexText(tex)}
      </Tag>
    );
  }
  const rendered = renderTex(katex, tex, display);
  return (
    <Tag
      ref={box}
      {...scrollProps}
      className={`${base} ${className}`}
      data-tex={tex}
      title={rendered.error ? `Not valid TeX: ${rendered.error}` : undefined}
      // KaTeX output is generated from the TeX string with trust:false, so no user HTML reaches the DOM.
      dangerouslySetInnerHTML={{ __html: rendered.html }}
    />
  );
}
