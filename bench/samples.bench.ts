// npm run bench: the per-sample pipeline of a samples job on 1,000,000 samples, beside a numpy
// implementation of the same pipeline on the same file (bench/samples_numpy.py), and the time from
// the file to the stored outputs (the worker's whole job, CSV of per-sample values included).
// Not a test: prints times and the ratio (goal: at most 2), asserts nothing but that both agree.
import { execFileSync } from "node:child_process";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { DEFAULT_COSMOLOGY } from "../common/convert.ts";
import { samplesJobRequestSchema } from "../common/jobs.ts";
import { runSamplesJob } from "../server/jobs/samples-job.ts";
import type { CatalogueTheory } from "../server/physics/catalogue-mapping.ts";
import { runPipeline } from "../server/physics/samples/pipeline.ts";
import { readTextColumns } from "../server/physics/samples/read-text.ts";
import { seedCatalogue } from "../tests/api/convert-fixture.ts";
import { gaussian } from "../tests/helpers/samples-data.ts";

const N = Number(process.env.SAMPLES_BENCH_N ?? 1_000_000);
const C = 0.9;
const PYTHON = process.env.SAMPLES_BENCH_PYTHON ?? "/usr/bin/python3";

async function main(): Promise<void> {
  const dir = await mkdtemp(path.join(tmpdir(), "dragoman-bench-"));
  try {
    const file = path.join(dir, "posterior.csv");
    const beta = gaussian(1, N, -5e-4, 2e-3);
    const m1 = gaussian(2, N, 12, 0.8);
    const m2 = gaussian(3, N, 6, 0.5);
    const chi1 = gaussian(4, N, 0.1, 0.05);
    const chi2 = gaussian(5, N, 0.05, 0.05);
    const lines: string[] = ["beta,m1,m2,chi1,chi2"];
    for (let i = 0; i < N; i++) lines.push(`${beta[i]},${m1[i]},${m2[i]},${chi1[i]},${chi2[i]}`);
    await writeFile(file, `${lines.join("\n")}\n`);
    process.stdout.write(`  ${N} samples, ${(lines.join("\n").length / 1e6).toFixed(1)} MB of CSV\n`);

    const catalogue = seedCatalogue();
    const t = catalogue.bySlug.get("edgb")!;
    const mapping = t.mappings.find((m) => m.compiled.b === -7)!.compiled;
    const once = async () => {
      const t0 = performance.now();
      const read = await readTextColumns(file, ["beta", "m1", "m2", "chi1", "chi2"], { fileLabel: "posterior.csv", maxRows: 10_000_000 });
      const t1 = performance.now();
      const col = (k: string) => read.columns.get(k)!;
      const r = await runPipeline({
        entry: t.theory.entry as CatalogueTheory,
        mapping,
        parameter: "ppe_beta",
        includesSpin: false,
        signConvention: "plus",
        credibility: C,
        frame: "source",
        bodies: ["bh", "bh"],
        cosmology: DEFAULT_COSMOLOGY,
        fLowHz: 20,
        columns: { deviation: col("beta"), m1: col("m1"), m2: col("m2"), chi1: col("chi1"), chi2: col("chi2") },
        names: {},
        prior: { kind: "uniform" },
        maxNonFiniteFraction: 0.01,
        fileLabel: "posterior.csv",
      });
      return { seconds: (performance.now() - t0) / 1000, parse: (t1 - t0) / 1000, r };
    };
    await once(); // warm-up (JIT)
    const runs = [await once(), await once(), await once()];
    const best = runs.reduce((a, b) => (b.seconds < a.seconds ? b : a));

    const py = JSON.parse(execFileSync(PYTHON, [path.join("bench", "samples_numpy.py"), file, String(C)], { encoding: "utf8" })) as {
      seconds: number;
      parse_seconds: number;
      bound: number;
      ess: number;
      used: number;
      fraction_outside: number;
    };
    const agree = Math.abs(best.r.canonical.value! / py.bound - 1);
    process.stdout.write(`  TypeScript pipeline   ${best.seconds.toFixed(3)} s  (parse ${best.parse.toFixed(3)} s)  bound alpha = ${best.r.canonical.value!.toPrecision(8)} km^2, ESS ${best.r.effective_sample_size.toFixed(0)}, used ${best.r.samples.used}\n`);
    process.stdout.write(`  numpy pipeline        ${py.seconds.toFixed(3)} s  (parse ${py.parse_seconds.toFixed(3)} s)  bound alpha = ${py.bound.toPrecision(8)} km^2, ESS ${py.ess.toFixed(0)}, used ${py.used}\n`);
    process.stdout.write(`  results agree to      ${agree.toExponential(2)} relative (ESS ${Math.abs(best.r.effective_sample_size / py.ess - 1).toExponential(2)}, fraction outside ${best.r.fraction_outside} vs ${py.fraction_outside})\n`);
    process.stdout.write(`  ratio TypeScript / numpy: ${(best.seconds / py.seconds).toFixed(2)}  (goal <= 2)\n`);
    if (agree > 1e-9 || best.r.samples.used !== py.used) process.stdout.write("  WARNING: the two pipelines disagree; the ratio compares different work\n");

    // The worker's whole job from the local file: read, pipeline, per-sample CSV (gzip), stacking values.
    const request = samplesJobRequestSchema.parse({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: C, frame: "source", prior: { kind: "uniform" }, columns: { deviation: "beta", m1: "m1", m2: "m2", chi1: "chi1", chi2: "chi2" } });
    const t0 = performance.now();
    const job = await runSamplesJob({
      request: { ...request, max_samples: 10_000_000 },
      filePath: file,
      file: { name: "posterior.csv", bytes: 0, sha256: "", format: "text" },
      catalogue,
      maxNonFiniteFraction: 0.01,
      onProgress: async () => undefined,
    });
    const whole = (performance.now() - t0) / 1000;
    const csv = await job.valuesCsv();
    const withCsv = (performance.now() - t0) / 1000;
    process.stdout.write(`  file to result (worker job, stacking values included): ${whole.toFixed(2)} s  (goal < 10 s); then the per-sample CSV (${(csv.data.length / 1e6).toFixed(1)} MB gzip) by ${withCsv.toFixed(2)} s\n`);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`samples bench failed: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
