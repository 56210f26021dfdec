import type { ConvertResult, NotApplicable } from "../../../common/convert.ts";
import { sciText, thresholdText } from "../../../common/number-text.ts";
import type { Sheet, SheetRecord } from "../../../common/sheets.ts";

/**
 * One line per (record, theory): the flat view every tabular export (CSV, LaTeX) is built from, so
 * the formats cannot drift apart in what they list.
 */
export type ExportLine =
  | { kind: "limit"; record: SheetRecord; result: ConvertResult }
  | { kind: "not_applicable"; record: SheetRecord; item: NotApplicable };

export function exportLines(sheet: Sheet, options: { includeNotApplicable?: boolean } = {}): ExportLine[] {
  const lines: ExportLine[] = [];
  for (const record of [...sheet.records].sort((a, b) => a.position - b.position)) {
    for (const result of record.translation.results) lines.push({ kind: "limit", record, result });
    if (options.includeNotApplicable) {
      for (const item of record.translation.not_applicable) lines.push({ kind: "not_applicable", record, item });
    }
  }
  return lines;
}

/** "b = -7" or "k = -2": how the record's bound is indexed. */
export function boundIndex(record: SheetRecord): { b: number | null; k: number | string | null } {
  return record.bound.parameter === "ppe_beta" ? { b: record.bound.b, k: null } : { b: record.translation.bound.b, k: record.bound.k };
}

/** The conditions that failed at the limit, as "label: value > max", the threshold as people write it (1/6). */
export function failedConditions(result: ConvertResult): string[] {
  return result.validity.filter((v) => !v.ok).map((v) => `${v.label}: ${v.value === null ? "not a number" : sciText(v.value, 3)} > ${thresholdText(v.max)}`);
}
