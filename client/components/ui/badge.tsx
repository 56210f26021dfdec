import type { ReactNode } from "react";

export type Tone = "neutral" | "ok" | "caution" | "fail" | "info";

const toneClass: Record<Tone, string> = {
  neutral: "border-paper-edge bg-paper-deep text-ink-soft",
  ok: "border-moss/40 bg-moss-wash text-moss",
  caution: "border-amber/40 bg-amber-wash text-amber",
  fail: "border-brick/40 bg-brick-wash text-brick",
  info: "border-sea/30 bg-sea-wash text-sea",
};

interface Props {
  tone?: Tone;
  children: ReactNode;
  title?: string;
  className?: string;
}

/** A small label. The tone is never the only signal: the text always says the same thing. */
export function Badge({ tone = "neutral", children, title, className = "" }: Props) {
  return (
    <span
      title={title}
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded-sm border px-1.5 py-px text-xs font-semibold uppercase tracking-wide ${toneClass[tone]} ${className}`}
    >
      {children}
    </span>
  );
}
