/**
 * A samples file the pipeline cannot use: the message names the file, and where it can, the HDF5
 * path, the column and the first bad row (0-based data row; `line` is the 1-based text line).
 */
export interface SampleInputLocation {
  file?: string;
  path?: string;
  column?: string;
  row?: number;
  line?: number;
}

export class SampleInputError extends Error {
  readonly location: SampleInputLocation;
  constructor(message: string, location: SampleInputLocation = {}) {
    super(message);
    this.name = "SampleInputError";
    this.location = location;
  }
}

/** A job's cancellation, noticed by the pipeline at a progress report. */
export class JobCancelled extends Error {
  constructor() {
    super("the job was cancelled");
    this.name = "JobCancelled";
  }
}
