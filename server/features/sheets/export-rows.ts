import type { ConvertResult, NotApplicable } from "../../../common/convert.ts";
import { conditionText } from "../../../common/symbol-text.ts";
import { sciText, thresholdText } from "../../../common/number-text.ts";
import { COLUMN_ROLES } from "../../../common/jobs.ts";
import type { RingdownResult } from "../../../common/ringdown.ts";
import type { ConsistencyRecord, RingdownRecord, SamplesJobRecord, Sheet, StackRecord, TranslationRecord } from "../../../common/sheets.ts";

/**
 * One line per (record, theory): the flat view every tabular export (CSV, LaTeX) is built from, so
 * the formats cannot drift apart in what they list. A samples or stacking result is one limit line;
 * a consistency result is one line of its own.
 */
export type ExportLine =
  | { kind: "limit"; record: TranslationRecord; result: ConvertResult }
  | { kind: "not_applicable"; record: TranslationRecord; item: NotApplicable }
  | { kind: "samples_job"; record: SamplesJobRecord }
  | { kind: "stack"; record: StackRecord }
  | { kind: "consistency"; record: ConsistencyRecord }
  /** One line per entry of a ringdown translation: bounded, or (with includeNotApplicable) why not. */
  | { kind: "ringdown"; record: RingdownRecord; result: RingdownResult };

export function exportLines(sheet: Sheet, options: { includeNotApplicable?: boolean } = {}): ExportLine[] {
  const lines: ExportLine[] = [];
  for (const record of [...sheet.records].sort((a, b) => a.position - b.position)) {
    switch (record.kind) {
      case "translation":
        for (const result of record.translation.results) lines.push({ kind: "limit", record, result });
        if (options.includeNotApplicable) {
          for (const item of record.translation.not_applicable) lines.push({ kind: "not_applicable", record, item });
        }
        break;
      case "samples_job":
        lines.push({ kind: "samples_job", record });
        break;
      case "stack":
        lines.push({ kind: "stack", record });
        break;
      case "consistency":
        lines.push({ kind: "consistency", record });
        break;
      case "ringdown":
        for (const result of record.translation.results) if (result.status === "bounded" || options.includeNotApplicable) lines.push({ kind: "ringdown", record, result });
        break;
    }
  }
  return lines;
}

/** "b = -7" or "k = -2": how the record's bound is indexed. */
export function boundIndex(record: TranslationRecord): { b: number | null; k: number | string | null } {
  return record.bound.parameter === "ppe_beta" ? { b: record.bound.b, k: null } : { b: record.translation.bound.b, k: record.bound.k };
}

/** The conditions that failed at the limit, as "label: value > max", the threshold as people write it (1/6). */
export function failedConditions(result: ConvertResult): string[] {
  return result.validity.filter((v) => !v.ok).map((v) => `${conditionText(v.label)}: ${v.value === null ? "not a number" : sciText(v.value, 3)} > ${thresholdText(v.max)}`);
}

/** "uniform in the coupling over [a, b]", "as translated (the analysis prior)", "log-uniform over [a, b]". */
export function priorText(prior: { kind: string; range: [number, number] | null }): string {
  const range = prior.range ? ` over [${prior.range[0].toPrecision(3)}, ${prior.range[1].toPrecision(3)}]` : "";
  switch (prior.kind) {
    case "as_translated":
      return "as translated (the analysis prior)";
    case "uniform":
      return `uniform in the coupling${range}`;
    case "log_uniform":
      return `log-uniform in the coupling${range}`;
    default:
      return `${prior.kind}${range}`;
  }
}

/** "1.2 MB" etc.: a file's size as people read it. */
export function bytesText(n: number): string {
  if (n < 1024) return `${n} B`;
  const units = ["kB", "MB", "GB"];
  let x = n / 1024;
  let u = 0;
  while (x >= 1024 && u < units.length - 1) {
    x /= 1024;
    u++;
  }
  return `${x.toPrecision(3)} ${units[u]}`;
}

/** "deviation=beta, m1=m1, m2=m2": a samples job's column mapping in the order of the roles. */
export function columnsText(columns: Record<string, string>): string {
  const rank = (role: string) => {
    const i = (COLUMN_ROLES as readonly string[]).indexOf(role);
    return i < 0 ? COLUMN_ROLES.length : i;
  };
  return Object.entries(columns)
    .sort(([a], [b]) => rank(a) - rank(b))
    .map(([role, name]) => `${role}=${name}`)
    .join(", ");
}
