import { afterAll, describe, expect, it } from "vitest";
import { type SymbolicError, SymbolicPool, SymbolicTimeoutError } from "../../server/physics/expr/pool.ts";
import { ExpressionError } from "../../server/physics/expr/errors.ts";

const pool = new SymbolicPool({ size: 2, timeoutMs: 2000 });

afterAll(async () => {
  await pool.close();
});

describe("SymbolicPool", () => {
  it("simplifies, expands and solves in worker threads, in the caller's symbol names", async () => {
    await pool.warm();
    expect(await pool.simplify("(x^2 - 1)/(x - 1)", ["x"])).toBe("1+x");
    expect(await pool.simplify("sin(x)^2 + cos(x)^2", ["x"])).toBe("1");
    // Symbols that mean something else to nerdamer (e, gamma) are renamed on the way in and out.
    expect(await pool.expand("(e + gamma)^2", ["e", "gamma"])).toBe("2*e*gamma+e^2+gamma^2");
    const solutions = await pool.solve("x^2 - 4", "x", ["x"]);
    expect(solutions.replace(/\s/g, "")).toMatch(/^\[(2,-2|-2,2)\]$/);
  });

  it("only takes guarded input", async () => {
    await expect(pool.simplify("f(x):=x^2", ["x"])).rejects.toBeInstanceOf(ExpressionError);
    await expect(pool.simplify("x + constructor", ["x"])).rejects.toBeInstanceOf(ExpressionError);
  });

  it("stops an expansion bomb at the deadline while the event loop keeps running, then still works", async () => {
    let ticks = 0;
    const timer = setInterval(() => {
      ticks += 1;
    }, 50);
    const started = performance.now();
    try {
      const bomb = pool.expand("(a + b + c + d)^20", ["a", "b", "c", "d"]);
      // Meanwhile the second worker serves other requests.
      expect(await pool.simplify("x - x", ["x"])).toBe("0");
      const err = await bomb.then(
        () => undefined,
        (e: unknown) => e,
      );
      const elapsed = performance.now() - started;
      expect(err).toBeInstanceOf(SymbolicTimeoutError);
      expect((err as SymbolicError).code).toBe("timeout");
      expect(elapsed).toBeGreaterThanOrEqual(1900);
      expect(elapsed).toBeLessThan(4000);
      // A blocked event loop would have produced no ticks at all.
      expect(ticks).toBeGreaterThanOrEqual(20);
    } finally {
      clearInterval(timer);
    }
    expect(await pool.expand("(x + 1)^2", ["x"])).toBe("1+2*x+x^2");
    expect(await pool.simplify("(x^2 - 1)/(x - 1)", ["x"])).toBe("1+x");
  });

  it("applies a per-job deadline and rejects after close", async () => {
    const small = new SymbolicPool({ size: 1, timeoutMs: 300 });
    await expect(small.expand("(a + b + c + d)^20", ["a", "b", "c", "d"])).rejects.toBeInstanceOf(SymbolicTimeoutError);
    expect(await small.simplify("2*x - x", ["x"])).toBe("x");
    await small.close();
    await expect(small.simplify("x", ["x"])).rejects.toMatchObject({ code: "closed" });
  });
});
