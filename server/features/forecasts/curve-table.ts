import { MAX_CURVE_POINTS } from "../../../common/forecasts.ts";
import { AppError } from "../../errors.ts";

/**
 * A two-column noise table (frequency in Hz, then ASD in 1/sqrt(Hz) or PSD in 1/Hz) as text:
 * commas, semicolons, tabs or spaces between columns; blank lines and # or % comments skipped; header
 * lines of words allowed before the first row of numbers. Frequencies must increase strictly and every
 * value must be positive; the answer is always the PSD (an ASD is squared), so the engine sees one
 * kind. A refusal names the line of the file and the column at fault (400, with `details.line` and
 * `details.column`), under the request field the table came in (`file` for an upload, `data` for JSON).
 */
export interface ParsedCurve {
  readonly frequencies: number[];
  readonly psd: number[];
}

export const MIN_CURVE_ROWS = 2;

export function parseCurveTable(text: string, kind: "asd" | "psd", field: "file" | "data" = "data"): ParsedCurve {
  const valueName = kind.toUpperCase();
  const columnName = (c: number) => (c === 1 ? "frequency" : valueName);
  const refuse = (line: number, column: 1 | 2 | null, message: string): never => {
    const where = `line ${line}${column === null ? "" : `, column ${column} (${columnName(column)})`}`;
    throw new AppError(400, "validation_failed", `Invalid curve ${field === "file" ? "file" : "data"}: ${where}: ${message}`, { [field]: `${where}: ${message}` }, {
      line,
      ...(column === null ? {} : { column, column_name: columnName(column) }),
    });
  };
  const frequencies: number[] = [];
  const psd: number[] = [];
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\r|\n/);
  let sawData = false;
  lines.forEach((raw, i) => {
    const lineNo = i + 1;
    const t = raw.replace(/[#%].*$/, "").trim();
    if (t === "") return;
    const cells = t.split(/[\s,;]+/).filter(Boolean).map((c) => c.replace(/^"(.*)"$/, "$1"));
    const numbers = cells.map((c) => (c.trim() === "" ? Number.NaN : Number(c)));
    // Header lines (words, no numbers) may precede the data; after the first row of numbers, a word is an error.
    if (!sawData && numbers.every((n) => Number.isNaN(n))) return;
    sawData = true;
    if (cells.length < 2) refuse(lineNo, 2, "missing: each row needs two columns, the frequency and the spectral density");
    if (cells.length > 2) refuse(lineNo, null, `expected two columns (frequency, ${valueName}), found ${cells.length}`);
    const [f, v] = numbers as [number, number];
    if (!Number.isFinite(f)) refuse(lineNo, 1, `"${cells[0]}" is not a number`);
    if (!Number.isFinite(v)) refuse(lineNo, 2, `"${cells[1]}" is not a number`);
    if (f <= 0) refuse(lineNo, 1, `the frequency must be positive, got ${f}`);
    if (v <= 0) refuse(lineNo, 2, `the ${valueName} must be positive, got ${v}`);
    const last = frequencies[frequencies.length - 1];
    if (last !== undefined && f <= last) refuse(lineNo, 1, `frequencies must increase strictly (${f} Hz after ${last} Hz)`);
    const p = kind === "asd" ? v * v : v;
    if (!Number.isFinite(p) || p <= 0) refuse(lineNo, 2, `${v} squares to ${p === 0 ? "zero" : "infinity"} in double precision`);
    frequencies.push(f);
    psd.push(p);
    if (frequencies.length > MAX_CURVE_POINTS) refuse(lineNo, null, `at most ${MAX_CURVE_POINTS} rows`);
  });
  if (frequencies.length < MIN_CURVE_ROWS) {
    const found = frequencies.length === 0 ? "none was found" : `found ${frequencies.length}`;
    throw new AppError(400, "validation_failed", `Invalid curve ${field === "file" ? "file" : "data"}: too few rows: at least ${MIN_CURVE_ROWS} rows of numbers (frequency, ${valueName}) are needed; ${found}`, {
      [field]: `too few rows: at least ${MIN_CURVE_ROWS} rows of numbers are needed; ${found}`,
    });
  }
  return { frequencies, psd };
}
