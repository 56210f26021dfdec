import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { CheckPool } from "../../server/physics/checks/check-pool.ts";
import { SymbolicPool } from "../../server/physics/expr/pool.ts";

/**
 * WORKER_NICE: each check and symbolic worker thread lowers its own scheduling priority (on Linux a
 * nice value belongs to one thread), and nothing else in the process changes. Read from /proc.
 */
function threadNices(): Map<string, number> {
  const nices = new Map<string, number>();
  for (const tid of readdirSync(`/proc/${process.pid}/task`)) {
    try {
      // Field 19 of stat (after the parenthesised name) is the nice value.
      const fields = readFileSync(`/proc/${process.pid}/task/${tid}/stat`, "utf8").split(") ")[1]?.split(" ") ?? [];
      nices.set(tid, Number(fields[16]));
    } catch {
      // The thread ended meanwhile.
    }
  }
  return nices;
}

const count = (nices: Map<string, number>, nice: number) => [...nices.values()].filter((n) => n === nice).length;

describe.skipIf(process.platform !== "linux")("worker thread priority", () => {
  it("when pools are given nice values, then their worker threads run at them and the main thread keeps its priority", async () => {
    const before = threadNices();
    expect(count(before, 7)).toBe(0);
    expect(count(before, 9)).toBe(0);
    const symbolic = new SymbolicPool({ size: 2, nice: 7 });
    const checks = new CheckPool({ size: 1, nice: 9, symbolic: () => symbolic });
    try {
      await symbolic.warm();
      await checks.warm();
      const after = threadNices();
      expect(count(after, 7), "symbolic workers").toBe(2);
      // The check worker, and the TypeScript loader thread it starts after lowering its priority (a new
      // thread inherits its creator's nice value).
      expect(count(after, 9), "check worker").toBeGreaterThanOrEqual(1);
      expect(count(after, 9), "check worker").toBeLessThanOrEqual(2);
      expect(after.get(String(process.pid)), "main thread").toBe(before.get(String(process.pid)));
      // Still working at the lower priority.
      expect(await symbolic.simplify("(x^2-1)/(x-1)", ["x"])).toBe("1+x");
    } finally {
      await checks.close();
      await symbolic.close();
    }
  });

  it("when no nice value is given, then the workers keep the normal priority", async () => {
    const symbolic = new SymbolicPool({ size: 1 });
    try {
      await symbolic.warm();
      const nices = threadNices();
      expect([...nices.values()].every((n) => n === nices.get(String(process.pid)))).toBe(true);
    } finally {
      await symbolic.close();
    }
  });
});
