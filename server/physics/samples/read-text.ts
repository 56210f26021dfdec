import { open } from "node:fs/promises";
import { NOT_A_NUMBER, parseNumberBytes } from "./fast-number.ts";
import { SampleInputError } from "./sample-input-error.ts";
import type { ColumnSource, ReadOptions, ReadColumns } from "./read-types.ts";

/**
 * Comma-, tab- or whitespace-separated text with a header line (a leading "#" on the header is
 * allowed, as numpy.savetxt writes it; later "#" lines are comments). Only the wanted columns are
 * parsed, straight from the bytes, chunk by chunk: a 10-million-row file never becomes one string.
 */

type Delimiter = "," | "\t" | " ";

const CHUNK = 4 << 20;

function splitHeader(line: string, delimiter: Delimiter): string[] {
  const cells = delimiter === " " ? line.trim().split(/[ \t]+/) : line.split(delimiter);
  return cells.map((c) => c.trim().replace(/^"(.*)"$/, "$1").trim());
}

function detectDelimiter(line: string): Delimiter {
  if (line.includes(",")) return ",";
  if (line.includes("\t")) return "\t";
  return " ";
}

export function resolveColumn(header: readonly string[], name: string, file: string, path?: string): number {
  let k = header.indexOf(name);
  if (k < 0) k = header.findIndex((h) => h.toLowerCase() === name.toLowerCase());
  if (k < 0) {
    const shown = header.slice(0, 30).join(", ");
    throw new SampleInputError(`${file}${path ? ` (${path})` : ""}: there is no column "${name}"; the columns are ${shown}${header.length > 30 ? ", ..." : ""}.`, {
      file,
      ...(path ? { path } : {}),
      column: name,
    });
  }
  return k;
}

/** Reads the header line only (for previews and checks). */
export async function readTextHeader(filePath: string): Promise<{ header: string[]; delimiter: Delimiter }> {
  const fh = await open(filePath, "r");
  try {
    const buf = Buffer.alloc(1 << 16);
    const { bytesRead } = await fh.read(buf, 0, buf.length, 0);
    const text = buf.subarray(0, bytesRead).toString("utf8").replace(/^\uFEFF/, "");
    const first = text.split(/\r?\n/).find((l) => l.trim() !== "") ?? "";
    const line = first.replace(/^\s*#\s*/, "");
    const delimiter = detectDelimiter(line);
    return { header: splitHeader(line, delimiter), delimiter };
  } finally {
    await fh.close();
  }
}

export async function readTextColumns(filePath: string, wanted: readonly string[], options: ReadOptions): Promise<ReadColumns> {
  const file = options.fileLabel;
  const fh = await open(filePath, "r");
  try {
    const size = (await fh.stat()).size;
    let capacity = 1 << 16;
    const out = wanted.map(() => new Float64Array(capacity));
    let rows = 0;
    let header: string[] | null = null;
    let delimiter: Delimiter = ",";
    let indices: number[] = [];
    let fieldsWanted = 0;
    let lineNo = 0;
    let carry: Buffer = Buffer.alloc(0);
    let position = 0;
    const chunk = Buffer.alloc(CHUNK);
    const starts = new Int32Array(4096);
    const ends = new Int32Array(4096);

    const grow = () => {
      capacity *= 2;
      for (let k = 0; k < out.length; k++) {
        const next = new Float64Array(capacity);
        next.set(out[k]!);
        out[k] = next;
      }
    };

    const handleLine = (buf: Buffer, s: number, e: number, last: boolean) => {
      lineNo++;
      if (lineNo === 1 && e - s >= 3 && buf[s] === 0xef && buf[s + 1] === 0xbb && buf[s + 2] === 0xbf) s += 3;
      let t = s;
      while (t < e && (buf[t] === 32 || buf[t] === 9 || buf[t] === 13)) t++;
      if (t === e) return;
      if (header === null) {
        const line = buf.toString("utf8", s, e).replace(/^\s*#\s*/, "").replace(/\r$/, "");
        delimiter = detectDelimiter(line);
        header = splitHeader(line, delimiter);
        indices = wanted.map((w) => resolveColumn(header!, w, file));
        fieldsWanted = Math.max(...indices) + 1;
        return;
      }
      if (buf[t] === 35) return; // comment
      // Field boundaries up to the last wanted column.
      let n = 0;
      if (delimiter === " ") {
        let i = t;
        while (i < e && n < fieldsWanted) {
          while (i < e && (buf[i] === 32 || buf[i] === 9 || buf[i] === 13)) i++;
          if (i >= e) break;
          const f = i;
          while (i < e && buf[i] !== 32 && buf[i] !== 9 && buf[i] !== 13) i++;
          starts[n] = f;
          ends[n] = i;
          n++;
        }
      } else {
        const d = delimiter === "," ? 44 : 9;
        let f = s;
        for (let i = s; i <= e && n < fieldsWanted; i++) {
          if (i === e || buf[i] === d) {
            starts[n] = f;
            ends[n] = i;
            n++;
            f = i + 1;
          }
        }
      }
      if (n < fieldsWanted) {
        const missing = wanted[indices.findIndex((k) => k >= n)] ?? wanted[0]!;
        throw new SampleInputError(
          `${file}: line ${lineNo} ends before column "${missing}" (${n} fields; the header has ${header.length})${last ? ": the file looks truncated" : ""}.`,
          { file, column: missing, row: rows, line: lineNo },
        );
      }
      if (rows >= options.maxRows) {
        throw new SampleInputError(`${file}: more than ${options.maxRows} samples (the limit for this job).`, { file, row: rows, line: lineNo });
      }
      if (rows === capacity) grow();
      for (let k = 0; k < indices.length; k++) {
        const j = indices[k]!;
        const v = parseNumberBytes(buf, starts[j]!, ends[j]!);
        if (v === NOT_A_NUMBER) {
          const cell = buf.toString("utf8", starts[j]!, Math.min(ends[j]!, starts[j]! + 40)).trim();
          throw new SampleInputError(`${file}: column "${wanted[k]}" is not numeric: row ${rows} (line ${lineNo}) holds "${cell}".`, {
            file,
            column: wanted[k]!,
            row: rows,
            line: lineNo,
          });
        }
        out[k]![rows] = v;
      }
      rows++;
    };

    for (;;) {
      const { bytesRead } = await fh.read(chunk, 0, CHUNK, position);
      position += bytesRead;
      const eof = bytesRead === 0;
      const buf = carry.length > 0 ? Buffer.concat([carry, chunk.subarray(0, bytesRead)]) : chunk.subarray(0, bytesRead);
      let s = 0;
      for (let i = 0; i < buf.length; i++) {
        if (buf[i] === 10) {
          handleLine(buf, s, i, false);
          s = i + 1;
        }
      }
      if (eof) {
        if (s < buf.length) handleLine(buf, s, buf.length, true);
        break;
      }
      carry = Buffer.from(buf.subarray(s));
      await options.onProgress?.(size === 0 ? 1 : position / size);
    }
    if (header === null) throw new SampleInputError(`${file}: the file is empty (no header line).`, { file });
    if (rows === 0) throw new SampleInputError(`${file}: the file has a header but no samples.`, { file });
    const columns = new Map<string, Float64Array>();
    wanted.forEach((w, k) => columns.set(w, out[k]!.subarray(0, rows)));
    return { rows, columns, header };
  } finally {
    await fh.close();
  }
}

export const textSource: ColumnSource = { read: readTextColumns };
