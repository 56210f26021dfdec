import type { ConvertResult } from "../../../common/convert.ts";
import { shortTheoryName } from "../../../common/theory-name.ts";
import type { RingdownResult } from "../../../common/ringdown.ts";
import { ringdownLimitOf, ringdownStretched } from "../../../common/ringdown-limit.ts";
import type { ConsistencyRecord, RingdownRecord, SamplesJobRecord, Sheet, StackRecord, TranslationRecord } from "../../../common/sheets.ts";
import { unitLatex } from "../../physics/latex-format.ts";
import { exportLines, priorText } from "./export-rows.ts";
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

function boundLatex(record: TranslationRecord, digits: number): string {
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

function quantityCell(coupling: { latex: string; unit: string }): string {
  const unit = unitLatex(coupling.unit);
  return `$${coupling.latex}$${unit ? ` [$${unit}$]` : ""}`;
}

function limitCell(coupling: { side: string; value?: number | undefined; signed_interval?: [number, number] | undefined }, digits: number, fmt: (x: number, digits: number) => string = numberLatex): string {
  if (coupling.signed_interval) return `$\\in [${fmt(coupling.signed_interval[0], digits)}, ${fmt(coupling.signed_interval[1], digits)}]$`;
  return `$${coupling.side === "lower" ? "\\ge" : "\\le"} ${fmt(coupling.value ?? Number.NaN, digits)}$`;
}

/** Fractional shifts and deformations are read as plain decimals (0.10, not 1.0 \\times 10^{-1}): the ringdown rows stay narrow enough for a column. */
function shiftLatex(x: number, digits: number): string {
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1 ? x.toPrecision(Math.max(1, digits)) : numberLatex(x, digits);
}

function citeCell(keys: string[]): string {
  const unique = [...new Set(keys)];
  return unique.length > 0 ? `\\cite{${unique.join(",")}}` : "--";
}

function groupRow(record: { label: string; detector_network: string }, what: string): string {
  const who = [record.label, record.detector_network].filter(Boolean).map(escapeLatex).join(", ");
  return `\\multicolumn{${COLUMNS}}{@{}>{\\raggedright\\arraybackslash}p{\\linewidth}@{}}{\\textit{${who}}: ${what}}`;
}

function groupHead(record: TranslationRecord, digits: number, withCredibility: boolean): string {
  const cred = withCredibility ? ` (${percent(record.bound.credibility)})` : "";
  return groupRow(record, `${boundLatex(record, digits)}${cred}`);
}

/** The deviation a samples or stacking result was drawn from: "$\\beta$ at $b = -7$". */
function deviationLatex(parameter: "ppe_beta" | "gimr_dphi", b: number | undefined, k: number | string | undefined): string {
  return parameter === "ppe_beta" ? `$\\beta$ at $b = ${b ?? "?"}$` : `$\\delta\\varphi_{${k ?? "?"}}$`;
}

function samplesHead(record: SamplesJobRecord, withCredibility: boolean): string {
  const x = record.result;
  const cred = withCredibility ? `, ${percent(x.credibility)}` : "";
  return groupRow(
    record,
    `posterior samples of ${deviationLatex(record.request.parameter, x.b, record.request.k)} (${x.samples.used.toLocaleString("en-US").replace(/,/g, "\\,")} samples used, effective size ${Math.round(x.effective_sample_size).toLocaleString("en-US").replace(/,/g, "\\,")}; prior ${escapeLatex(priorText(x.prior))}${cred})`,
  );
}

function stackHead(record: StackRecord, withCredibility: boolean): string {
  const x = record.result;
  const used = x.events.filter((e) => e.used).length;
  const cred = withCredibility ? `, ${percent(x.credibility)}` : "";
  return groupRow(record, `${used} of ${x.events.length} events stacked, ${deviationLatex(record.request.parameter, record.request.b, record.request.k)} (prior ${escapeLatex(priorText(x.prior))}${cred})`);
}

const samplesVerdict = (v: "valid" | "outside_validity" | "not_assessed"): LimitVerdict => (v === "valid" ? "valid" : v === "outside_validity" ? "not_valid" : "not_assessed");

const ringdownVerdict = (r: RingdownResult): LimitVerdict => (r.verdict === "valid" ? (ringdownStretched(r) ? "caution" : "valid") : samplesVerdict(r.verdict));

/** "$|\delta f_{220}/f_{220}| \le 0.05$ at the remnant $M_f = 62\,M_\odot$, $\chi_f = 0.68$": a ringdown record's bound. */
function ringdownHead(record: RingdownRecord, digits: number, withCredibility: boolean): string {
  const b = record.request.bound;
  const mode = b.mode;
  const symbol = b.parameter === "qnm_dfreq" ? `\\delta f_{${mode}}/f_{${mode}}` : `\\delta\\tau_{${mode}}/\\tau_{${mode}}`;
  let text: string;
  if (b.upper !== undefined) text = `$|${symbol}| \\le ${numberLatex(b.upper, digits)}$`;
  else {
    const [lo, hi] = b.interval ?? [null, null];
    if (lo !== null && hi !== null) text = `$${symbol} \\in [${numberLatex(lo, digits)}, ${numberLatex(hi, digits)}]$`;
    else if (lo !== null) text = `$${symbol} \\ge ${numberLatex(lo, digits)}$`;
    else text = `$${symbol} \\le ${numberLatex(hi ?? Number.NaN, digits)}$`;
  }
  const rem = record.translation.remnant;
  const where = `at the remnant $M_f = ${numberLatex(rem.M_f_source, 3)}\\,M_\\odot$ (source frame), $\\chi_f = ${Number(rem.chi_f.toPrecision(2))}$${rem.from === "fit" ? " from the binary" : ""}`;
  const cred = withCredibility ? ` (${percent(b.credibility)})` : "";
  return groupRow(record, `${text} ${where}${cred}`);
}

const COLUMNS = 5;

function credibilityOf(r: Sheet["records"][number]): number | null {
  switch (r.kind) {
    case "translation":
      return r.bound.credibility;
    case "samples_job":
    case "stack":
      return r.result.credibility;
    case "consistency":
      return null;
    case "ringdown":
      return r.request.bound.credibility;
  }
}

export function sheetToLatex(sheet: Sheet, options: { digits?: number } = {}): string {
  const digits = options.digits ?? 2;
  const all = exportLines(sheet);
  const lines = all.filter((l) => l.kind !== "not_applicable" && l.kind !== "consistency");
  const consistency = all.flatMap((l) => (l.kind === "consistency" ? [l.record] : []));
  const creds = [...new Set(sheet.records.flatMap((r) => credibilityOf(r) ?? []))];
  const perGroupCredibility = creds.length > 1;
  const body: string[] = [];
  const seen = new Set<LimitVerdict>();
  let current: number | null = null;
  const head = (id: number, text: string) => {
    if (id === current) return;
    if (current !== null) body.push("    \\addlinespace");
    body.push(`    ${text} \\\\`);
    current = id;
  };
  const row = (theory: string, coupling: Parameters<typeof quantityCell>[0] & Parameters<typeof limitCell>[0], verdict: LimitVerdict, keys: string[], fmt?: (x: number, digits: number) => string) => {
    seen.add(verdict);
    body.push(`    ${[escapeLatex(theory), quantityCell(coupling), limitCell(coupling, digits, fmt), VERDICT_MARK[verdict], citeCell(keys)].join(" & ")} \\\\`);
  };
  for (const line of lines) {
    switch (line.kind) {
      case "limit": {
        const { record, result } = line;
        head(record.id, groupHead(record, digits, perGroupCredibility));
        row(shortTheoryName(result.theory_name, result.theory), result.coupling, limitVerdict(result), result.references.map((r) => r.key));
        break;
      }
      case "samples_job": {
        const { record } = line;
        head(record.id, samplesHead(record, perGroupCredibility));
        row(shortTheoryName(record.result.theory_name, record.result.theory), record.result.coupling, samplesVerdict(record.result.verdict), record.references.map((r) => r.key));
        break;
      }
      case "stack": {
        const { record } = line;
        head(record.id, stackHead(record, perGroupCredibility));
        row(shortTheoryName(record.result.theory_name, record.result.theory), record.result.coupling, samplesVerdict(record.result.verdict), record.references.map((r) => r.key));
        break;
      }
      case "ringdown": {
        const { record, result } = line;
        const limit = ringdownLimitOf(result);
        if (!limit) break;
        head(record.id, ringdownHead(record, digits, perGroupCredibility));
        const coupling = limit.signed_interval
          ? { latex: limit.latex, unit: limit.unit, side: "upper", signed_interval: [limit.signed_interval.lower, limit.signed_interval.upper] as [number, number] }
          : { latex: limit.latex, unit: limit.unit, side: limit.side, value: limit.value };
        row(shortTheoryName(result.name, result.slug).replace(/,$/, ""), coupling, ringdownVerdict(result), result.references.map((r) => r.key), shiftLatex);
        break;
      }
      default:
        break;
    }
  }
  if (body.length === 0 && consistency.length > 0) return consistencyLatex(sheet, consistency, digits);
  if (body.length === 0) body.push(`    \\multicolumn{${COLUMNS}}{@{}l}{No limits in this sheet.} \\\\`);
  const credibilityText = creds.length === 1 ? ` at ${percent(creds[0]!)} credibility` : creds.length > 1 ? " at the credibility given beside each bound" : "";
  const legend = (["valid", "caution", "not_valid", "not_assessed"] as const).filter((v) => seen.has(v)).map((v) => `${VERDICT_MARK[v]}~${VERDICT_LEGEND[v]}`);
  const caption = [
    "Limits on theory couplings translated from the bounds of ``" + escapeLatex(sheet.name) + `''${credibilityText}.`,
    "Leading post-Newtonian mappings; a flat prior on the deviation is not flat in the coupling.",
    ...(sheet.records.some((r) => r.kind === "ringdown") ? ["Ringdown limits come from the quasinormal-mode shifts of each entry at the remnant stated."] : []),
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
  ].join("\n") + (consistency.length > 0 ? `\n${consistencyLatex(sheet, consistency, digits)}` : "");
}

/**
 * x \pm s as a physicist writes it: the uncertainty with `digits` significant figures and the value to
 * the same decimal place, a shared power of ten outside a bracket when the numbers are small or large:
 * $-0.50 \pm 0.12$, $(-6.3 \pm 4.1) \times 10^{-2}$.
 */
export function plusMinusLatex(x: number, s: number, digits = 2): string {
  if (!Number.isFinite(x) || !Number.isFinite(s) || s <= 0) return `$${numberLatex(x, digits)}$`;
  const big = Math.max(Math.abs(x), s);
  const E = Math.floor(Math.log10(big));
  const d = Math.max(0, digits - 1 - Math.floor(Math.log10(s)));
  if (E >= -1 && E <= 2) return `$${x.toFixed(d)} \\pm ${s.toFixed(d)}$`;
  const scale = 10 ** E;
  const places = Math.max(0, d + E);
  return `$(${(x / scale).toFixed(places)} \\pm ${(s / scale).toFixed(places)}) \\times 10^{${E}}$`;
}

export function consistencyLatex(sheet: Sheet, records: ConsistencyRecord[], digits: number): string {
  const rows = records.flatMap((r, i) => {
    const [dm, dchi] = r.result.deviation.mean;
    const [[cmm], [, ccc]] = r.result.deviation.covariance;
    const who = [r.label, r.detector_network].filter(Boolean).map(escapeLatex).join(", ");
    const method = r.method === "gaussian" ? "two Gaussian remnant estimates" : "posterior samples";
    const head = `\\multicolumn{3}{@{}>{\\raggedright\\arraybackslash}p{\\linewidth}@{}}{\\textit{${who}}: ${method}}`;
    return [
      ...(i > 0 ? ["    \\addlinespace"] : []),
      `    ${head} \\\\`,
      `    ${[plusMinusLatex(dm, Math.sqrt(cmm), digits), plusMinusLatex(dchi, Math.sqrt(ccc), digits), `$${numberLatex(r.result.gr_quantile, digits)}$`].join(" & ")} \\\\`,
    ];
  });
  const caption = [
    "Inspiral-merger-ringdown consistency of ``" + escapeLatex(sheet.name) + "'':",
    "the fractional differences of the remnant mass and spin (merger-ringdown minus inspiral, over their mean), with one standard deviation,",
    "and the GR quantile, the credible level of the region whose edge passes through no deviation (small values agree with general relativity).",
  ].join(" ");
  return [
    "% Needs \\usepackage{booktabs,tabularx}.",
    "\\begin{table}",
    "  \\centering",
    "  \\small",
    "  \\setlength{\\tabcolsep}{3pt}",
    `  \\caption{${caption}}`,
    `  \\label{tab:${fileStem(sheet.name)}-imr}`,
    "  \\smallskip",
    "  \\begin{tabularx}{\\linewidth}{@{}X X l@{}}",
    "    \\toprule",
    "    $\\Delta M_f/\\bar M_f$ & $\\Delta\\chi_f/\\bar\\chi_f$ & GR quantile \\\\",
    "    \\midrule",
    ...rows,
    "    \\bottomrule",
    "  \\end{tabularx}",
    "\\end{table}",
    "",
  ].join("\n");
}
