import type { ConvertResult } from "../../../common/convert.ts";
import type { Sheet, SheetRecord } from "../../../common/sheets.ts";
import { shortTheoryName } from "../../../common/theory-name.ts";
import { unitLatex } from "../../physics/latex-format.ts";
import { exportLines } from "./export-rows.ts";
import { fileStem } from "./export-stem.ts";

export { shortTheoryName };

/**
 * A LaTeX table that drops into a paper set in one or two columns: a `tabularx` as wide as the
 * column (`\linewidth`), the theory column wrapping, booktabs rules, one group per bound (the bound
 * and its credibility stated once, in the group's head row), numbers written as a physicist writes
 * them (5.5, 2.8 \times 10^{-1}), each coupling's unit beside its symbol in the row's quantity cell,
 * a verdict mark on every limit with its legend in the caption, and a `\cite{}` column whose keys
 * are the keys of the BibTeX export. Needs \usepackage{booktabs,tabularx}.
 */

/** Escapes text for LaTeX's text mode. */
export function escapeLatex(s: string): string {
  return s.replace(/[\\&%$#_{}~^]/g, (c) => {
    switch (c) {
      case "\\":
        return "\\textbackslash{}";
      case "~":
        return "\\textasciitilde{}";
      case "^":
        return "\\textasciicircum{}";
      default:
        return `\\${c}`;
    }
  });
}

/**
 * x with `digits` significant figures as a physicist writes it: plain between 1 and 1000 (5.5,
 * 120), otherwise mantissa \times 10^{exponent} (2.8 \times 10^{-1}, 1.6 \times 10^{13}); a mantissa
 * of exactly 1 is kept (1.0 \times 10^{-3}) so the figures stay visible.
 */
export function numberLatex(x: number, digits = 2): string {
  if (!Number.isFinite(x)) return x > 0 ? "\\infty" : x < 0 ? "-\\infty" : "\\mathrm{NaN}";
  if (x === 0) return "0";
  const figures = Math.max(1, digits);
  const [mantissa, exponentText] = x.toExponential(figures - 1).split("e");
  const exponent = Number(exponentText);
  if (exponent >= 0 && exponent <= 2) return exponent + 1 >= figures ? String(Number(x.toPrecision(figures))) : x.toFixed(figures - 1 - exponent);
  return `${mantissa} \\times 10^{${exponent}}`;
}

/** The verdict of a limit: every state gets a mark, explained in the caption's legend. */
export type LimitVerdict = "valid" | "caution" | "not_valid" | "not_assessed";

export function limitVerdict(result: ConvertResult): LimitVerdict {
  if (result.verdict === "outside_validity") return "not_valid";
  if (result.verdict === "not_assessed") return "not_assessed";
  return result.validity.some((v) => !v.ok) ? "caution" : "valid";
}

const VERDICT_MARK: Record<LimitVerdict, string> = {
  valid: "$\\circ$",
  caution: "$\\ast$",
  not_valid: "$\\dagger$",
  not_assessed: "$\\diamond$",
};

const VERDICT_LEGEND: Record<LimitVerdict, string> = {
  valid: "every validity condition of the small-coupling expansion holds at the limit",
  caution: "a rule-of-thumb condition is exceeded at the limit, by at most 10 times (a stretched approximation)",
  not_valid: "a validity condition fails at the limit, so the limit is outside validity",
  not_assessed: "the entry states no validity condition for this binary: validity not assessed",
};

function percent(c: number): string {
  return `${Number((c * 100).toPrecision(4))}\\%`;
}

function boundLatex(record: SheetRecord, digits: number): string {
  const bound = record.bound;
  const symbol = bound.parameter === "ppe_beta" ? "\\beta" : `\\delta\\varphi_{${bound.k}}`;
  let text: string;
  if (bound.upper !== undefined) text = `$|${symbol}| \\le ${numberLatex(bound.upper, digits)}$`;
  else {
    const [lo, hi] = bound.interval ?? [null, null];
    if (lo !== null && hi !== null) text = `$${symbol} \\in [${numberLatex(lo, digits)}, ${numberLatex(hi, digits)}]$`;
    else if (lo !== null) text = `$${symbol} \\ge ${numberLatex(lo, digits)}$`;
    else text = `$${symbol} \\le ${numberLatex(hi ?? Number.NaN, digits)}$`;
  }
  return bound.parameter === "ppe_beta" ? `${text} at $b = ${bound.b}$` : text;
}

