import { describe, expect, it } from "vitest";
import { checkMapping } from "../../server/physics/checks/check-mapping.ts";
import { SymbolicPool, SymbolicTimeoutError } from "../../server/physics/expr/pool.ts";
import type { SymbolicResult } from "../../server/physics/expr/symbolic-protocol.ts";

// A residue of 1e-12 at zero coupling is below the rounding threshold (1e-9), so only the CAS can
// say whether the expression vanishes exactly there. Constructed for this test (common practice).
const RESIDUE = { expression: "alpha + 1e-12*m1/M", target: "ppe_phase" as const, b: -7, pn_order: -1, couplings: [{ symbol: "alpha", dimension: 0 }] };

const casAnswering = (answer: () => Promise<SymbolicResult>) => new SymbolicPool({ transport: answer });

describe("GR limit when the CAS cannot decide", () => {
  it("when the CAS times out, then the GR-limit check is inconclusive, not failed", async () => {
    const r = await checkMapping(RESIDUE, { pool: casAnswering(() => Promise.reject(new SymbolicTimeoutError(2000))) });
    const gr = r.checks.find((c) => c.name === "gr_limit");
    expect(gr).toMatchObject({ ok: false, severity: "inconclusive" });
    expect(gr?.message).toContain("did not finish in time");
    expect(r.ok).toBe(false);
  });

  it("when the CAS answers that the residue is not 0, then the GR-limit check fails (the inconclusive state is only for time-outs)", async () => {
    const r = await checkMapping(RESIDUE, { pool: casAnswering(() => Promise.resolve({ kind: "zero", zero: false, level: 0 })) });
    expect(r.checks.find((c) => c.name === "gr_limit")).toMatchObject({ ok: false, severity: "error" });
  });

  it("when the CAS shows the residue is 0, then the GR-limit check passes", async () => {
    const r = await checkMapping(RESIDUE, { pool: casAnswering(() => Promise.resolve({ kind: "zero", zero: true, level: 0 })) });
    expect(r.checks.find((c) => c.name === "gr_limit")).toMatchObject({ ok: true });
  });
});
