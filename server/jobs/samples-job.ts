import { symbolText } from "../../common/symbol-text.ts";
import { createGzip } from "node:zlib";
import { performance } from "node:perf_hooks";
import type { SamplesJobRequest, SamplesJobResult } from "../../common/jobs.ts";
import type { Caution } from "../../common/convert.ts";
import { DEFAULT_COSMOLOGY } from "../../common/convert.ts";
import { mappingCautions, selectTarget } from "../features/convert/samples-common.ts";
import type { CompiledCatalogue } from "../features/convert/compiled-catalogue.ts";
import type { CatalogueTheory } from "../physics/catalogue-mapping.ts";
import type { GimrIndex } from "../physics/taylorf2.ts";
import { quotedValueOf, type QuotedFormName } from "../physics/quoted-forms.ts";
import { runPipeline, type ColumnRole, type PipelineResult, type SampleColumns } from "../physics/samples/pipeline.ts";
import { readHdf5Columns } from "../physics/samples/read-hdf5.ts";
import { readJsonColumns } from "../physics/samples/read-json.ts";
import { readTextColumns } from "../physics/samples/read-text.ts";
import { SampleInputError } from "../physics/samples/sample-input-error.ts";

/**
 * One samples job, from a local file to a result: read the mapped columns, run the per-sample
 * pipeline, and make the stored outputs (the per-sample CSV, the values stacking needs).
 */

export interface SamplesJobInput {
  request: SamplesJobRequest & { max_samples: number };
  filePath: string;
  file: { name: string; bytes: number; sha256: string; format: "text" | "json" | "hdf5" };
  catalogue: CompiledCatalogue;
  maxNonFiniteFraction: number;
  onProgress: (fraction: number) => Promise<void>;
}

export interface SamplesJobOutput {
  result: SamplesJobResult;
  /** Stored with the result (what stacking reads). */
  blobs: { name: string; data: Buffer }[];
  /** The per-sample CSV (gzip), made after the result is stored: it is the slowest output and only a download needs it. */
  valuesCsv: () => Promise<{ name: string; data: Buffer }>;
}

export const VALUES_CSV = "values.csv.gz";

export const ESS_WARNING = 1000;

export async function runSamplesJob(input: SamplesJobInput): Promise<SamplesJobOutput> {
  const t0 = performance.now();
  const { request, file } = input;
  const target = selectTarget(input.catalogue, request);
  const roles = (Object.keys(request.columns) as ColumnRole[]).filter((r) => request.columns[r] !== undefined);
  const wanted = [...new Set(roles.map((r) => request.columns[r]!))];
  const reader = file.format === "hdf5" ? readHdf5Columns : file.format === "json" ? readJsonColumns : readTextColumns;
  const read = await reader(input.filePath, wanted, {
    fileLabel: file.name,
    table: request.table,
    maxRows: request.max_samples,
    onProgress: (f) => input.onProgress(0.4 * f),
  });
  const columns: Partial<SampleColumns> = {};
  for (const r of roles) columns[r] = read.columns.get(request.columns[r]!)!;
  const names: Partial<Record<ColumnRole, string>> = {};
  for (const r of roles) names[r] = request.columns[r]!;

  const pipeline = await runPipeline({
    entry: target.theory.theory.entry as CatalogueTheory,
    mapping: target.ready.compiled,
    parameter: request.parameter,
    ...(request.parameter === "gimr_dphi" ? { k: request.k as GimrIndex } : {}),
    includesSpin: request.includes_spin,
    signConvention: request.sign_convention,
    credibility: request.credibility,
    frame: request.frame,
    bodies: request.bodies,
    cosmology: request.cosmology ?? { ...DEFAULT_COSMOLOGY },
    fLowHz: request.f_low,
    columns: columns as SampleColumns,
    names,
    prior: { kind: request.prior.kind, range: request.prior.range },
    analysisRange: request.analysis_prior_range,
    maxNonFiniteFraction: input.maxNonFiniteFraction,
    fileLabel: file.name,
    onProgress: (f) => input.onProgress(0.4 + 0.5 * f),
  });
  const quoted = target.ready.compiled.coupling.quoted;
  const valuesCsv = async () => ({
    name: VALUES_CSV,
    data: await perSampleCsv(pipeline, quoted.symbol, target.ready.compiled.coupling.symbol, quoted.form === "identity" ? null : (v) => quotedOf(quoted.form, v)),
  });
  await input.onProgress(0.97);
  const stack = stackValues(pipeline);
  const result: SamplesJobResult = {
    theory: target.theory.theory.slug,
    theory_name: target.theory.theory.name,
    b: target.b,
    credibility: request.credibility,
    catalogue_revision: input.catalogue.revision,
    coupling: {
      symbol: quoted.symbol,
      latex: quoted.latex,
      unit: quoted.unit,
      side: pipeline.side,
      ...(pipeline.quoted.value !== undefined ? { value: pipeline.quoted.value } : {}),
      ...(pipeline.quoted.interval ? { signed_interval: pipeline.quoted.interval } : {}),
    },
    power: pipeline.power,
    range: pipeline.range,
    prior: { kind: request.prior.kind, range: request.prior.range ?? null },
    analysis_prior: { kind: "uniform", parameter: request.parameter, range: pipeline.analysis_range },
    verdict: pipeline.verdict,
    fraction_outside: pipeline.fraction_outside,
    conditions: pipeline.conditions,
    samples: { read: pipeline.samples.read, used: pipeline.samples.used, dropped: pipeline.samples.dropped, dropped_reasons: pipeline.samples.dropped_reasons },
    effective_sample_size: pipeline.effective_sample_size,
    histogram: pipeline.histogram,
    cautions: resultCautions(pipeline, request, target, symbolText(quoted.symbol, quoted.latex)),
    file,
    columns: Object.fromEntries(roles.map((r) => [r, request.columns[r]!])),
    table: request.table ?? null,
    frame: request.frame,
    seconds: (performance.now() - t0) / 1000,
  };
  return { result, blobs: [{ name: "stack.f64", data: stack }], valuesCsv };
}

