// Run with: npx tsx bench/stall.bench.ts (npm run bench runs it). Starts the real server in a child
// process on a throw-away database, sends it hostile expressions, crafted definition expressions and
// 200 000-sample bodies while polling /api/health, and prints the server's event-loop delay
// (perf_hooks monitorEventLoopDelay, measured inside the server process) and the health latency,
// against a baseline measured in the same run with health polling alone. Nothing here asserts.
import { execFileSync, fork, type ChildProcess } from "node:child_process";
import { availableParallelism, loadavg } from "node:os";
import { createDb, migrateLatest } from "../server/db/knex.ts";
import { catalogueSeed } from "../seeds/catalogue.ts";
import { ACCEPTED_SAMPLES, post, SAMPLES } from "./stall-common.ts";

// The benchmarks' throw-away cluster (as bench/http-load.bench.ts): BENCH_PGPORT, .data/pg-bench.
const PGPORT = process.env.BENCH_PGPORT ?? "54359";
const pgEnv = { ...process.env, PGPORT, PGDATA_DIR: ".data/pg-bench", PG_DATABASES: "dragoman_bench", PG_THROWAWAY: "1" };
const wasRunning = (() => {
  try {
    execFileSync("bash", ["scripts/pg.sh", "status"], { env: pgEnv, stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
})();
const DB = "dragoman_bench_stall";

type Report = { max: number; p99: number; mean: number };

function quantile(xs: number[], q: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))] ?? Number.NaN;
}

async function database(): Promise<string> {
  const base = execFileSync("bash", ["scripts/pg.sh", "start"], {
    env: pgEnv,
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  }).trim();
  const admin = createDb(`${base}postgres`, { max: 1 });
  await admin.raw(`drop database if exists "${DB}" with (force)`);
  await admin.raw(`create database "${DB}"`);
  await admin.destroy();
  const db = createDb(`${base}${DB}`, { max: 2 });
  await migrateLatest(db);
  await db.transaction((trx) => catalogueSeed.run(trx));
  await db.destroy();
  return `${base}${DB}`;
}

function startServer(databaseUrl: string, env: Record<string, string>): Promise<{ child: ChildProcess; url: string }> {
  const child = fork("bench/stall-server.ts", [], {
    // STALL_CPU_PROF=<dir> writes V8 CPU profiles of the server (main thread and workers) there.
    execArgv: ["--import", "tsx", ...(process.env.STALL_CPU_PROF ? ["--cpu-prof", `--cpu-prof-dir=${process.env.STALL_CPU_PROF}`] : [])],
    env: { ...process.env, DATABASE_URL: databaseUrl, PORT: "0", LOG_LEVEL: "silent", NODE_ENV: "development", RATE_LIMIT_PER_MINUTE: "1000000", CLIENT_DIST: "dist", ...env },
    stdio: ["ignore", "inherit", "inherit", "ipc"],
  });
  return new Promise((resolve, reject) => {
    child.once("error", reject);
    child.once("exit", (code) => reject(new Error(`server exited with ${code}`)));
    child.on("message", (m: { type: string; url?: string }) => {
      if (m.type === "listening" && m.url) resolve({ child, url: m.url });
    });
  });
}

