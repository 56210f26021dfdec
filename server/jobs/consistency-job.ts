import type { ConsistencyJobRequest, ConsistencyResult } from "../../common/consistency.ts";
import { commonCautions, splitFor } from "../features/consistency/gaussian.ts";
import { PhysicsInputError } from "../physics/input-error.ts";
import { remnantFromBinary } from "../physics/ringdown/remnant.ts";
import { remnantSampleSummary, sampleConsistency, type RemnantSamples } from "../physics/ringdown/sample-consistency.ts";
import { SampleInputError } from "../physics/samples/sample-input-error.ts";

/**
 * The sample-based consistency test as a job: two uploaded text tables (comma, tab or whitespace
 * separated, one header line) with columns M_f and chi_f, or m1 and m2 (chi1, chi2 optional), which
 * are pushed through the Husa et al. 2016 remnant fits sample by sample.
 */

export const CONSISTENCY_FILES = ["inspiral", "merger_ringdown"] as const;

const MAX_SAMPLES = 500_000;

/** Reads one table into remnant samples; errors name the file, column and line. */
export function readRemnantTable(text: string, file: string): { samples: RemnantSamples; fromFit: boolean } {
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/);
  let at = 0;
  while (at < lines.length && (lines[at]!.trim() === "" || lines[at]!.trimStart().startsWith("#"))) at += 1;
  const header = lines[at];
  if (header === undefined) throw new SampleInputError(`${file}: the file is empty`, { file });
  const split = (l: string) => l.trim().split(/[\s,;]+/);
  const names = split(header).map((h) => h.replace(/^"|"$/g, ""));
  const col = (n: string) => names.indexOf(n);
  const direct = col("M_f") >= 0 && col("chi_f") >= 0;
  const components = col("m1") >= 0 && col("m2") >= 0;
  if (!direct && !components) {
    throw new SampleInputError(`${file}: the header must name the columns M_f and chi_f, or m1 and m2 (chi1, chi2 optional); it has ${names.slice(0, 8).join(", ")}`, { file, line: at + 1 });
  }
  const M: number[] = [];
  const C: number[] = [];
  for (let i = at + 1; i < lines.length; i += 1) {
    const raw = lines[i]!;
    if (raw.trim() === "" || raw.trimStart().startsWith("#")) continue;
    const cells = split(raw);
    if (cells.length !== names.length) {
      throw new SampleInputError(`${file}: line ${i + 1} has ${cells.length} values but the header names ${names.length} columns`, { file, line: i + 1, row: M.length });
    }
    const value = (n: string): number => {
      const k = col(n);
      if (k < 0) return 0;
      const v = Number(cells[k]);
      if (!Number.isFinite(v)) throw new SampleInputError(`${file}: column ${n}, line ${i + 1}: "${cells[k]}" is not a number`, { file, column: n, line: i + 1, row: M.length });
      return v;
    };
    if (direct) {
      M.push(value("M_f"));
      C.push(value("chi_f"));
    } else {
      try {
        const r = remnantFromBinary({ m1: value("m1"), m2: value("m2"), chi1: value("chi1"), chi2: value("chi2") });
        M.push(r.M_f);
        C.push(r.chi_f);
      } catch (err) {
        if (err instanceof PhysicsInputError) throw new SampleInputError(`${file}: line ${i + 1}: ${err.message}`, { file, column: err.field, line: i + 1, row: M.length });
        throw err;
      }
    }
    if (M.length > MAX_SAMPLES) throw new SampleInputError(`${file}: more than ${MAX_SAMPLES} samples`, { file });
  }
  return { samples: { M_f: M, chi_f: C }, fromFit: !direct };
}

export async function runConsistencyJob(input: {
  request: ConsistencyJobRequest;
  files: Record<(typeof CONSISTENCY_FILES)[number], string>;
  onProgress: (f: number) => Promise<void>;
}): Promise<ConsistencyResult> {
  const I = readRemnantTable(input.files.inspiral, "inspiral");
  await input.onProgress(0.2);
  const R = readRemnantTable(input.files.merger_ringdown, "merger_ringdown");
  await input.onProgress(0.4);
  let r;
  try {
    r = sampleConsistency(I.samples, R.samples, { levels: input.request.levels });
  } catch (err) {
    if (err instanceof PhysicsInputError) throw new SampleInputError(err.message, { file: err.field.split(".")[0] ?? err.field, column: err.field.split(".")[1] ?? "" });
    throw err;
  }
  await input.onProgress(0.9);
  const mean = (xs: ArrayLike<number>) => Array.from(xs).reduce((s, x) => s + x, 0) / xs.length;
  const MI = mean(I.samples.M_f);
  const MR = mean(R.samples.M_f);
  const cI = mean(I.samples.chi_f);
  const cR = mean(R.samples.chi_f);
  const split = splitFor(input.request, { M_f: MI, chi_f: cI });
  const cautions = [...r.cautions, ...commonCautions({ M_f: MI, chi_f: cI }, { M_f: MR, chi_f: cR }, split)];
  if (I.fromFit || R.fromFit) cautions.push("Component masses and spins were pushed through the Husa et al. 2016 fits sample by sample; both files must use the same fit.");
  cautions.push("The prior that the component priors induce on (M_f, chi_f) is not removed.");
  return {
    method: "samples",
    deviation: { mean: r.deviation.mean, covariance: r.deviation.covariance },
    gr_quantile: r.gr_quantile,
    contours: r.contours,
    ...(split === undefined ? {} : { split_frequency_hz: split.frequency_hz, split }),
    cautions,
    estimates: { frame: input.request.frame, inspiral: remnantSampleSummary(I.samples), merger_ringdown: remnantSampleSummary(R.samples) },
  };
}
