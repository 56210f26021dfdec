import { execFile, execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";

const run = promisify(execFile);

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const addr = s.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      s.close(() => resolve(port));
    });
  });
}

/**
 * A throw-away PostgreSQL cluster driven through scripts/pg.sh, for tests that stop and kill it. It runs
 * with PostgreSQL's durable defaults (pg.sh without PG_THROWAWAY), as the cluster of npm start does.
 */
export class TempCluster {
  readonly dir: string;
  readonly port: number;
  constructor(port: number) {
    this.port = port;
    this.dir = mkdtempSync(path.join(tmpdir(), "dragoman-pgtest-"));
  }
  static async create(): Promise<TempCluster> {
    return new TempCluster(await freePort());
  }
  private env(): NodeJS.ProcessEnv {
    const env: NodeJS.ProcessEnv = { ...process.env, PGPORT: String(this.port), PGDATA_DIR: this.dir, PG_DATABASES: "probe" };
    delete env.PG_THROWAWAY;
    return env;
  }
  /** Runs one of scripts/*.sh against this cluster (PGPORT and PGDATA_DIR set), never throwing. */
  async script(name: string, args: string[] = [], extraEnv: Record<string, string> = {}): Promise<{ stdout: string; stderr: string; code: number }> {
    try {
      const { stdout, stderr } = await run("bash", [`scripts/${name}`, ...args], { env: { ...this.env(), ...extraEnv }, timeout: 120_000 });
      return { stdout, stderr, code: 0 };
    } catch (err) {
      const e = err as { stdout?: string; stderr?: string; code?: number };
      return { stdout: e.stdout ?? "", stderr: e.stderr ?? "", code: typeof e.code === "number" ? e.code : 1 };
    }
  }
  /** The pids of the postmaster and of every process it started (backends, writers), postmaster first. */
  postgresPids(): number[] {
    const pid = Number(readFileSync(path.join(this.dir, "data", "postmaster.pid"), "utf8").split("\n")[0]);
    const children = execFileSync("ps", ["-o", "pid=", "--ppid", String(pid)], { encoding: "utf8" })
      .split("\n")
      .map((l) => Number(l.trim()))
      .filter((n) => n > 0);
    return [pid, ...children];
  }
  async pg(cmd: "start" | "stop" | "status"): Promise<{ stdout: string; stderr: string; code: number }> {
    try {
      const { stdout, stderr } = await run("bash", ["scripts/pg.sh", cmd], { env: this.env(), timeout: 120_000 });
      return { stdout, stderr, code: 0 };
    } catch (err) {
      const e = err as { stdout?: string; stderr?: string; code?: number };
      return { stdout: e.stdout ?? "", stderr: e.stderr ?? "", code: e.code ?? 1 };
    }
  }
  url(db = "probe"): string {
    return `postgres://postgres@127.0.0.1:${this.port}/${db}`;
  }
  async destroy(): Promise<void> {
    await this.pg("stop");
    rmSync(this.dir, { recursive: true, force: true });
  }
}
