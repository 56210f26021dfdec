import { readFile, stat } from "node:fs/promises";
import { resolveColumn } from "./read-text.ts";
import { SampleInputError } from "./sample-input-error.ts";
import type { ReadColumns, ReadOptions } from "./read-types.ts";

/**
 * JSON samples: an object of equal-length arrays ({"beta": [...], "m1": [...]}) or an array of
 * records ([{"beta": ..., "m1": ...}, ...]), at the top level or under `table` (a key path such as
 * "posterior" or "C01/posterior_samples"). null and the strings "nan"/"inf" are non-finite values.
 */

export const JSON_MAX_BYTES = 256 << 20;

const SPECIAL: Record<string, number> = { nan: Number.NaN, inf: Infinity, "+inf": Infinity, "-inf": -Infinity, infinity: Infinity, "-infinity": -Infinity };

function cellValue(v: unknown): number | null {
  if (typeof v === "number") return v;
  if (v === null) return Number.NaN;
  if (typeof v === "string") {
    const s = SPECIAL[v.trim().toLowerCase()];
    if (s !== undefined) return s;
  }
  return null;
}

export async function readJsonColumns(filePath: string, wanted: readonly string[], options: ReadOptions): Promise<ReadColumns> {
  const file = options.fileLabel;
  const size = (await stat(filePath)).size;
  if (size > JSON_MAX_BYTES) {
    throw new SampleInputError(`${file}: a JSON samples file may hold at most ${JSON_MAX_BYTES >> 20} MB; write larger posteriors as HDF5 or CSV.`, { file });
  }
  let doc: unknown;
  try {
    doc = JSON.parse(await readFile(filePath, "utf8"));
  } catch (err) {
    throw new SampleInputError(`${file}: not valid JSON (${err instanceof Error ? err.message : String(err)}); is the file truncated?`, { file });
  }
  await options.onProgress?.(0.5);
  let node = doc;
  if (options.table) {
    for (const key of options.table.split("/").filter(Boolean)) {
      if (node === null || typeof node !== "object" || Array.isArray(node) || !(key in node)) {
        throw new SampleInputError(`${file}: there is no "${options.table}" in the JSON (missing key "${key}").`, { file, path: options.table });
      }
      node = (node as Record<string, unknown>)[key];
    }
  }
  const path = options.table;
  const where = path ? ` under "${path}"` : "";
  let header: string[];
  let get: (name: string) => unknown[];
  if (Array.isArray(node)) {
    const first = node[0];
    if (first === null || typeof first !== "object" || Array.isArray(first)) {
      throw new SampleInputError(`${file}: the array${where} must hold one object per sample ({"beta": ..., "m1": ...}).`, { file, ...(path ? { path } : {}) });
    }
    header = Object.keys(first);
    const records = node as Record<string, unknown>[];
    get = (name) => records.map((r) => (r !== null && typeof r === "object" ? r[name] : undefined));
  } else if (node !== null && typeof node === "object") {
    const obj = node as Record<string, unknown>;
    header = Object.keys(obj).filter((k) => Array.isArray(obj[k]));
    if (header.length === 0) throw new SampleInputError(`${file}: no column arrays${where}; give an object of arrays or an array of records, and name the key with "table".`, { file, ...(path ? { path } : {}) });
    get = (name) => obj[name] as unknown[];
  } else {
    throw new SampleInputError(`${file}: the JSON${where} is neither an object of columns nor an array of samples.`, { file, ...(path ? { path } : {}) });
  }
  const columns = new Map<string, Float64Array>();
  let rows = -1;
  for (const name of wanted) {
    const key = header[resolveColumn(header, name, file, path)]!;
    const values = get(key);
    if (rows === -1) rows = values.length;
    if (values.length !== rows) {
      throw new SampleInputError(`${file}: column "${name}" has ${values.length} values, "${wanted[0]}" has ${rows}: all columns must be the same length.`, { file, column: name, ...(path ? { path } : {}) });
    }
    if (rows > options.maxRows) throw new SampleInputError(`${file}: more than ${options.maxRows} samples (the limit for this job).`, { file });
    const out = new Float64Array(rows);
    for (let i = 0; i < rows; i++) {
      const v = cellValue(values[i]);
      if (v === null) {
        throw new SampleInputError(`${file}: column "${name}" is not numeric: row ${i} holds ${JSON.stringify(values[i])?.slice(0, 40) ?? "nothing"}.`, { file, column: name, row: i, ...(path ? { path } : {}) });
      }
      out[i] = v;
    }
    columns.set(name, out);
  }
  if (rows <= 0) throw new SampleInputError(`${file}: the JSON holds no samples.`, { file });
  return { rows, columns, header };
}
