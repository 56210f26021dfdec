import { catalogueVersionText } from "../../../common/catalogue-version.ts";
import { sciText, thresholdText } from "../../../common/number-text.ts";
import type { RingdownResult } from "../../../common/ringdown.ts";
import { ringdownLimitOf } from "../../../common/ringdown-limit.ts";
import type { ConsistencyRecord, RingdownRecord, SamplesJobRecord, Sheet, StackRecord, TranslationRecord } from "../../../common/sheets.ts";
import { conditionText, symbolText } from "../../../common/symbol-text.ts";
import { boundIndex, bytesText, columnsText, exportLines, failedConditions, priorText } from "./export-rows.ts";

/**
 * CSV (RFC 4180: comma-separated, CRLF line ends, fields quoted when they hold a comma, quote or line
 * break). Text cells that a spreadsheet would run as a formula (=, +, -, @ first) get a leading
 * apostrophe; numbers are written as numbers, so a negative b stays a number. One line per limit of a
 * translation, per samples or stacking result, and per consistency result; `kind` says which.
 * `symbol` is the coupling as a physicist writes it (√α, λ_g); `coupling_id` is the identifier of the
 * same quantity, for scripts.
 */
type Cell = string | number | boolean | null;

export const CSV_COLUMNS = [
  "record",
  "kind",
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
  "job",
  "files",
  "prior",
  "effective_sample_size",
  "fraction_outside",
  "gr_quantile",
  "details",
] as const;
type Column = (typeof CSV_COLUMNS)[number];
type Row = Partial<Record<Column, Cell>>;

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

const provenance = (r: { label: string; kind: string; detector_network: string; analysis_method: string; data_link: string }): Row => ({
  record: r.label,
  kind: r.kind,
  detector_network: r.detector_network,
  analysis_method: r.analysis_method,
  data_link: r.data_link,
});

function translationCommon(r: TranslationRecord): Row {
  const { b, k } = boundIndex(r);
  return {
    ...provenance(r),
    parameter: r.bound.parameter,
    b,
    k,
    upper: r.bound.upper ?? null,
    interval_lo: r.bound.interval?.[0] ?? null,
    interval_hi: r.bound.interval?.[1] ?? null,
    credibility: r.bound.credibility,
    f_low: r.bound.f_low,
    sign_convention: r.bound.parameter === "ppe_beta" ? r.bound.sign_convention : null,
    m1: r.binary.m1,
    m2: r.binary.m2,
    chi1: r.binary.chi1,
    chi2: r.binary.chi2,
    bodies: r.binary.bodies.join("-"),
    frame: r.binary.frame,
    z: r.binary.z ?? null,
    H0: r.translation.cosmology.H0,
    Omega_m: r.translation.cosmology.Omega_m,
    catalogue_version: catalogueCell(r.translation.catalogue_revision),
  };
}

const fileCell = (f: { name: string; bytes: number; sha256: string | null }) => `${f.name} (${bytesText(f.bytes)}${f.sha256 ? `, sha256 ${f.sha256}` : ""})`;

/** The coupling cells of a samples or stacking result: a bound, or a signed interval written out in `also`. */
function couplingCells(c: SamplesJobRecord["result"]["coupling"]): Row {
  return {
    symbol: symbolText(c.symbol, c.latex),
    coupling_id: c.symbol,
    side: c.side,
    value: c.value ?? null,
    unit: c.unit,
    also: c.signed_interval ? `${sciText(c.signed_interval[0], 4)} ≤ ${symbolText(c.symbol, c.latex)} ≤ ${sciText(c.signed_interval[1], 4)} ${c.unit}` : "",
  };
}

function samplesRow(r: SamplesJobRecord): Row {
  const x = r.result;
  const q = r.request;
  const columns = columnsText(x.columns);
  return {
    ...provenance(r),
    parameter: q.parameter,
    b: x.b,
    k: q.parameter === "gimr_dphi" ? (q.k ?? null) : null,
    credibility: x.credibility,
    f_low: q.f_low,
    sign_convention: q.parameter === "ppe_beta" ? q.sign_convention : null,
    bodies: q.bodies.join("-"),
    frame: x.frame,
    H0: q.cosmology?.H0 ?? null,
    Omega_m: q.cosmology?.Omega_m ?? null,
    theory: x.theory,
    status: "bounded",
    ...couplingCells(x.coupling),
    valid: x.verdict === "valid",
    verdict: x.verdict,
    failed_conditions: x.conditions.filter((c) => c.fraction_outside > 0).map((c) => `${conditionText(c.label)}: ${(c.fraction_outside * 100).toPrecision(3)}% of samples outside`).join("; "),
    catalogue_version: catalogueCell(x.catalogue_revision),
    job: r.job.id,
    files: fileCell(r.file),
    prior: priorText(x.prior),
    effective_sample_size: x.effective_sample_size,
    fraction_outside: x.fraction_outside,
    details: [
      `samples read ${x.samples.read}, used ${x.samples.used}, dropped ${x.samples.dropped}`,
      `analysis prior uniform in ${x.analysis_prior.parameter === "ppe_beta" ? "beta" : "dphi"} over [${x.analysis_prior.range[0].toPrecision(3)}, ${x.analysis_prior.range[1].toPrecision(3)}]`,
      `columns ${columns}`,
      ...(x.table ? [`table ${x.table}`] : []),
    ].join("; "),
  };
}