function quantityCell(result: ConvertResult): string {
  const unit = unitLatex(result.coupling.unit);
  return `$${result.coupling.latex}$${unit ? ` [$${unit}$]` : ""}`;
}

function limitCell(result: ConvertResult, digits: number): string {
  return `$${result.coupling.side === "upper" ? "\\le" : "\\ge"} ${numberLatex(result.coupling.value, digits)}$`;
}

function citeCell(result: ConvertResult): string {
  const keys = [...new Set(result.references.map((r) => r.key))];
  return keys.length > 0 ? `\\cite{${keys.join(",")}}` : "--";
}

function groupHead(record: SheetRecord, digits: number, withCredibility: boolean): string {
  const who = [record.label, record.detector_network].filter(Boolean).map(escapeLatex).join(", ");
  const cred = withCredibility ? ` (${percent(record.bound.credibility)})` : "";
  return `\\multicolumn{${COLUMNS}}{@{}>{\\raggedright\\arraybackslash}p{\\linewidth}@{}}{\\textit{${who}}: ${boundLatex(record, digits)}${cred}}`;
}

const COLUMNS = 5;

export function sheetToLatex(sheet: Sheet, options: { digits?: number } = {}): string {
  const digits = options.digits ?? 2;
  const lines = exportLines(sheet).filter((l) => l.kind === "limit");
  const creds = [...new Set(sheet.records.map((r) => r.bound.credibility))];
  const perGroupCredibility = creds.length > 1;
  const body: string[] = [];
  const seen = new Set<LimitVerdict>();
  let current: number | null = null;
  for (const line of lines) {
    if (line.kind !== "limit") continue;
    const { record, result } = line;
    if (record.id !== current) {
      if (current !== null) body.push("    \\addlinespace");
      body.push(`    ${groupHead(record, digits, perGroupCredibility)} \\\\`);
      current = record.id;
    }
    const verdict = limitVerdict(result);
    seen.add(verdict);
    const cells = [escapeLatex(shortTheoryName(result.theory_name, result.theory)), quantityCell(result), limitCell(result, digits), VERDICT_MARK[verdict], citeCell(result)];
    body.push(`    ${cells.join(" & ")} \\\\`);
  }
  if (body.length === 0) body.push(`    \\multicolumn{${COLUMNS}}{@{}l}{No limits in this sheet.} \\\\`);
  const credibilityText = creds.length === 1 ? ` at ${percent(creds[0]!)} credibility` : creds.length > 1 ? " at the credibility given beside each bound" : "";
  const legend = (["valid", "caution", "not_valid", "not_assessed"] as const).filter((v) => seen.has(v)).map((v) => `${VERDICT_MARK[v]}~${VERDICT_LEGEND[v]}`);
  const caption = [
    "Limits on theory couplings translated from the bounds of ``" + escapeLatex(sheet.name) + `''${credibilityText}.`,
    "Leading post-Newtonian mappings; a flat prior on the deviation is not flat in the coupling.",
    ...(legend.length > 0 ? [`${legend.join("; ")}.`] : []),
  ].join(" ");
  return [
    "% Generated by Dragoman; needs \\usepackage{booktabs,tabularx}. The citation keys are those of the BibTeX export.",
    "\\begin{table}",
    "  \\centering",
    "  \\small",
    "  \\setlength{\\tabcolsep}{3pt}",
    `  \\caption{${caption}}`,
    `  \\label{tab:${fileStem(sheet.name)}}`,
    "  \\smallskip",
    // Two wrapping columns share the free width: the theory name (1.3 parts) and its citations (0.7);
    // \hspace{0pt} lets TeX hyphenate a cell's first word (Noncommutative) in a narrow column.
    "  \\begin{tabularx}{\\linewidth}{@{}>{\\raggedright\\arraybackslash\\hsize=1.3\\hsize\\hspace{0pt}}X l l c >{\\raggedright\\arraybackslash\\hsize=0.7\\hsize\\hspace{0pt}}X@{}}",
    "    \\toprule",
    "    Theory & Coupling & Limit & {} & Ref. \\\\",
    "    \\midrule",
    ...body,
    "    \\bottomrule",
    "  \\end{tabularx}",
    "\\end{table}",
    "",
  ].join("\n");
}
