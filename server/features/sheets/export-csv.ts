import { catalogueVersionText } from "../../../common/catalogue-version.ts";
import { sciText } from "../../../common/number-text.ts";
import type { Sheet } from "../../../common/sheets.ts";
import { symbolText } from "../../../common/symbol-text.ts";
import { boundIndex, exportLines, failedConditions } from "./export-rows.ts";

/**
 * CSV (RFC 4180: comma-separated, CRLF line ends, fields quoted when they hold a comma, quote or line
 * break). Text cells that a spreadsheet would run as a formula (=, +, -, @ first) get a leading
 * apostrophe; numbers are written as numbers, so a negative b stays a number. `symbol` is the
 * coupling as a physicist writes it (√α, λ_g); `coupling_id` is the identifier of the same quantity, for scripts.
 */
type Cell = string | number | boolean | null;

export const CSV_COLUMNS = [
  "record",
  "detector_network",
  "analysis_method",
  "data_link",
  "parameter",
  "b",
  "k",
  "upper",
  "interval_lo",
  "interval_hi",
  "credibility",
  "f_low",
  "sign_convention",
  "m1",
  "m2",
  "chi1",
  "chi2",
  "bodies",
  "frame",
  "z",
  "H0",
  "Omega_m",
  "theory",
  "status",
  "convention",
  "symbol",
  "coupling_id",
  "side",
  "value",
  "unit",
  "also",
  "valid",
  "verdict",
  "failed_conditions",
  "reason",
  "catalogue_version",
] as const;

/** "15 entries, as of 2 Dec 2026, 06:30 UTC (15.21.mx5p15fd)": readable, with the exact token kept. */
const catalogueCell = (token: string) => `${catalogueVersionText(token)} (${token})`;

export function escapeCsvCell(cell: Cell): string {
  if (cell === null) return "";
  if (typeof cell === "number") return Number.isFinite(cell) ? String(cell) : "";
  if (typeof cell === "boolean") return cell ? "true" : "false";
  let s = cell;
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function sheetToCsv(sheet: Sheet): string {
  const lines: Cell[][] = [[...CSV_COLUMNS]];
  for (const line of exportLines(sheet, { includeNotApplicable: true })) {
    const r = line.record;
    const { b, k } = boundIndex(r);
    const common: Cell[] = [
      r.label,
      r.detector_network,
      r.analysis_method,
      r.data_link,
      r.bound.parameter,
      b,
      k,
      r.bound.upper ?? null,
      r.bound.interval?.[0] ?? null,
      r.bound.interval?.[1] ?? null,
      r.bound.credibility,
      r.bound.f_low,
      r.bound.parameter === "ppe_beta" ? r.bound.sign_convention : null,
      r.binary.m1,
      r.binary.m2,
      r.binary.chi1,
      r.binary.chi2,
      r.binary.bodies.join("-"),
      r.binary.frame,
      r.binary.z ?? null,
      r.translation.cosmology.H0,
      r.translation.cosmology.Omega_m,
    ];
    if (line.kind === "limit") {
      const x = line.result;
      lines.push([
        ...common,
        x.theory,
        "bounded",
        x.convention,
        symbolText(x.coupling.symbol, x.coupling.latex),
        x.coupling.symbol,
        x.coupling.side,
        x.coupling.value,
        x.coupling.unit,
        x.also.map((a) => `${symbolText(a.symbol, a.latex)} ${a.side === "upper" ? "≤" : "≥"} ${sciText(a.value, 4)} ${a.unit}`).join("; "),
        x.valid,
        x.verdict,
        failedConditions(x).join("; "),
        null,
        catalogueCell(r.translation.catalogue_revision),
      ]);
    } else {
      const n = line.item;
      lines.push([...common, n.theory, "not_applicable", null, null, null, null, null, null, null, null, null, null, n.reason, catalogueCell(r.translation.catalogue_revision)]);
    }
  }
  return lines.map((cells) => cells.map(escapeCsvCell).join(",")).join("\r\n") + "\r\n";
}
