import { MAX_CURVE_POINTS } from "../../../common/forecasts.ts";
import { ValidationError } from "../../errors.ts";

/**
 * A two-column noise table (frequency in Hz, then ASD in 1/sqrt(Hz) or PSD in 1/Hz) as text:
 * commas, semicolons, tabs or spaces between columns; blank lines and # comments skipped; one
 * header line of words allowed at the top. Frequencies must increase strictly and every value must
 * be positive; the answer is always the PSD (an ASD is squared), so the engine sees one kind.
 */
export interface ParsedCurve {
  readonly frequencies: number[];
  readonly psd: number[];
}

function refuse(line: number, message: string): never {
  throw new ValidationError(`Invalid curve data: line ${line}: ${message}`, { data: `line ${line}: ${message}` });
}

export function parseCurveTable(text: string, kind: "asd" | "psd"): ParsedCurve {
  const frequencies: number[] = [];
  const psd: number[] = [];
  const lines = text.split(/\r\n|\r|\n/);
  let sawData = false;
  let sawHeader = false;
  lines.forEach((raw, i) => {
    const lineNo = i + 1;
    const t = raw.replace(/#.*$/, "").trim();
    if (t === "") return;
    const cells = t.split(/[\s,;]+/).filter(Boolean);
    const numbers = cells.map(Number);
    if (!sawData && !sawHeader && numbers.some((n) => Number.isNaN(n))) {
      sawHeader = true;
      return;
    }
    sawData = true;
    if (cells.length < 2) refuse(lineNo, "expected two columns: frequency and the spectral density");
    if (cells.length > 2) refuse(lineNo, `expected two columns, found ${cells.length}`);
    const [f, v] = numbers as [number, number];
    if (!Number.isFinite(f)) refuse(lineNo, `the frequency "${cells[0]}" is not a number`);
    if (!Number.isFinite(v)) refuse(lineNo, `the ${kind.toUpperCase()} "${cells[1]}" is not a number`);
    if (f <= 0) refuse(lineNo, `the frequency must be positive, got ${f}`);
    if (v <= 0) refuse(lineNo, `the ${kind.toUpperCase()} must be positive, got ${v}`);
    const last = frequencies[frequencies.length - 1];
    if (last !== undefined && f <= last) refuse(lineNo, `frequencies must increase strictly (${f} Hz after ${last} Hz)`);
    frequencies.push(f);
    psd.push(kind === "asd" ? v * v : v);
    if (frequencies.length > MAX_CURVE_POINTS) refuse(lineNo, `at most ${MAX_CURVE_POINTS} rows`);
  });
  if (frequencies.length < 2) {
    throw new ValidationError("Invalid curve data: at least two rows of numbers are needed", { data: "at least two rows (frequency, value) are needed" });
  }
  if (psd.some((p) => !Number.isFinite(p) || p <= 0)) {
    throw new ValidationError("Invalid curve data: a value squares to zero or overflows", { data: "a value squares to zero or overflows in double precision" });
  }
  return { frequencies, psd };
}
