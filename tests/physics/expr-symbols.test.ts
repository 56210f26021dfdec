import { describe, expect, it } from "vitest";
import { compileExpression } from "../../server/physics/expr/compile.ts";
import { formatDimension, inferDimension } from "../../server/physics/expr/dimension.ts";
import { ExpressionError } from "../../server/physics/expr/errors.ts";
import { createSymbolTable, expandDefinitions } from "../../server/physics/expr/symbols.ts";

function thrown(f: () => unknown): ExpressionError {
  try {
    f();
  } catch (err) {
    if (err instanceof ExpressionError) return err;
    throw err;
  }
  throw new Error("expected an ExpressionError");
}

describe("createSymbolTable", () => {
  const table = createSymbolTable({
    couplings: [{ symbol: "alpha", dimension: 2 }],
    definitions: [
      { symbol: "zeta", expression: "16*pi*alpha^2/M^4" },
      { symbol: "xi", expression: "zeta*eta" },
    ],
  });

  it("has the built-in binary symbols with their dimensions (geometric units, G = c = 1)", () => {
    // common practice: masses are lengths G m / c^2; spins, eta, charges, z dimensionless
    const dims = Object.fromEntries(
      ["m1", "m2", "M", "eta", "Mc", "dm", "q", "chi1", "chi_s", "chi_a", "s1", "z", "D", "D_0", "D_alpha"].map((n) => [n, table.get(n)?.dimension]),
    );
    expect(dims).toEqual({ m1: 1, m2: 1, M: 1, eta: 0, Mc: 1, dm: 0, q: 0, chi1: 0, chi_s: 0, chi_a: 0, s1: 0, z: 0, D: 1, D_0: 1, D_alpha: 1 });
    expect(table.get("zeta")?.dimension).toBe(0);
    expect(table.get("alpha")?.kind).toBe("coupling");
    expect(table.primitives).toContain("alpha");
    expect(table.definitions).toEqual(["zeta", "xi"]);
  });

  it("expands definitions to primitive symbols only", () => {
    const expanded = expandDefinitions("xi*Mc", table);
    expect(expanded).not.toMatch(/\b(xi|zeta|eta|Mc|M)\b/);
    const args = ["m1", "m2", "alpha"];
    const direct = (m1: number, m2: number, a: number): number => {
      const M = m1 + m2;
      const eta = (m1 * m2) / M ** 2;
      return ((16 * Math.PI * a ** 2) / M ** 4) * eta * eta ** 0.6 * M;
    };
    const f = compileExpression(expanded, args);
    expect(Math.abs(f([30, 20, 3]) / direct(30, 20, 3) - 1)).toBeLessThan(1e-14);
  });

  it("allows definitions in any order and detects cycles, naming them", () => {
    expect(() => createSymbolTable({ couplings: [], definitions: [{ symbol: "a2", expression: "a1*2" }, { symbol: "a1", expression: "eta" }] })).not.toThrow();
    const err = thrown(() =>
      createSymbolTable({ definitions: [{ symbol: "u1", expression: "u2 + 1" }, { symbol: "u2", expression: "u1*eta" }] }),
    );
    expect(err.code).toBe("definition_cycle");
    expect(err.message).toBe("definitions refer to each other in a cycle: u1 -> u2 -> u1");
    expect(thrown(() => createSymbolTable({ definitions: [{ symbol: "w", expression: "w*2" }] })).message).toMatch(/w -> w/);
  });

  it("reports a bad definition with its name, token and position", () => {
    const err = thrown(() => createSymbolTable({ couplings: [{ symbol: "alpha", dimension: 2 }], definitions: [{ symbol: "zeta", expression: "16*pi*alhpa^2" }] }));
    expect(err.code).toBe("bad_definition");
    expect(err.definition).toBe("zeta");
    expect(err.message).toBe('definition "zeta": unknown symbol "alhpa" at position 6 (did you mean "alpha"?)');
    expect([err.token, err.position]).toEqual(["alhpa", 6]);
  });

  it("treats a built-in input declared again with its own dimension as the built-in", () => {
    const t = createSymbolTable({ couplings: [{ symbol: "sigma1", dimension: 0 }, { symbol: "omega_BD", dimension: 0 }] });
    expect(t.couplings).toEqual(["omega_BD"]);
    expect(t.get("sigma1")?.kind).toBe("primitive");
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "sigma1", dimension: 1 }] })).message).toMatch(/built-in/);
  });

  it("rejects bad declarations", () => {
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "m1", dimension: 0 }] })).message).toMatch(/built-in/);
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "M", dimension: 1 }] })).message).toMatch(/built-in/);
    expect(thrown(() => createSymbolTable({ definitions: [{ symbol: "eta", expression: "m1/m2" }] })).message).toMatch(/built-in/);
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "constructor", dimension: 0 }] })).code).toBe("bad_declaration");
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "sqrt", dimension: 0 }] })).code).toBe("bad_declaration");
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "a", dimension: Number.NaN }] })).message).toMatch(/finite dimension/);
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "a", dimension: 1 }, { symbol: "a", dimension: 1 }] })).message).toMatch(/twice/);
    expect(thrown(() => createSymbolTable({ couplings: [{ symbol: "a b", dimension: 1 }] })).code).toBe("bad_declaration");
  });

  it("refuses definitions that grow exponentially when expanded", () => {
    const definitions = [{ symbol: "d0", expression: "m1*m2" }];
    for (let k = 1; k < 20; k += 1) definitions.push({ symbol: `d${k}`, expression: `d${k - 1}*d${k - 1}` });
    expect(thrown(() => createSymbolTable({ definitions })).message).toMatch(/expands to more than/);
  });
});

describe("inferDimension (algebraic)", () => {
  const table = createSymbolTable({ couplings: [{ symbol: "alpha", dimension: 2 }, { symbol: "lambda_g", dimension: 1 }] });
  it.each([
    ["16*pi*alpha^2/M^4", 0],
    ["alpha^2", 4],
    ["sqrt(alpha)", 1],
    ["D_0*Mc/lambda_g^2", 0],
    ["Mc^(-5/3)", -5 / 3],
    ["exp(m1/m2)", 0],
  ])("%s has dimension %s", (e, d) => {
    const r = inferDimension(e, table);
    expect(r.ok && Math.abs(r.dimension - d) < 1e-12).toBe(true);
  });

  it("names the unlike terms of an inhomogeneous sum", () => {
    const r = inferDimension("m1 + alpha", table);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toBe('terms of different dimension are added: "m1" has length^1 but "alpha" has length^2');
  });

  it("needs dimensionless arguments for exp and log", () => {
    const r = inferDimension("log(m1)", table);
    expect(!r.ok && r.reason).toBe("function_argument");
  });

  it("formats dimensions", () => {
    expect(formatDimension(-4)).toBe("length^-4");
    expect(formatDimension(0.5)).toBe("length^(1/2)");
  });
});