/** The attacking client, in its own process, once it has prepared every request. */
function startAttacker(url: string): Promise<ChildProcess> {
  const child = fork("bench/stall-attacker.ts", [], { execArgv: ["--import", "tsx"], env: { ...process.env, STALL_URL: url }, stdio: ["ignore", "inherit", "inherit", "ipc"] });
  return new Promise((resolve, reject) => {
    child.once("error", reject);
    child.on("message", (m: { type: string }) => {
      if (m.type === "ready") resolve(child);
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

/** Polls /api/health one request after another until `until` resolves; returns each latency (ms). */
async function pollHealth(url: string, until: Promise<unknown>): Promise<{ latencies: number[]; statuses: Map<number, number> }> {
  let done = false;
  void until.then(() => (done = true));
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  while (!done) {
    const t0 = performance.now();
    const res = await fetch(`${url}/api/health`);
    await res.arrayBuffer();
    latencies.push(performance.now() - t0);
    statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
    await new Promise((r) => setTimeout(r, 10));
  }
  return { latencies, statuses };
}

function line(label: string, health: number[], loop: Report): string {
  const f = (x: number) => x.toFixed(1).padStart(7);
  return `${label.padEnd(26)} health n=${String(health.length).padStart(4)}  p50 ${f(quantile(health, 0.5))} ms  p99 ${f(quantile(health, 0.99))} ms  max ${f(Math.max(...health))} ms | event-loop delay max ${f(loop.max)} ms  p99 ${f(loop.p99)} ms`;
}

/** One server, one baseline, one attack; prints the figures and whether the goal is met. */
async function round(label: string, databaseUrl: string, env: Record<string, string>): Promise<{ healthMax: number; loopMax: number }> {
  const { child, url } = await startServer(databaseUrl, env);
  try {
    // Warm-up: the first check starts the workers, the first conversion compiles the catalogue.
    const warm = new Map<string, number>();
    await post(url, "/api/v1/expressions/check", JSON.stringify({ expression: "alpha*m1/M", target: "ppe_phase", b: -7, couplings: [{ symbol: "alpha", dimension: 0 }] }), warm);
    const columns = { beta: [1e-4, -2e-4, 3e-4], m1: [20, 30, 25], m2: [10, 12, 15] };
    await post(url, "/api/v1/convert/samples", JSON.stringify({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns }), warm);
    if (![...warm.keys()].every((k) => / 200$/.test(k))) throw new Error(`warm-up failed: ${[...warm.keys()].join(", ")}`);
    await new Promise((r) => setTimeout(r, 1500));

    await ask(child, "reset");
    const quiet = await pollHealth(url, new Promise((r) => setTimeout(r, 3000)));
    const quietLoop = await ask<Report>(child, "report");

    const attacker = await startAttacker(url);
    await ask(child, "reset");
    const t0 = performance.now();
    const attackDone = new Promise<Map<string, number>>((resolve) => {
      attacker.on("message", (m: { type: string; counts?: Array<[string, number]> }) => {
        if (m.type === "done") resolve(new Map(m.counts));
      });
    });
    attacker.send({ type: "go" });
    const loud = await pollHealth(url, attackDone);
    const counts = await attackDone;
    const seconds = (performance.now() - t0) / 1000;
    const loudLoop = await ask<Report>(child, "report");

    // The machine's load matters: on a shared machine other programs take the cores too.
    console.log(`-- ${label}: ${seconds.toFixed(1)} s of attack; load average ${loadavg().map((x) => x.toFixed(1)).join(" ")} on ${availableParallelism()} cores`);
    console.log(line("baseline (health alone)", quiet.latencies, quietLoop));
    console.log(line("under attack", loud.latencies, loudLoop));
    console.log(`ratio under attack / baseline: health max x${(Math.max(...loud.latencies) / Math.max(...quiet.latencies)).toFixed(1)}, event-loop max x${(loudLoop.max / quietLoop.max).toFixed(1)}`);
    console.log(`health statuses under attack: ${[...loud.statuses].map(([s, n]) => `${s} x${n}`).join(", ")}`);
    console.log(`attack answers: ${[...counts].map(([k, n]) => `${k} x${n}`).join(", ")}`);
    console.log(`goal: max health latency under 100 ms -> ${Math.max(...loud.latencies) < 100 ? "met" : "NOT met"}`);
    return { healthMax: Math.max(...loud.latencies), loopMax: loudLoop.max };
  } finally {
    child.send({ type: "stop" });
    // A connection the attack left half-open can keep the server from closing: give it five seconds, then end it.
    const exited = child.exitCode !== null || child.signalCode !== null ? Promise.resolve() : new Promise((r) => child.once("exit", r));
    const stopTimer = setTimeout(() => child.kill("SIGKILL"), 5000);
    await exited;
    clearTimeout(stopTimer);
  }
}

// Each round runs both settings, the comparison first, so the two share the machine's load of the moment.
// STALL_ROUNDS repeats them (default 2); STALL_COMPARE=0 runs the default settings only.
const settings: Array<[string, Record<string, string>]> = [
  ...(process.env.STALL_COMPARE === "0" ? [] : [["workers at normal priority (WORKER_NICE=0)", { WORKER_NICE: "0" }] as [string, Record<string, string>]]),
  ["default settings (WORKER_NICE=10)", {}],
];
const rounds = Number(process.env.STALL_ROUNDS ?? 2);
const databaseUrl = await database();
const summary = new Map<string, Array<{ healthMax: number; loopMax: number }>>();
try {
  console.log(`stall benchmark, parts: ${process.env.STALL_PARTS ?? "all"} (samples bodies of ${SAMPLES} (over the route's limit) and ${ACCEPTED_SAMPLES} rows, 8 in all; hostile corpus of 300, crafted definition expressions x60)`);
  for (let r = 0; r < rounds; r += 1) {
    for (const [label, env] of settings) {
      const got = await round(`round ${r + 1}, ${label}`, databaseUrl, env);
      summary.set(label, [...(summary.get(label) ?? []), got]);
    }
  }
  for (const [label, runs] of summary) {
    const f = (xs: number[]) => xs.map((x) => x.toFixed(0)).join(" / ");
    console.log(`summary, ${label}: health max ${f(runs.map((x) => x.healthMax))} ms; event-loop delay max ${f(runs.map((x) => x.loopMax))} ms`);
  }
} finally {
  const admin = createDb(databaseUrl.replace(/[^/]+$/, "postgres"), { max: 1 });
  await admin.raw(`drop database if exists "${DB}" with (force)`);
  await admin.destroy();
  if (!wasRunning) execFileSync("bash", ["scripts/pg.sh", "stop"], { env: pgEnv, stdio: "ignore" });
}
// Pooled database connections opened while preparing the throw-away database would keep the process
// alive after the figures are printed; the benchmark is over.
process.exit(0);
