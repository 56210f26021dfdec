import { useEffect, useRef, useState } from "react";
import { katexIfLoaded, loadKatex, renderTex } from "../../lib/katex.ts";
import { useOverflowing } from "./scroll-box.tsx";

interface Props {
  tex: string;
  display?: boolean;
  /** Spoken and shown while KaTeX loads; defaults to the TeX source. */
  label?: string;
  className?: string;
}

/** One formula rendered by KaTeX (loaded lazily). Invalid TeX shows the source and KaTeX's reason. */
export function MathTex({ tex, display = false, label, className = "" }: Props) {
  const [katex, setKatex] = useState(katexIfLoaded);
  const box = useRef<HTMLDivElement & HTMLSpanElement>(null);
  // A formula wider than its box scrolls; it then takes a tab stop so the keyboard can scroll it.
  const overflowing = useOverflowing(box);
  useEffect(() => {
    if (katex) return;
    let live = true;
    void loadKatex().then((k) => {
      if (live) setKatex(k);
    });
    return () => {
      live = false;
    };
  }, [katex]);

  const Tag = display ? "div" : "span";
  const scrollProps = overflowing ? { tabIndex: 0, role: "group", "aria-label": label ?? "formula" } : {};
  const base = display ? "block overflow-x-auto py-1" : "inline-block max-w-full overflow-x-auto align-middle";
  if (!katex) {
    return (
      <Tag ref={box} className={`${base} font-mono text-sm text-ink-soft ${className}`} aria-busy="true">
        {label ?? tex}
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