function stackRow(r: StackRecord): Row {
  const x = r.result;
  const q = r.request;
  const events = x.events.map((e) => `${e.label} (${e.kind}${e.used ? "" : `, not used: ${e.reason ?? "excluded"}`}${e.interval ? `, interval [${e.interval[0].toPrecision(3)}, ${e.interval[1].toPrecision(3)}]` : e.bound !== null ? `, bound ${e.bound.toPrecision(3)}` : ""}${e.verdict ? `, ${e.verdict}` : ""})`);
  return {
    ...provenance(r),
    parameter: q.parameter,
    b: q.b ?? null,
    k: q.k ?? null,
    credibility: x.credibility,
    f_low: q.f_low,
    bodies: q.bodies.join("-"),
    H0: q.cosmology?.H0 ?? null,
    Omega_m: q.cosmology?.Omega_m ?? null,
    theory: x.theory,
    status: "bounded",
    ...couplingCells(x.coupling),
    valid: x.verdict === "valid",
    verdict: x.verdict,
    job: r.job.id,
    files: r.event_files.flatMap((e) => (e.file ? [`${e.label}: ${fileCell(e.file)}`] : [])).join("; "),
    prior: priorText(x.prior),
    fraction_outside: x.fraction_outside,
    details: `events: ${events.join("; ")}`,
  };
}

function consistencyRow(r: ConsistencyRecord): Row {
  const x = r.result;
  const [dm, dchi] = x.deviation.mean;
  const [[cmm, cmc], [, ccc]] = x.deviation.covariance;
  const frame = r.summaries?.frame ?? r.job?.request.frame ?? null;
  const z = r.summaries?.z ?? r.job?.request.z ?? null;
  const estimate = (what: string, e: { M_f: number; chi_f: number; sigma_M_f: number; sigma_chi_f: number; rho?: number | undefined }) =>
    `${what} M_f = ${e.M_f} ± ${e.sigma_M_f}, chi_f = ${e.chi_f} ± ${e.sigma_chi_f}${e.rho !== undefined ? `, rho = ${e.rho}` : ""}`;
  return {
    ...provenance(r),
    parameter: "imr_consistency",
    frame,
    z,
    status: "consistency",
    job: r.job?.id ?? null,
    files: r.job ? r.job.files.flatMap((f) => (f.name ? [`${f.role}: ${f.name}${f.bytes !== null ? ` (${bytesText(f.bytes)})` : ""}`] : [])).join("; ") : null,
    gr_quantile: x.gr_quantile,
    details: [
      `method ${x.method}`,
      `dM_f/M_f = ${dm.toPrecision(3)} ± ${Math.sqrt(cmm).toPrecision(2)}`,
      `dchi_f/chi_f = ${dchi.toPrecision(3)} ± ${Math.sqrt(ccc).toPrecision(2)}`,
      `correlation ${(cmc / Math.sqrt(cmm * ccc)).toPrecision(2)}`,
      `levels ${x.contours.map((c) => `${Math.round(c.level * 100)}%`).join(", ")}`,
      ...(x.split_frequency_hz !== undefined
        ? [`split frequency ${x.split_frequency_hz.toPrecision(3)} Hz${x.split ? ` (from the ${x.split.from === "full_signal" ? "full-signal" : "inspiral"} remnant M_f = ${x.split.M_f.toPrecision(4)}, chi_f = ${x.split.chi_f.toPrecision(3)})` : ""}`]
        : []),
      ...(r.summaries ? [estimate("inspiral", r.summaries.inspiral), estimate("merger-ringdown", r.summaries.merger_ringdown)] : []),
      ...(r.summaries?.full_signal ? [`full-signal M_f = ${r.summaries.full_signal.M_f}, chi_f = ${r.summaries.full_signal.chi_f}`] : []),
      ...x.cautions.map((c) => `caution: ${conditionText(c)}`),
    ].join("; "),
  };
}

