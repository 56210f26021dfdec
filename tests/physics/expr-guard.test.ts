import { describe, expect, it } from "vitest";
import { parse } from "../../server/physics/expr/ast.ts";
import { ExpressionError, type ExpressionErrorCode } from "../../server/physics/expr/errors.ts";
import { guardExpression } from "../../server/physics/expr/guard.ts";
import { printExpression } from "../../server/physics/expr/print.ts";

const SYMBOLS = ["x", "y", "alpha", "m1", "m2", "eta"];

function rejection(source: string, symbols: readonly string[] | undefined = SYMBOLS): ExpressionError {
  try {
    guardExpression(source, symbols === undefined ? {} : { symbols });
  } catch (err) {
    if (err instanceof ExpressionError) return err;
    throw err;
  }
  throw new Error(`expected ${JSON.stringify(source)} to be rejected`);
}

function expectRejected(source: string, code: ExpressionErrorCode, token: string, position: number): ExpressionError {
  const err = rejection(source);
  expect({ code: err.code, token: err.token, position: err.position }, err.message).toEqual({ code, token, position });
  return err;
}

describe("guardExpression rejects, naming token and position", () => {
  it("too_long: more than 2000 characters", () => {
    const err = expectRejected(`x${"+x".repeat(1000)}`, "too_long", "", 2000);
    expect(err.message).toMatch(/2001 characters.*2000/);
  });

  it("empty input and whitespace only", () => {
    expectRejected("", "empty", "", 0);
    expectRejected("   \t ", "empty", "", 0);
  });

  it("too_deep: brackets nested deeper than 64", () => {
    const deep = `${"(".repeat(65)}x${")".repeat(65)}`;
    const err = expectRejected(deep, "too_deep", "(", 64);
    expect(err.message).toMatch(/64 levels at position 64/);
    expect(() => guardExpression(`${"(".repeat(64)}x${")".repeat(64)}`, { symbols: SYMBOLS })).not.toThrow();
  });

  it("too_deep: a chain of signs or powers deeper than the tree limit", () => {
    expect(rejection(`${"-".repeat(300)}x`).code).toBe("too_deep");
    expect(rejection(`x${"^x".repeat(300)}`).code).toBe("too_deep");
  });

  it("bad_character: names the character and its position", () => {
    const err = expectRejected("x + y.z", "bad_character", ".", 5);
    expect(err.message).toContain('character "." (U+002E) at position 5');
    expectRejected("x # y", "bad_character", "#", 2);
    expectRejected('require("fs")', "bad_character", '"', 8);
    expectRejected("2 × x", "bad_character", "×", 2);
    const zw = expectRejected("x\u200b+y", "bad_character", "\u200b", 1);
    expect(zw.message).toContain("U+200B");
    expectRejected("α + 1", "bad_character", "α", 0);
    expectRejected("x + 😀", "bad_character", "😀", 4);
  });

  it("forbidden_syntax: := , = and ;", () => {
    const def = expectRejected("f(x):=x^2", "forbidden_syntax", ":=", 4);
    expect(def.message).toMatch(/":=" are not allowed/);
    expectRejected("x = 2", "forbidden_syntax", "=", 2);
    expectRejected("x;1", "forbidden_syntax", ";", 1);
  });

  it("unknown_function: a call of anything but sqrt, exp, log, abs, sin, cos", () => {
    const err = expectRejected("2*foo(x)", "unknown_function", "foo", 2);
    expect(err.message).toContain('unknown function "foo" at position 2');
    expectRejected("x*eval(1)", "unknown_function", "eval", 2);
    expectRejected("alpha(x)", "unknown_function", "alpha", 0);
  });

  it("syntax: implicit products need an explicit *", () => {
    const err = expectRejected("2x", "syntax", "x", 1);
    expect(err.message).toMatch(/missing operator between "2" and "x" at position 1/);
    expectRejected("(x+1)(y)", "syntax", "(", 5);
    expectRejected("x y", "syntax", "y", 2);
    expectRejected("2(x)", "syntax", "(", 1);
  });

  it("syntax: dangling operators, commas and malformed numbers", () => {
    expectRejected("x +", "syntax", "", 3);
    expectRejected("x * * y", "syntax", "*", 4);
    expectRejected("sqrt(x, y)", "syntax", ",", 6);
    expectRejected("sqrt + 1", "syntax", "sqrt", 0);
    expectRejected("pi(2)", "syntax", "pi", 0);
    expectRejected("1e+ 3", "syntax", "1e+", 0);
    expectRejected("1e999*x", "syntax", "1e999", 0);
  });

  it("unbalanced brackets", () => {
    expectRejected("(x + y", "unbalanced", "(", 0);
    expectRejected("x + y)", "unbalanced", ")", 5);
    expectRejected("((x) + (y)", "unbalanced", "(", 0);
  });

  it("forbidden_symbol: JavaScript prototype names, whatever is declared", () => {
    for (const name of ["constructor", "__proto__", "prototype", "toString", "valueOf", "hasOwnProperty", "isPrototypeOf"]) {
      const err = rejection(`x + ${name}`, [...SYMBOLS, name]);
      expect(err.code, name).toBe("forbidden_symbol");
      expect(err.token).toBe(name);
      expect(err.position).toBe(4);
    }
    expectRejected("_x + 1", "forbidden_symbol", "_x", 0);
  });

  it("undeclared_symbol: names the symbol, its position and a near miss", () => {
    const err = expectRejected("16*pi*alpha^2/alhpa", "undeclared_symbol", "alhpa", 14);
    expect(err.message).toBe('unknown symbol "alhpa" at position 14 (did you mean "alpha"?)');
    const plain = expectRejected("x + zebra", "undeclared_symbol", "zebra", 4);
    expect(plain.message).toMatch(/^unknown symbol "zebra" at position 4; declare it/);
  });
});

describe("guardExpression accepts ordinary infix math", () => {
  it.each([
    ["1e-3*x", "1e-3*x"],
    ["-x^2", "-x^2"],
    ["2^-3", "2^(-3)"],
    ["x^y^2", "x^y^2"],
    ["sqrt(x)*exp(-y)/log(abs(x))", "sqrt(x)*exp(-y)/log(abs(x))"],
    ["(m1 - m2)/(m1 + m2)", "(m1-m2)/(m1+m2)"],
    [" pi * x ", "pi*x"],
    [".5*x", ".5*x"],
  ])("%s", (source, printed) => {
    const g = guardExpression(source, { symbols: SYMBOLS });
    expect(printExpression(g.ast)).toBe(printed);
  });

  it("parses with precedence: unary minus below ^, right-associative ^", () => {
    const a = parse("-x^2");
    expect(a.kind).toBe("neg");
    const b = parse("2^3^2");
    expect(b.kind === "pow" && b.exp.kind === "pow").toBe(true);
    const c = parse("a-b*c");
    expect(c.kind === "add" && c.terms[1]?.neg === true && c.terms[1]?.node.kind === "mul").toBe(true);
  });

  it("reports the symbols it saw with first positions", () => {
    const g = guardExpression("x + alpha*x", { symbols: SYMBOLS });
    expect([...g.symbols]).toEqual([
      ["x", 0],
      ["alpha", 4],
    ]);
  });

  it("print and parse round-trip", () => {
    for (const s of ["-(a+b)*c", "a/(b*c)", "(a^b)^c", "a^(b^c)", "-(-x)", "a-(b-c)", "x*(-y)", "2^(-x^2)"]) {
      const once = printExpression(parse(s));
      expect(printExpression(parse(once)), s).toBe(once);
    }
  });
});
