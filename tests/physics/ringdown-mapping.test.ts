import { describe, expect, it } from "vitest";
import { theoryEntrySchema } from "../../common/catalogue.ts";
import { compileRingdownMapping } from "../../server/physics/ringdown/ringdown-mapping.ts";
import { translateRingdownBound } from "../../server/physics/ringdown/ringdown-bound.ts";
import { johannsenPsaltis, ringdownDeviation } from "../../seeds/data/theories-ringdown.ts";

/** A made-up entry whose ringdown shift depends on the remnant: df = -zeta_f with zeta_f = 16 pi alpha^2 / M_f^4 (invented for the test). */
const remnantEntry = {
  slug: "made-up",
  couplings: [{ symbol: "alpha", latex: "\\alpha", dimension: 2, unit: "km^2", range: "non_negative" as const }],
  definitions: [{ symbol: "zeta_f", expression: "16*pi*alpha^2/M_f^4" }],
  mappings: [
    {
      kind: "ringdown_frequency",
      mode: { l: 2, m: 2, n: 0 },
      expression: "-zeta_f",
      validity: [{ expression: "zeta_f", max: 0.1, label: "small coupling at the remnant" }],
    },
  ],
};

describe("ringdown mappings", () => {
  it("when a mapping uses the remnant mass, then it is evaluated at M_f and its validity is checked at the remnant", () => {
    const m = compileRingdownMapping(remnantEntry, 0);
    expect(m.mode).toBe("220");
    expect(m.uses).toContain("M_f");
    const Mf = 90; // km
    // |df| <= U with df = -16 pi alpha^2 / M_f^4 (one-signed, alpha >= 0): alpha = M_f^2 sqrt(U / (16 pi)) (derived).
    const U = 0.05;
    const t = translateRingdownBound(m, { upper: U }, { M_f: Mf, chi_f: 0.7 });
    expect(t.upper?.value).toBeCloseTo(Mf ** 2 * Math.sqrt(U / (16 * Math.PI)), 6);
    expect(t.lower).toBeNull();
    expect(t.verdict).toBe("valid");
    // A positive-only shift bound cannot constrain a theory whose shift is negative: the upper side of an interval says nothing.
    const oneSided = translateRingdownBound(m, { interval: [-1e-9, 0.2] }, { M_f: Mf, chi_f: 0.7 });
    expect(oneSided.upper?.value).toBeCloseTo(Mf ** 2 * Math.sqrt(1e-9 / (16 * Math.PI)), 9);
    // Without the remnant mass the mapping cannot be evaluated: the field is named.
    expect(() => translateRingdownBound(m, { upper: U }, { chi_f: 0.7 })).toThrow(/M_f/);
  });

  it("when a shift has one sign and the bound's other side is the only one left, then that side is reported unconstrained", () => {
    const entry = theoryEntrySchema.parse(johannsenPsaltis);
    const index = entry.mappings.findIndex((m) => m.kind === "ringdown_frequency");
    const m = compileRingdownMapping(entry, index);
    // df = eps3/54 >= 0 for eps3 >= 0; with df in [-0.01, 0.02]: eps3 in [-0.54, 1.08] (derived).
    const t = translateRingdownBound(m, { interval: [-0.01, 0.02] }, { M_f: 90, chi_f: 0.7 });
    expect(t.lower?.value).toBeCloseTo(-0.54, 9);
    expect(t.upper?.value).toBeCloseTo(1.08, 9);
  });

  it("when a ringdown mapping has no mode, then the entry schema names the field", () => {
    const bad = { ...ringdownDeviation, mappings: ringdownDeviation.mappings.map((m) => ({ ...m, mode: undefined })) };
    const r = theoryEntrySchema.safeParse(bad);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path.join(".")).toBe("mappings.0.mode");
  });
});