function quotedOf(form: QuotedFormName, v: number): number {
  return quotedValueOf(form, v);
}

function resultCautions(p: PipelineResult, request: SamplesJobRequest, target: ReturnType<typeof selectTarget>, symbol: string): Caution[] {
  const out: Caution[] = [];
  const priorText =
    request.prior.kind === "as_translated"
      ? `Prior "as translated": the analysis prior (uniform in ${request.parameter === "ppe_beta" ? "β" : "δφ"} over [${p.analysis_range.map((v) => v.toPrecision(3)).join(", ")}]) carried through the change of variables; it is not flat in ${symbol}.`
      : `Prior ${request.prior.kind === "uniform" ? "uniform" : "log-uniform"} in the coupling${request.prior.range ? ` over [${request.prior.range.join(", ")}]` : ""}: the samples were reweighted from the analysis prior (uniform in ${request.parameter === "ppe_beta" ? "β" : "δφ"} over [${p.analysis_range.map((v) => v.toPrecision(3)).join(", ")}]).`;
  out.push({ code: "prior", message: priorText });
  if (p.effective_sample_size < ESS_WARNING) {
    out.push({ code: "prior", message: `The effective sample size is ${p.effective_sample_size.toFixed(0)} (below ${ESS_WARNING}): the reweighted bound rests on few samples and may be noisy.` });
  }
  if (!p.signed && p.samples.kept_side !== undefined && p.samples.dropped_reasons.some((r) => r.reason.includes("cannot reach"))) {
    out.push({ code: "one_signed", message: `${target.theory.theory.name} reaches one sign of beta only: ${p.samples.used} of ${p.samples.read} samples are on that side and were kept (the posterior is conditioned on the theory).` });
  }
  for (const c of p.conditions) {
    if (c.fraction_outside > 0) out.push({ code: "validity", message: `${(c.fraction_outside * 100).toPrecision(3)}% of the posterior's binaries fail “${c.label}” at the bound (${c.kind === "hard" ? "hard condition" : "rule of thumb"}).` });
    if (c.power === null) out.push({ code: "validity", message: `“${c.label}” is not a power law in the coupling: it was not assessed sample by sample.` });
  }
  for (const note of p.notes) out.push({ code: "engine", message: note });
  if (p.samples.dropped > 0) out.push({ code: "engine", message: `${p.samples.dropped} of ${p.samples.read} samples were not used: ${p.samples.dropped_reasons.map((r) => `${r.count} because ${r.reason}`).join("; ")}.` });
  out.push(...mappingCautions(target));
  return out;
}

/** row, deviation, beta, canonical coupling, quoted coupling (when different), weight. */
async function perSampleCsv(p: PipelineResult, quotedSymbol: string, canonicalSymbol: string, quoted: ((v: number) => number) | null): Promise<Buffer> {
  const gz = createGzip({ level: 1 });
  const parts: Buffer[] = [];
  gz.on("data", (c: Buffer) => parts.push(c));
  const done = new Promise<void>((resolve, reject) => {
    gz.on("end", resolve);
    gz.on("error", reject);
  });
  const s = p.perSample;
  gz.write(`row,deviation,beta,${canonicalSymbol}${quoted ? `,${quotedSymbol}` : ""},weight\n`);
  const BLOCK = 20000;
  for (let a = 0; a < s.x.length; a += BLOCK) {
    let text = "";
    const b = Math.min(s.x.length, a + BLOCK);
    for (let i = a; i < b; i++) {
      text += `${s.row[i]},${s.deviation[i]},${s.beta[i]},${s.x[i]}${quoted ? `,${quoted(s.x[i]!)}` : ""},${s.weight[i]}\n`;
    }
    if (!gz.write(text)) await new Promise((r) => gz.once("drain", r));
  }
  gz.end();
  await done;
  return Buffer.concat(parts);
}

/** [n, x..., likelihood weight..., valid lo..., valid hi...] as float64: what stacking reads. */
export function stackValues(p: PipelineResult): Buffer {
  const s = p.perSample;
  const n = s.x.length;
  const out = new Float64Array(1 + 4 * n);
  out[0] = n;
  out.set(s.x, 1);
  out.set(s.likelihoodWeight, 1 + n);
  out.set(s.validLo, 1 + 2 * n);
  out.set(s.validHi, 1 + 3 * n);
  return Buffer.from(out.buffer);
}

export function readStackValues(buf: Buffer): { x: Float64Array; lw: Float64Array; validLo: Float64Array; validHi: Float64Array } {
  const all = new Float64Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength));
  const n = all[0]!;
  return { x: all.subarray(1, 1 + n), lw: all.subarray(1 + n, 1 + 2 * n), validLo: all.subarray(1 + 2 * n, 1 + 3 * n), validHi: all.subarray(1 + 3 * n, 1 + 4 * n) };
}

export { SampleInputError };
