import { open, stat } from "node:fs/promises";
import type { FilePreview } from "../../../common/jobs.ts";
import { listHdf5Tables, openHdf5 } from "../../physics/samples/read-hdf5.ts";
import { readJsonColumns } from "../../physics/samples/read-json.ts";
import { SampleInputError } from "../../physics/samples/sample-input-error.ts";
import { ValidationError } from "../../errors.ts";
import { sniffFormat, type StoredUpload } from "./upload.ts";

/**
 * The column picker's preview: the tables of a file, each column's first rows and statistics over
 * the first PREVIEW_ROWS rows. Cheap by construction (the first 256 KiB of text, HDF5 metadata and
 * slices, JSON only up to 4 MiB), so it may run on the web process.
 */

const PREVIEW_ROWS = 1000;
const SHOWN = 5;
const TEXT_BYTES = 256 << 10;
const JSON_PREVIEW_MAX = 4 << 20;

function column(name: string, values: ArrayLike<number>) {
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  let finite = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!Number.isFinite(v)) continue;
    finite++;
    sum += v;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return {
    name,
    first: Array.from({ length: Math.min(SHOWN, values.length) }, (_, i) => (Number.isFinite(values[i]!) ? values[i]! : null)),
    numeric: finite > 0,
    min: finite ? min : null,
    max: finite ? max : null,
    mean: finite ? sum / finite : null,
    non_finite: values.length - finite,
  };
}

export async function previewFile(upload: StoredUpload): Promise<FilePreview> {
  const format = await sniffFormat(upload.path);
  const file = { name: upload.originalname, bytes: upload.size, format };
  try {
    if (format === "hdf5") {
      const f = await openHdf5(upload.path, upload.originalname);
      try {
        const tables = listHdf5Tables(f).slice(0, 10);
        return {
          file,
          tables: tables.map((t) => {
            const rows = Math.min(PREVIEW_ROWS, t.rows);
            if (t.kind === "compound") {
              const ds = f.get(t.path) as unknown as { slice(r: [number, number][]): unknown };
              const part = (ds.slice([[0, rows]]) ?? []) as unknown[][];
              return { path: t.path, rows: t.rows, columns: t.columns.map((name, k) => column(name, part.map((r) => Number(r[k])))) };
            }
            return {
              path: t.path,
              rows: t.rows,
              columns: t.columns.map((name) => {
                const ds = f.get(`${t.path === "/" ? "" : t.path}/${name}`) as unknown as { slice(r: [number, number][]): unknown };
                const part = ds.slice([[0, rows]]);
                return column(name, ArrayBuffer.isView(part) ? Array.from(part as unknown as ArrayLike<number | bigint>, Number) : []);
              }),
            };
          }),
        };
      } finally {
        f.close();
      }
    }
    if (format === "json") {
      if ((await stat(upload.path)).size > JSON_PREVIEW_MAX) return { file, tables: [], note: "JSON files over 4 MiB are not previewed: type the column names (and the key path as the table)." };
      const read = await readJsonColumns(upload.path, [], { fileLabel: upload.originalname, maxRows: Number.MAX_SAFE_INTEGER }).catch(() => null);
      if (!read) return { file, tables: [], note: "No columns found at the top level: give the key path holding them as the table." };
      const full = await readJsonColumns(upload.path, read.header.slice(0, 60), { fileLabel: upload.originalname, maxRows: Number.MAX_SAFE_INTEGER }).catch(() => null);
      return { file, tables: [{ path: null, rows: full?.rows ?? null, columns: read.header.slice(0, 60).map((h) => column(h, (full?.columns.get(h) ?? new Float64Array()).subarray(0, PREVIEW_ROWS))) }] };
    }
    const fh = await open(upload.path, "r");
    let text: string;
    try {
      const buf = Buffer.alloc(TEXT_BYTES);
      const { bytesRead } = await fh.read(buf, 0, TEXT_BYTES, 0);
      text = buf.subarray(0, bytesRead).toString("utf8").replace(/^\uFEFF/, "");
    } finally {
      await fh.close();
    }
    const lines = text.split(/\r?\n/);
    if (upload.size > TEXT_BYTES) lines.pop(); // a cut line
    const useful = lines.filter((l) => l.trim() !== "");
    const headerLine = (useful[0] ?? "").replace(/^\s*#\s*/, "");
    const delimiter = headerLine.includes(",") ? "," : headerLine.includes("\t") ? "\t" : null;
    const split = (l: string) => (delimiter ? l.split(delimiter) : l.trim().split(/[ \t]+/)).map((c) => c.trim().replace(/^"(.*)"$/, "$1"));
    const header = split(headerLine);
    const rows = useful.slice(1).filter((l) => !l.trimStart().startsWith("#")).slice(0, PREVIEW_ROWS).map(split);
    return {
      file,
      tables: [{ path: null, rows: null, columns: header.slice(0, 60).map((h, k) => column(h, rows.map((r) => (r[k] === undefined || r[k] === "" ? Number.NaN : Number(r[k]))))) }],
      note: upload.size > TEXT_BYTES ? `Statistics over the first ${rows.length} rows.` : undefined,
    };
  } catch (err) {
    if (err instanceof SampleInputError) throw new ValidationError(`Invalid file: ${err.message}`, { file: err.message });
    throw err;
  }
}
