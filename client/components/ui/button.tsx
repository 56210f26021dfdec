import type { ButtonHTMLAttributes } from "react";

export type ButtonKind = "primary" | "secondary" | "danger" | "quiet";

const kindClass: Record<ButtonKind, string> = {
  primary: "bg-sea text-paper border-sea hover:bg-sea-light",
  secondary: "bg-paper text-sea border-sea/50 hover:bg-sea-wash",
  danger: "bg-paper text-brick border-brick/50 hover:bg-brick-wash",
  quiet: "bg-transparent text-sea border-transparent hover:underline px-1",
};

interface Props extends ButtonHTMLAttributes<HTMLButtonElement> {
  kind?: ButtonKind;
  busy?: boolean;
}

/** A native button (so Enter/Space and focus work for free); busy disables it and says so. */
export function Button({ kind = "secondary", busy = false, disabled, className = "", type = "button", children, ...rest }: Props) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center gap-2 rounded border px-3 py-1.5 text-sm font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-50 ${kindClass[kind]} ${className}`}
      {...rest}
    >
      {children}
      {busy && <span className="text-xs font-normal">…</span>}
    </button>
  );
}
