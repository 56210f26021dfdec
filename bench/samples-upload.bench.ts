// npm run bench: a 1,000,000-sample posterior from upload to result through the real server and one
// worker process (POST /api/v1/jobs/samples, then GET /api/v1/jobs/:id until done), as CSV and as
// HDF5, while /api/health is polled. Baselines measured in the same run: the worker's job on the same
// local file in this process (the compute floor: read, pipeline, outputs, no upload or database), and
// health latency with nothing running. Not a test: prints times and ratios, asserts nothing.
import { execFileSync, fork, type ChildProcess } from "node:child_process";
import { openAsBlob } from "node:fs";
import { mkdtemp, rm, stat, writeFile } from "node:fs/promises";
import { loadavg, tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { samplesJobRequestSchema } from "../common/jobs.ts";
import { createDb, migrateLatest } from "../server/db/knex.ts";
import { runSamplesJob } from "../server/jobs/samples-job.ts";
import { tokensService } from "../server/features/accounts/tokens-service.ts";
import { upsertUserWithRoles } from "../server/features/accounts/accounts-service.ts";
import { catalogueSeed } from "../seeds/catalogue.ts";
import { seedCatalogue } from "../tests/api/convert-fixture.ts";
import { gaussian, writeHdf5 } from "../tests/helpers/samples-data.ts";

const N = Number(process.env.SAMPLES_BENCH_N ?? 1_000_000);
const PGPORT = process.env.BENCH_PGPORT ?? "54359";
const pgEnv = { ...process.env, PGPORT, PGDATA_DIR: ".data/pg-bench", PG_DATABASES: "dragoman_bench", PG_THROWAWAY: "1" };
const DB = "dragoman_bench_upload";
const wasRunning = (() => {
  try {
    execFileSync("bash", ["scripts/pg.sh", "status"], { env: pgEnv, stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
})();

type Report = { max: number; p99: number; mean: number };

async function database(): Promise<string> {
  const base = execFileSync("bash", ["scripts/pg.sh", "start"], { env: pgEnv, encoding: "utf8", stdio: ["ignore", "pipe", "inherit"] }).trim();
  const admin = createDb(`${base}postgres`, { max: 1 });
  await admin.raw(`drop database if exists "${DB}" with (force)`);
  await admin.raw(`create database "${DB}"`);
  await admin.destroy();
  return `${base}${DB}`;
}

function childEnv(databaseUrl: string): NodeJS.ProcessEnv {
  return { ...process.env, DATABASE_URL: databaseUrl, PORT: "0", LOG_LEVEL: "silent", NODE_ENV: "development", RATE_LIMIT_PER_MINUTE: "1000000", CLIENT_DIST: "dist" };
}

function startServer(databaseUrl: string): Promise<{ child: ChildProcess; url: string }> {
  const child = fork("bench/stall-server.ts", [], { execArgv: ["--import", "tsx"], env: childEnv(databaseUrl), stdio: ["ignore", "inherit", "inherit", "ipc"] });
  return new Promise((resolve, reject) => {
    child.once("error", reject);
    child.once("exit", (code) => reject(new Error(`server exited with ${code}`)));
    child.on("message", (m: { type: string; url?: string }) => {
      if (m.type === "listening" && m.url) resolve({ child, url: m.url });
    });
  });
}

function ask<T>(child: ChildProcess, type: string): Promise<T> {
  return new Promise((resolve) => {
    const on = (m: { type: string }) => {
      if (m.type !== type) return;
      child.off("message", on);
      resolve(m as T);
    };
    child.on("message", on);
    child.send({ type });
  });
}

function quantile(xs: number[], q: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))] ?? Number.NaN;
}

/** Health latencies (ms), each with the time its request started (performance.now()). */
async function pollHealth(url: string, until: Promise<unknown>): Promise<number[] & { startedAt?: number[] }> {
  let done = false;
  void until.then(
    () => (done = true),
    () => (done = true),
  );
  const latencies: number[] & { startedAt?: number[] } = [];
  latencies.startedAt = [];
  while (!done) {
    const t0 = performance.now();
    const res = await fetch(`${url}/api/health`);
    await res.arrayBuffer();
    latencies.push(performance.now() - t0);
    latencies.startedAt.push(t0);
    await new Promise((r) => setTimeout(r, 20));
  }
  return latencies;
}

interface Timed {
  /** performance.now() when the upload was answered (202). */
  uploadEnd: number;
  upload: number;
  total: number;
  worker: number;
  status: string;
  bound: number | undefined;
}

async function uploadToResult(url: string, token: string, file: string, name: string, request: object): Promise<Timed> {
  const t0 = performance.now();
  const form = new FormData();
  form.set("request", JSON.stringify(request));
  form.set("file", await openAsBlob(file), name);
  const res = await fetch(`${url}/api/v1/jobs/samples`, { method: "POST", headers: { authorization: `Bearer ${token}` }, body: form });
  const created = (await res.json()) as { job?: { id: string }; error?: unknown };
  const upload = (performance.now() - t0) / 1000;
  if (res.status !== 202 || !created.job) throw new Error(`upload answered ${res.status}: ${JSON.stringify(created).slice(0, 300)}`);
  for (;;) {
    const view = (await (await fetch(`${url}/api/v1/jobs/${created.job.id}`)).json()) as { status: string; result?: { seconds: number; coupling: { value?: number } }; error?: unknown };
    if (["done", "failed", "cancelled"].includes(view.status)) {
      if (view.status !== "done") throw new Error(`job ${view.status}: ${JSON.stringify(view.error)}`);
      return { uploadEnd: t0 + upload * 1000, upload, total: (performance.now() - t0) / 1000, worker: view.result!.seconds, status: view.status, bound: view.result!.coupling.value };
    }
    await new Promise((r) => setTimeout(r, 50));
  }
}

function healthLine(label: string, xs: number[], loop: Report): string {
  const f = (x: number) => x.toFixed(1).padStart(6);
  return `  ${label.padEnd(30)} health n=${String(xs.length).padStart(4)} p50 ${f(quantile(xs, 0.5))} ms  p99 ${f(quantile(xs, 0.99))} ms  max ${f(Math.max(...xs))} ms | server event-loop delay max ${f(loop.max)} ms`;
}

async function main(): Promise<void> {
  const dir = await mkdtemp(path.join(tmpdir(), "dragoman-bench-upload-"));
  const databaseUrl = await database();
  const db = createDb(databaseUrl, { max: 2 });
  let server: ChildProcess | undefined;
  let worker: ChildProcess | undefined;
  try {
    await migrateLatest(db);
    await db.transaction((trx) => catalogueSeed.run(trx));
    const user = await upsertUserWithRoles(db, { login: "bench-analyst", roles: [] });
    const { token } = await tokensService(db).create(user.id, "bench");

    const columns = { beta: gaussian(1, N, -5e-4, 2e-3), m1: gaussian(2, N, 12, 0.8), m2: gaussian(3, N, 6, 0.5), chi1: gaussian(4, N, 0.1, 0.05), chi2: gaussian(5, N, 0.05, 0.05) };
    const csv = path.join(dir, "posterior.csv");
    const names = Object.keys(columns) as (keyof typeof columns)[];
    const lines = [names.join(",")];
    for (let i = 0; i < N; i++) lines.push(names.map((k) => columns[k][i]).join(","));
    await writeFile(csv, `${lines.join("\n")}\n`);
    const h5 = path.join(dir, "posterior.h5");
    await writeHdf5(h5, "posterior", columns);
    const settings = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", prior: { kind: "uniform" }, columns: { deviation: "beta", m1: "m1", m2: "m2", chi1: "chi1", chi2: "chi2" } };
    process.stdout.write(`  ${N} samples: CSV ${((await stat(csv)).size / 1e6).toFixed(1)} MB, HDF5 ${((await stat(h5)).size / 1e6).toFixed(1)} MB\n`);

    // Baseline: the worker's own job on the local files, in this process (no upload, no database).
    const catalogue = seedCatalogue();
    const local = async (file: string, format: "text" | "hdf5", table?: string) => {
      const request = samplesJobRequestSchema.parse({ ...settings, ...(table ? { table } : {}) });
      const t0 = performance.now();
      await runSamplesJob({ request: { ...request, max_samples: 10_000_000 }, filePath: file, file: { name: path.basename(file), bytes: 0, sha256: "", format }, catalogue, maxNonFiniteFraction: 0.01, onProgress: async () => undefined });
      return (performance.now() - t0) / 1000;
    };
    await local(csv, "text"); // warm-up (JIT)
    const floorCsv = await local(csv, "text");
    const floorH5 = await local(h5, "hdf5", "posterior");

    const started = await startServer(databaseUrl);
    server = started.child;
    const url = started.url;
    worker = fork("server/jobs/worker-main.ts", [], { execArgv: ["--import", "tsx", ...(process.env.BENCH_WORKER_NODE_ARGS ?? "").split(" ").filter(Boolean)], env: childEnv(databaseUrl), stdio: ["ignore", "ignore", "inherit", "ipc"] });
    await new Promise((r) => setTimeout(r, 3000));
    // Warm-up job (JIT in the worker, catalogue cache): a small file.
    const small = path.join(dir, "small.csv");
    await writeFile(small, `${lines.slice(0, 20001).join("\n")}\n`);
    await uploadToResult(url, token, small, "small.csv", settings);

    await ask(server, "reset");
    const quiet = await pollHealth(url, new Promise((r) => setTimeout(r, 3000)));
    const quietLoop = await ask<Report>(server, "report");

    const runs: { label: string; floor: number; t: Timed; health: number[] & { startedAt?: number[] }; loop: Report }[] = [];
    for (const [label, file, name, floor, extra] of [
      ["CSV", csv, "posterior.csv", floorCsv, {}],
      ["HDF5", h5, "posterior.h5", floorH5, { table: "posterior" }],
    ] as const) {
      if (process.env.SAMPLES_UPLOAD_ONLY && process.env.SAMPLES_UPLOAD_ONLY !== label) continue;
      await ask(server, "reset");
      const job = uploadToResult(url, token, file, name, { ...settings, ...extra });
      const health = await pollHealth(url, job);
      const t = await job;
      runs.push({ label, floor, t, health, loop: await ask<Report>(server, "report") });
    }

    process.stdout.write(`  machine load average (1 min) at the end: ${loadavg()[0]!.toFixed(1)} on ${(await import("node:os")).cpus().length} cores\n`);
    process.stdout.write(`  upload to result, ${N} samples (EdGB, b = -7, uniform prior in the coupling), one worker process:\n`);
    for (const r of runs) {
      process.stdout.write(
        `  ${r.label.padEnd(5)} total ${r.t.total.toFixed(2)} s (goal < 10 s: ${r.t.total < 10 ? "met" : "NOT met"})  = upload+store ${r.t.upload.toFixed(2)} s, then queue+worker ${(r.t.total - r.t.upload).toFixed(2)} s (job's own ${r.t.worker.toFixed(2)} s)  | baseline in-process job ${r.floor.toFixed(2)} s, ratio ${(r.t.total / r.floor).toFixed(2)}\n`,
      );
    }
    process.stdout.write(healthLine("baseline (health alone)", quiet, quietLoop) + "\n");
    for (const r of runs) {
      const at = r.health.startedAt ?? [];
      const during = r.health.filter((_, i) => (at[i] ?? 0) < r.t.uploadEnd);
      const after = r.health.filter((_, i) => (at[i] ?? 0) >= r.t.uploadEnd);
      process.stdout.write(healthLine(`${r.label}: all`, r.health, r.loop) + "\n");
      if (during.length) process.stdout.write(healthLine(`${r.label}: during the upload`, during, r.loop).replace(/ \|.*$/, "") + "\n");
      if (after.length) process.stdout.write(healthLine(`${r.label}: while the worker runs`, after, r.loop).replace(/ \|.*$/, "") + "\n");
    }
    const worst = Math.max(...runs.flatMap((r) => r.health));
    process.stdout.write(`  goal: /api/health within 100 ms while a ${N}-sample job is uploaded and runs -> ${worst < 100 ? "met" : "NOT met"} (max ${worst.toFixed(1)} ms, x${(worst / Math.max(...quiet)).toFixed(1)} the baseline max)\n`);
  } finally {
    worker?.kill("SIGTERM");
    if (server) {
      server.send({ type: "stop" });
      const exited = server.exitCode !== null ? Promise.resolve() : new Promise((r) => server!.once("exit", r));
      const timer = setTimeout(() => server!.kill("SIGKILL"), 5000);
      await exited;
      clearTimeout(timer);
    }
    await db.destroy();
    await rm(dir, { recursive: true, force: true });
    const admin = createDb(databaseUrl.replace(/[^/]+$/, "postgres"), { max: 1 });
    await admin.raw(`drop database if exists "${DB}" with (force)`);
    await admin.destroy();
    if (!wasRunning) execFileSync("bash", ["scripts/pg.sh", "stop"], { env: pgEnv, stdio: "ignore" });
  }
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    process.stderr.write(`samples upload bench failed: ${err instanceof Error ? err.stack : String(err)}\n`);
    process.exit(1);
  },
);