/** A ringdown translation's line: the bound and the remnant it was measured on, and one entry's limit (or why none). */
function ringdownRow(r: RingdownRecord, x: RingdownResult): Row {
  const q = r.request;
  const t = r.translation;
  const limit = ringdownLimitOf(x);
  const failed = [...(x.lower?.validity ?? []), ...(x.upper?.validity ?? [])].filter((v) => !v.ok).map((v) => `${conditionText(v.label)}: ${v.value === null ? "not a number" : sciText(v.value, 3)} > ${thresholdText(v.max)}`);
  return {
    ...provenance(r),
    parameter: `${q.bound.parameter}_${q.bound.mode}`,
    upper: q.bound.upper ?? null,
    interval_lo: q.bound.interval?.[0] ?? null,
    interval_hi: q.bound.interval?.[1] ?? null,
    credibility: q.bound.credibility,
    m1: q.binary?.m1 ?? null,
    m2: q.binary?.m2 ?? null,
    chi1: q.binary?.chi1 ?? null,
    chi2: q.binary?.chi2 ?? null,
    frame: q.remnant?.frame ?? q.binary?.frame ?? null,
    z: q.remnant?.z ?? q.binary?.z ?? null,
    theory: x.slug,
    status: x.status,
    symbol: limit ? symbolText(limit.symbol, limit.latex) : x.coupling ? symbolText(x.coupling.symbol, x.coupling.latex) : null,
    coupling_id: x.coupling?.symbol ?? null,
    side: limit ? (limit.signed_interval ? "both" : limit.side) : null,
    value: limit ? (limit.signed_interval ? null : limit.value) : null,
    unit: limit?.unit ?? x.coupling?.unit ?? null,
    also: limit?.signed_interval ? `${sciText(limit.signed_interval.lower, 4)} ≤ ${symbolText(limit.symbol, limit.latex)} ≤ ${sciText(limit.signed_interval.upper, 4)} ${limit.unit}` : "",
    valid: x.status === "bounded" ? x.verdict === "valid" : null,
    verdict: x.status === "bounded" ? x.verdict : null,
    failed_conditions: failed.join("; "),
    reason: x.reason ?? null,
    catalogue_version: t.catalogue_revision ? catalogueCell(t.catalogue_revision) : null,
    details: [
      `remnant M_f = ${t.remnant.M_f_source.toPrecision(4)} M_sun (source frame), chi_f = ${t.remnant.chi_f.toPrecision(3)} (${t.remnant.from === "fit" ? "from the binary through the Husa et al. 2016 fits" : "as given"})`,
      `Kerr (${t.qnm.mode.split("").join(",")}) mode f = ${t.qnm.frequency_hz.toPrecision(4)} Hz, tau = ${(t.qnm.damping_time_s * 1e3).toPrecision(3)} ms (${t.qnm.frame} frame)`,
      ...(x.mapping ? [`mapping ${x.mapping.kind}: ${x.mapping.expression} (${x.mapping.source_status})`] : []),
      ...x.reference_bounds.filter((c) => c.verdict !== "incomparable").map((c) => c.sentence),
    ].join("; "),
  };
}

export function sheetToCsv(sheet: Sheet): string {
  const rows: Row[] = [];
  for (const line of exportLines(sheet, { includeNotApplicable: true })) {
    switch (line.kind) {
      case "limit": {
        const x = line.result;
        rows.push({
          ...translationCommon(line.record),
          theory: x.theory,
          status: "bounded",
          convention: x.convention,
          symbol: symbolText(x.coupling.symbol, x.coupling.latex),
          coupling_id: x.coupling.symbol,
          side: x.coupling.side,
          value: x.coupling.value,
          unit: x.coupling.unit,
          also: x.also.map((a) => `${symbolText(a.symbol, a.latex)} ${a.side === "upper" ? "≤" : "≥"} ${sciText(a.value, 4)} ${a.unit}`).join("; "),
          valid: x.valid,
          verdict: x.verdict,
          failed_conditions: failedConditions(x).join("; "),
        });
        break;
      }
      case "not_applicable":
        rows.push({ ...translationCommon(line.record), theory: line.item.theory, status: "not_applicable", reason: line.item.reason });
        break;
      case "samples_job":
        rows.push(samplesRow(line.record));
        break;
      case "stack":
        rows.push(stackRow(line.record));
        break;
      case "consistency":
        rows.push(consistencyRow(line.record));
        break;
      case "ringdown":
        rows.push(ringdownRow(line.record, line.result));
        break;
    }
  }
  const lines = [CSV_COLUMNS.map(escapeCsvCell).join(","), ...rows.map((row) => CSV_COLUMNS.map((c) => escapeCsvCell(row[c] ?? null)).join(","))];
  return lines.join("\r\n") + "\r\n";
}
