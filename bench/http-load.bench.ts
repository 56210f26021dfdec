// Run with: npm run bench (or node --import tsx bench/http-load.bench.ts). Not a test: it prints
// throughput and latency under load and ratios against /api/health measured in the same run.
//
// What is measured: the real app (compression, logging to /dev/null, sessions middleware, the
// catalogue cache) on a throw-away PostgreSQL cluster with the demo data, answering keep-alive
// requests from a load generator in a worker thread (its own event loop), one route at a time:
// /api/health (baseline: one `select 1`), the catalogue list, a filtered list and a detail.
// Goal (issue 10): the catalogue list at least half as fast as /api/health.
// Then, when the client is built and Debian's chromium is present, the first load of /catalogue.
//
// Env: BENCH_PGPORT (default 54359), BENCH_SECONDS per route (default 4), BENCH_CONNECTIONS (default 16).
import { execFileSync } from "node:child_process";
import { existsSync } from "node:fs";
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";
import { Worker } from "node:worker_threads";
import { pino } from "pino";
import { createApp } from "../server/app.ts";
import { parseConfig } from "../server/config.ts";
import { createDb, migrateLatest } from "../server/db/knex.ts";
import { seedSteps } from "../seeds/index.ts";
import { describeFirstLoad, measureFirstLoad, CHROMIUM_PATH } from "../scripts/measure-first-load.ts";

const PGPORT = process.env.BENCH_PGPORT ?? "54359";
const SECONDS = Number(process.env.BENCH_SECONDS ?? 4);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 16);
const pgEnv = { ...process.env, PGPORT, PGDATA_DIR: ".data/pg-bench", PG_DATABASES: "dragoman_bench", PG_THROWAWAY: "1" };

// The load generator: CONNECTIONS keep-alive loops for SECONDS, recording each latency.
const generator = `
const { parentPort, workerData } = require("node:worker_threads");
const http = require("node:http");
const { url, seconds, connections } = workerData;
const agent = new http.Agent({ keepAlive: true, maxSockets: connections });
const latencies = [];
let errors = 0;
const until = performance.now() + seconds * 1000;
function one() {
  return new Promise((resolve) => {
    const t0 = performance.now();
    const req = http.get(url, { agent, headers: { "accept-encoding": "br, gzip" } }, (res) => {
      res.on("data", () => {});
      res.on("end", () => {
        if (res.statusCode === 200) latencies.push(performance.now() - t0); else errors++;
        resolve();
      });
    });
    req.on("error", () => { errors++; resolve(); });
  });
}
async function loop() { while (performance.now() < until) await one(); }
Promise.all(Array.from({ length: connections }, loop)).then(() => {
  agent.destroy();
  parentPort.postMessage({ latencies, errors });
});
`;

function load(url: string): Promise<{ rps: number; p50: number; p99: number; errors: number }> {
  return new Promise((resolve, reject) => {
    const w = new Worker(generator, { eval: true, workerData: { url, seconds: SECONDS, connections: CONNECTIONS } });
    w.once("message", ({ latencies, errors }: { latencies: number[]; errors: number }) => {
      const s = [...latencies].sort((a, b) => a - b);
      const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * s.length))] ?? Number.NaN;
      resolve({ rps: latencies.length / SECONDS, p50: q(0.5), p99: q(0.99), errors });
      void w.terminate();
    });
    w.once("error", reject);
  });
}

async function main(): Promise<void> {
  const wasRunning = (() => {
    try {
      execFileSync("bash", ["scripts/pg.sh", "status"], { env: pgEnv, stdio: "ignore" });
      return true;
    } catch {
      return false;
    }
  })();
  const base = execFileSync("bash", ["scripts/pg.sh", "start"], { env: pgEnv, encoding: "utf8", stdio: ["ignore", "pipe", "inherit"] }).trim();
  const databaseUrl = `${base}dragoman_bench`;
  const db = createDb(databaseUrl, { max: 10 });
  try {
    await migrateLatest(db);
    await seedSteps(db);
    const config = parseConfig({
      NODE_ENV: "development",
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: "bench-secret-bench-secret-bench-secret-01",
      LOG_LEVEL: "info",
    });
    // Request logging on, as in production, written to /dev/null.
    const logger = pino({ level: "info" }, pino.destination({ dest: "/dev/null", sync: false }));
    const server = createServer(createApp({ db, config, logger }));
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

    const routes = [
      ["/api/health", "health (baseline: one select 1)"],
      ["/api/v1/theories", "catalogue list"],
      ["/api/v1/theories?b=-7", "catalogue list, filtered (b = -7)"],
      ["/api/v1/theories/edgb", "catalogue detail (edgb)"],
    ] as const;
    process.stdout.write(`  ${CONNECTIONS} keep-alive connections, ${SECONDS} s per route, Accept-Encoding: br, gzip\n`);
    // Warm-up: caches, JIT, pooled connections.
    for (const [path] of routes) await fetch(url + path).then((r) => r.arrayBuffer());
    let health = Number.NaN;
    for (const [path, label] of routes) {
      const r = await load(url + path);
      if (path === "/api/health") health = r.rps;
      const ratio = r.rps / health;
      process.stdout.write(
        `  ${label.padEnd(38)} ${r.rps.toFixed(0).padStart(6)} req/s  p50 ${r.p50.toFixed(1).padStart(5)} ms  p99 ${r.p99.toFixed(1).padStart(6)} ms  ratio to health ${ratio.toFixed(2)}${r.errors ? `  (${r.errors} errors)` : ""}\n`,
      );
    }
    process.stdout.write("  goal: catalogue list ratio to health >= 0.50\n");

    if (existsSync("dist/index.html") && existsSync(CHROMIUM_PATH)) {
      process.stdout.write(`${describeFirstLoad(await measureFirstLoad(url, "/catalogue"))}\n`.replace(/^/gm, "  "));
    } else {
      process.stdout.write("  (first-load measurement skipped: build the client with `npm run build` and install Debian's chromium)\n");
    }
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  } finally {
    await db.destroy();
    if (!wasRunning) execFileSync("bash", ["scripts/pg.sh", "stop"], { env: pgEnv, stdio: "ignore" });
  }
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    process.stderr.write(`http-load bench failed: ${err instanceof Error ? err.stack : String(err)}\n`);
    process.exit(1);
  },
);
