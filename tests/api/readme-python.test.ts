import { execFile } from "node:child_process";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { bearerFor, serverUrl } from "../helpers/auth.ts";
import { listen } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { gaussian, toCsv } from "../helpers/samples-data.ts";

const run = promisify(execFile);

/**
 * The python3 that has requests: the one on PATH (it may be a pyenv shim) or Debian's /usr/bin/python3,
 * where scripts/test.sh installs python3-requests when neither has it.
 */
async function pythonWithRequests(): Promise<string> {
  for (const candidate of ["python3", "/usr/bin/python3"]) {
    try {
      await run(candidate, ["-c", "import requests"]);
      return candidate;
    } catch {
      // try the next one
    }
  }
  throw new Error("no python3 with requests: install Debian's python3-requests (scripts/test.sh does)");
}

/**
 * README's Python example, run as written against a real server with a worker: one conversion and
 * one samples job through `requests` and a personal token. Only the address is changed (the test
 * server's port). The machine needs python3 with requests (Debian's python3-requests).
 */
async function readmePython(): Promise<string> {
  const readme = await readFile(path.resolve("README.md"), "utf8");
  const block = /```python\n([\s\S]*?)```/.exec(readme);
  if (!block?.[1]) throw new Error("README.md has no ```python block");
  return block[1];
}

const OVERRIDES = { JOBS_ANON_PER_HOUR: "10000", JOBS_SWEEP_SECONDS: "1" };

describe("README: the Python example", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let worker: RunningWorker;
  let close: () => Promise<void>;
  let base: string;
  let dir: string;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, OVERRIDES);
    const config = testConfig(tdb.url, OVERRIDES);
    worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
    const { server } = await listen(app);
    base = serverUrl(server);
    close = () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    dir = await mkdtemp(path.join(tmpdir(), "dragoman-readme-python-"));
  }, 120_000);
  afterAll(async () => {
    await close?.();
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    if (dir) await rm(dir, { recursive: true, force: true });
    await tdb?.drop();
  });

  it("when the README's Python runs against the server, then it prints the EdGB limit and a finished samples job", { timeout: 120_000 }, async () => {
    const script = await readmePython();
    expect(script).toContain('API = "http://127.0.0.1:3000/api/v1"');
    await writeFile(path.join(dir, "example.py"), script.replace('API = "http://127.0.0.1:3000/api/v1"', `API = "${base}/api/v1"`));
    await writeFile(path.join(dir, "dragoman-token.txt"), `${await bearerFor(tdb.db, "readme-reader")}\n`);
    // An invented posterior: beta around 0 with width 4e-4, a 10 + 5 solar-mass binary.
    const n = 2000;
    await writeFile(path.join(dir, "posterior.csv"), toCsv({ beta: gaussian(7, n, 0, 4e-4), m1: new Float64Array(n).fill(10), m2: new Float64Array(n).fill(5) }));

    const { stdout, stderr } = await run(await pythonWithRequests(), ["example.py"], { cwd: dir, timeout: 100_000 });
    expect(stderr).toBe("");
    const lines = stdout.trim().split("\n");
    // The conversion: EdGB's sqrt(alpha) for |beta| <= 1e-3 at b = -7 on 10 + 5 Msun is 4.07 km, outside validity
    // (the same number tests/api/convert-post.test.ts derives from the published EdGB beta).
    const edgb = lines.find((l) => l.startsWith("Einstein-dilaton-Gauss-Bonnet"));
    expect(edgb).toMatch(/sqrt_alpha <= 4\.07\d* km outside_validity$/);
    // The job: finished, with a bound on the coupling and no error.
    const last = lines.at(-1) ?? "";
    expect(last).toMatch(/^done \{.*'symbol': 'sqrt_alpha'.*'value': [0-9.e-]+.*\} None$/);
  });
});
