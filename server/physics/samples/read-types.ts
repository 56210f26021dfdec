export interface ReadOptions {
  /** The upload's own name, used in every message. */
  fileLabel: string;
  /** HDF5 group or dataset path (or a JSON key) holding the table. */
  table?: string | undefined;
  maxRows: number;
  /** Fraction of the file read so far; may throw JobCancelled. */
  onProgress?: (fraction: number) => Promise<void> | void;
}

export interface ReadColumns {
  rows: number;
  /** Wanted column name -> values (NaN and +-Infinity kept; the pipeline counts and skips them). */
  columns: Map<string, Float64Array>;
  /** Every column name the table has. */
  header: string[];
}

export interface ColumnSource {
  read(filePath: string, wanted: readonly string[], options: ReadOptions): Promise<ReadColumns>;
}
