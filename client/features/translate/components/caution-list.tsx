import { conditionText } from "../../../../common/symbol-text.ts";
import type { Caution, CautionCode } from "../../../../common/convert.ts";

const codeLabel: Record<CautionCode, string> = {
  validity: "validity",
  leading_pn: "leading PN",
  prior: "prior",
  spin_terms: "spin terms",
  log_term: "log term",
  one_signed: "one-signed",
  sign_convention: "sign convention",
  frame: "frame",
  source_status: "source",
  engine: "engine",
  couplings: "couplings",
  orders: "orders",
  signed_interval: "signed interval",
  amplitude: "amplitude",
  remnant: "remnant",
};

/** Cautions stay next to the number they qualify; validity failures are shown first and in brick. */
export function CautionList({ cautions, compact = false, testId }: { cautions: readonly Caution[]; compact?: boolean; testId?: string }) {
  if (cautions.length === 0) return compact ? <span className="text-xs text-ink-faint">none</span> : null;
  const ordered = [...cautions].sort((a, b) => Number(b.code === "validity") - Number(a.code === "validity"));
  return (
    <ul className={`flex flex-col gap-1 ${compact ? "min-w-[16rem] text-xs leading-snug" : "text-sm"}`} data-testid={testId}>
      {ordered.map((c, i) => (
        <li key={`${c.code}-${i}`} data-caution={c.code} className={c.code === "validity" ? "text-brick" : "text-ink-soft"}>
          <span className={`mr-1 font-semibold uppercase tracking-wide ${c.code === "validity" ? "text-brick" : "text-amber"}`}>{codeLabel[c.code]}</span>
          {conditionText(c.message)}
        </li>
      ))}
    </ul>
  );
}
