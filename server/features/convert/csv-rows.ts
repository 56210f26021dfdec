import Papa from "papaparse";
import { ValidationError } from "../../errors.ts";

/**
 * Reads a table-over-b upload: a header row naming the columns b (or k), the bound as upper (|x| <= U)
 * or as lo and hi (a signed interval; leave one empty for a one-sided bound), and optionally label,
 * then one bound per line. Cells stay text here; the table schema checks them, so a bad cell is
 * reported as rows.<i>.<column> exactly as it would be for a JSON body. The message adds the CSV
 * line, which is what a person fixing the file looks for.
 */
export interface CsvRow {
  b?: number | string;
  k?: number | string;
  upper?: number | string;
  /** [lo, hi] from the lo and hi columns; an empty cell is an open side (null). */
  interval?: [number | string | null, number | string | null];
  label?: string;
}

const KNOWN = new Set(["b", "k", "upper", "lo", "hi", "label"]);

/** "-7" -> -7, "1e-3" -> 0.001; "5l" and other text stay text for the schema to judge. */
function cell(value: string | undefined): number | string | undefined {
  if (value === undefined) return undefined;
  const t = value.trim();
  if (t === "") return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

export function parseBoundsCsv(text: string, field = "file"): CsvRow[] {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), {
    header: true,
    skipEmptyLines: "greedy",
    dynamicTyping: false,
    transformHeader: (h) => h.trim().toLowerCase(),
  });
  const headers = parsed.meta.fields ?? [];
  const hasBound = headers.includes("upper") || headers.includes("lo") || headers.includes("hi");
  if (!hasBound || !(headers.includes("b") || headers.includes("k"))) {
    throw new ValidationError(`The CSV needs a header row with the columns b (or k) and upper (or lo and hi); it has ${headers.length ? headers.join(", ") : "none"}.`, {
      [field]: "needs a header row with columns b (or k) and upper (or lo and hi)",
    });
  }
  const unknown = headers.filter((h) => h !== "" && !KNOWN.has(h));
  if (unknown.length > 0) {
    throw new ValidationError(`The CSV has columns Dragoman does not read: ${unknown.join(", ")} (use b or k, upper or lo and hi, label).`, {
      [field]: `unknown column ${unknown[0]}`,
    });
  }
  const structural = parsed.errors.find((e) => e.type !== "FieldMismatch" || e.code === "TooManyFields");
  if (structural) {
    const line = structural.row === undefined ? "" : ` on data line ${structural.row + 1}`;
    throw new ValidationError(`The CSV could not be read${line}: ${structural.message}.`, { [field]: `${structural.message}${line}` });
  }
  if (parsed.data.length === 0) throw new ValidationError("The CSV has a header but no rows.", { [field]: "has no rows" });
  return parsed.data.map((r) => {
    const row: CsvRow = {};
    const b = cell(r.b);
    const k = cell(r.k);
    const upper = cell(r.upper);
    if (b !== undefined) row.b = b;
    if (k !== undefined) row.k = k;
    if (upper !== undefined) row.upper = upper;
    const lo = cell(r.lo);
    const hi = cell(r.hi);
    if (lo !== undefined || hi !== undefined) row.interval = [lo ?? null, hi ?? null];
    const label = r.label?.trim();
    if (label) row.label = label;
    return row;
  });
}

/** Adds "(CSV line n)" to each message whose field names a row (rows.<i>... by default; rowPattern captures i): line 1 is the header, so row i sits on line i + 2. */
export function withCsvLines(err: ValidationError, rowPattern: RegExp = /^rows\.(\d+)\./): ValidationError {
  if (!err.fields) return err;
  const fields: Record<string, string> = {};
  for (const [key, message] of Object.entries(err.fields)) {
    const m = rowPattern.exec(key);
    fields[key] = m ? `${message} (CSV line ${Number(m[1]) + 2})` : message;
  }
  const first = Object.entries(fields)[0];
  return new ValidationError(first ? `Invalid CSV upload: ${first[0]}: ${first[1]}` : err.message, fields);
}
