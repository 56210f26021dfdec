import h5wasm from "h5wasm/node";
import { resolveColumn } from "./read-text.ts";
import { SampleInputError } from "./sample-input-error.ts";
import type { ReadColumns, ReadOptions } from "./read-types.ts";

/**
 * HDF5 samples through h5wasm (WebAssembly; no native build). The table is a group of 1-D numeric
 * datasets (one per column) or a 1-D compound dataset (one field per column), at `table`; without
 * `table` the file's root group is used. Read in slices so progress can be reported and large
 * columns never exist as JavaScript arrays of rows.
 */

const SLICE = 262_144;

export const HDF5_SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];

type H5Group = InstanceType<typeof h5wasm.Group>;
type H5Dataset = InstanceType<typeof h5wasm.Dataset>;

function isDataset(x: unknown): x is H5Dataset {
  return x instanceof h5wasm.Dataset;
}
function isGroup(x: unknown): x is H5Group {
  return x instanceof h5wasm.Group;
}

function toFloat64(v: unknown, n: number): Float64Array | null {
  if (v instanceof Float64Array) return v;
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    const out = new Float64Array(n);
    const src = v as unknown as ArrayLike<number | bigint>;
    for (let i = 0; i < n; i++) out[i] = Number(src[i]);
    return out;
  }
  return null;
}

export interface Hdf5Table {
  path: string;
  kind: "group" | "compound";
  columns: string[];
  rows: number;
}

/** Lists the candidate tables (groups of 1-D datasets, compound datasets), depth-first, at most 50. */
export function listHdf5Tables(root: H5Group, base = "/", out: Hdf5Table[] = []): Hdf5Table[] {
  const cols: string[] = [];
  let rows = -1;
  for (const key of root.keys()) {
    if (out.length >= 50) break;
    const child = root.get(key);
    const path = `${base === "/" ? "" : base}/${key}`;
    if (isDataset(child)) {
      const shape = child.shape ?? [];
      const compound = child.metadata.compound_type;
      if (compound && shape.length === 1) out.push({ path, kind: "compound", columns: compound.members.map((m) => m.name), rows: shape[0]! });
      else if (shape.length === 1 && !compound) {
        cols.push(key);
        rows = rows < 0 ? shape[0]! : Math.min(rows, shape[0]!);
      }
    } else if (isGroup(child)) listHdf5Tables(child, path, out);
  }
  if (cols.length > 0) out.unshift({ path: base, kind: "group", columns: cols, rows });
  return out;
}

let ready: Promise<unknown> | null = null;

export async function openHdf5(filePath: string, fileLabel: string): Promise<InstanceType<typeof h5wasm.File>> {
  ready ??= h5wasm.ready;
  await ready;
  try {
    return new h5wasm.File(filePath, "r");
  } catch (err) {
    throw new SampleInputError(`${fileLabel}: not a readable HDF5 file (${err instanceof Error ? err.message : String(err)}); is it truncated?`, { file: fileLabel });
  }
}

export async function readHdf5Columns(filePath: string, wanted: readonly string[], options: ReadOptions): Promise<ReadColumns> {
  try {
    return await readHdf5Unchecked(filePath, wanted, options);
  } catch (err) {
    if (err instanceof SampleInputError || (err instanceof Error && err.name === "JobCancelled")) throw err;
    const file = options.fileLabel;
    throw new SampleInputError(`${file}: the HDF5 file could not be read (${err instanceof Error ? err.message : String(err)}); is it truncated?`, { file, ...(options.table ? { path: options.table } : {}) });
  }
}

async function readHdf5Unchecked(filePath: string, wanted: readonly string[], options: ReadOptions): Promise<ReadColumns> {
  const file = options.fileLabel;
  const f = await openHdf5(filePath, file);
  if (!(Number(f.file_id) > 0)) throw new SampleInputError(`${file}: not a readable HDF5 file; is it truncated?`, { file });
  try {
    const path = options.table && options.table !== "" ? options.table : "/";
    let node: unknown;
    try {
      node = path === "/" ? f : f.get(path);
    } catch {
      node = null;
    }
    if (!node) {
      const tables = listHdf5Tables(f).map((t) => t.path);
      throw new SampleInputError(`${file}: there is no HDF5 path "${path}"${tables.length ? `; tables found: ${tables.slice(0, 10).join(", ")}` : ""}.`, { file, path });
    }
    const columns = new Map<string, Float64Array>();
    let rows = -1;
    const checkRows = (name: string, n: number) => {
      if (rows < 0) rows = n;
      if (n !== rows) throw new SampleInputError(`${file} (${path}): column "${name}" has ${n} rows, "${wanted[0]}" has ${rows}.`, { file, path, column: name });
      if (n > options.maxRows) throw new SampleInputError(`${file}: more than ${options.maxRows} samples (the limit for this job).`, { file, path });
    };
    let header: string[];
    const total = wanted.length;
    if (isGroup(node)) {
      header = node.keys().filter((k) => isDataset(node.get(k)));
      for (const [k, name] of wanted.entries()) {
        const ds = node.get(header[resolveColumn(header, name, file, path)]!) as H5Dataset;
        const shape = ds.shape ?? [];
        if (shape.length !== 1 || ds.metadata.compound_type) {
          throw new SampleInputError(`${file} (${path}): "${name}" is not a 1-D numeric dataset (shape ${JSON.stringify(shape)}).`, { file, path, column: name });
        }
        const n = shape[0]!;
        checkRows(name, n);
        const out = new Float64Array(n);
        for (let s = 0; s < n; s += SLICE) {
          const e = Math.min(n, s + SLICE);
          const part = toFloat64(ds.slice([[s, e]]), e - s);
          if (!part) throw new SampleInputError(`${file} (${path}): column "${name}" is not numeric (type ${JSON.stringify(ds.dtype)}).`, { file, path, column: name, row: s });
          out.set(part, s);
          await options.onProgress?.((k + e / n) / total);
        }
        columns.set(name, out);
      }
    } else if (isDataset(node) && node.metadata.compound_type && (node.shape ?? []).length === 1) {
      const members = node.metadata.compound_type.members;
      header = members.map((m) => m.name);
      const idx = wanted.map((name) => resolveColumn(header, name, file, path));
      for (const [k, j] of idx.entries()) {
        const m = members[j]!;
        if (m.type !== 0 && m.type !== 1) throw new SampleInputError(`${file} (${path}): field "${wanted[k]}" is not numeric.`, { file, path, column: wanted[k]! });
      }
      const n = node.shape![0]!;
      checkRows(wanted[0]!, n);
      const outs = wanted.map(() => new Float64Array(n));
      for (let s = 0; s < n; s += SLICE) {
        const e = Math.min(n, s + SLICE);
        const part = node.slice([[s, e]]) as unknown as unknown[][];
        for (let i = 0; i < part.length; i++) {
          const row = part[i]!;
          for (let k = 0; k < idx.length; k++) outs[k]![s + i] = Number(row[idx[k]!]);
        }
        await options.onProgress?.(e / n);
      }
      wanted.forEach((w, k) => columns.set(w, outs[k]!));
    } else {
      throw new SampleInputError(`${file}: "${path}" is neither a group of 1-D datasets nor a compound table.`, { file, path });
    }
    if (rows <= 0) throw new SampleInputError(`${file} (${path}): the table holds no samples.`, { file, path });
    return { rows, columns, header };
  } finally {
    try {
      f.close();
    } catch {
      // a file that never opened has nothing to close
    }
  }
}
