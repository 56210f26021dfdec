import Papa from "papaparse";
import { SAMPLE_COLUMNS } from "../../../common/convert-samples.ts";
import { ValidationError } from "../../errors.ts";

/**
 * Reads a posterior-samples upload: a header row naming beta, m1, m2 and optionally chi1, chi2, z,
 * one sample per line. Cells that are not numbers stay text so the request schema reports the column
 * and the first bad row, exactly as for a JSON body.
 */
export function parseSamplesCsv(text: string, field = "file"): Record<string, unknown[]> {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), {
    header: true,
    skipEmptyLines: "greedy",
    dynamicTyping: false,
    transformHeader: (h) => h.trim().toLowerCase(),
  });
  const headers = parsed.meta.fields ?? [];
  const missing = ["beta", "m1", "m2"].filter((c) => !headers.includes(c));
  if (missing.length > 0) {
    throw new ValidationError(`The CSV needs a header row with the columns beta, m1, m2; it lacks ${missing.join(", ")}.`, { [field]: `missing column ${missing[0]}` });
  }
  const unknown = headers.filter((h) => h !== "" && !(SAMPLE_COLUMNS as readonly string[]).includes(h));
  if (unknown.length > 0) {
    throw new ValidationError(`The CSV has columns Dragoman does not read: ${unknown.join(", ")} (use ${SAMPLE_COLUMNS.join(", ")}).`, { [field]: `unknown column ${unknown[0]}` });
  }
  const structural = parsed.errors[0];
  if (structural) {
    const line = structural.row === undefined ? "" : ` on CSV line ${structural.row + 2}`;
    throw new ValidationError(`The CSV could not be read${line}: ${structural.message}.`, { [field]: `${structural.message}${line}` });
  }
  const columns: Record<string, unknown[]> = {};
  for (const h of headers) {
    columns[h] = parsed.data.map((r) => {
      const t = (r[h] ?? "").trim();
      const n = t === "" ? Number.NaN : Number(t);
      return Number.isFinite(n) ? n : t;
    });
  }
  return columns;
}
