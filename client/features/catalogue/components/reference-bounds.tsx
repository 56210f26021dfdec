import type { TheoryDetail } from "../../../../common/catalogue.ts";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { Badge } from "../../../components/ui/badge.tsx";
import { sciText } from "../../../components/ui/text-format.ts";
import { ScrollBox } from "../../../components/ui/scroll-box.tsx";
import { authorList, unitLabel } from "./format.ts";

type Bound = TheoryDetail["reference_bounds"][number];
type Coupling = TheoryDetail["couplings"][number];

/** The bounded quantity's TeX: the quoted form's (√α) when the bound is quoted, else the coupling's own. */
function quantityTex(b: Bound, couplings: Coupling[]): string | null {
  const c = couplings.find((x) => x.symbol === b.coupling);
  if (!c) return null;
  if (b.quoted_symbol && c.quoted && c.quoted.symbol === b.quoted_symbol) return c.quoted.latex;
  return !b.quoted_symbol || b.quoted_symbol === c.symbol ? c.latex : null;
}

/** Published limits on the couplings, as their papers quote them. */
export function ReferenceBounds({ bounds, couplings }: { bounds: Bound[]; couplings: Coupling[] }) {
  return (
    <ScrollBox label="Published bounds" className="rounded border border-paper-edge bg-white/40">
      <table className="w-full border-collapse text-[0.95rem] tabular-nums">
        <caption className="sr-only">Published bounds</caption>
        <thead className="bg-paper-deep text-left text-sm">
          <tr>
            <th scope="col" className="px-3 py-2">Quantity</th>
            <th scope="col" className="px-3 py-2 text-right">Bound</th>
            <th scope="col" className="px-3 py-2">Credibility</th>
            <th scope="col" className="px-3 py-2">Data</th>
            <th scope="col" className="px-3 py-2">Source</th>
          </tr>
        </thead>
        <tbody>
          {bounds.map((b, i) => (
            <tr key={i} className="border-t border-paper-edge/70 align-top">
              <td className="px-3 py-2">
                {(() => {
                  const id = b.quoted_symbol ?? b.coupling;
                  const tex = quantityTex(b, couplings);
                  return tex ? <MathTex tex={tex} label={symbolText(id, tex)} /> : <span>{symbolText(id)}</span>;
                })()}
                {b.convention && <span className="ml-1 font-serif text-xs text-ink-faint">(convention {b.convention})</span>}
              </td>
              <td className="px-3 py-2 text-right whitespace-nowrap">
                {b.side === "upper" ? "<" : ">"} {sciText(b.value)} {unitLabel(b.unit)}
              </td>
              <td className="px-3 py-2 whitespace-nowrap">
                {b.credibility !== null ? (
                  `${Math.round(b.credibility * 100)} %`
                ) : (
                  <span className="text-sm text-ink-soft" title="The source states no credible level for this bound; the note says why.">
                    not stated
                  </span>
                )}
              </td>
              {/* A floor under the data column: on a phone the table scrolls sideways instead of squeezing a long note into a sliver. */}
              <td className="min-w-80 px-3 py-2">
                {b.data ? conditionText(b.data) : b.note ? null : "—"}
                {b.note && <span className={b.data ? "block text-sm text-ink-soft" : "text-sm"}>{conditionText(b.note)}</span>}
              </td>
              <td className="min-w-48 px-3 py-2">
                {authorList(b.reference.authors, 2)} {b.reference.year}
                {b.source_status === "memory" && (
                  <Badge tone="caution" className="ml-2">
                    value from memory
                  </Badge>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}
