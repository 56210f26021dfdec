import { describe, expect, it } from "vitest";
import { NOT_A_NUMBER, parseNumberBytes } from "../../server/physics/samples/fast-number.ts";
import { rng } from "../helpers/samples-data.ts";

/**
 * The byte-level number reader must agree bit for bit with Number() (correctly rounded, ECMA-262
 * StringToNumber), on its fast path (Clinger 1990: mantissa an exact double, |e| <= 22) and off it.
 */
const parse = (text: string) => {
  const buf = Buffer.from(text, "latin1");
  return parseNumberBytes(buf, 0, buf.length);
};

describe("parseNumberBytes", () => {
  it("when random doubles are printed as JavaScript, C %.17e/%.18e and fixed text, then each reads back exactly as Number() reads it", () => {
    const r = rng(7);
    const texts: string[] = [];
    for (let k = 0; k < 20000; k++) {
      const v = (r() - 0.5) * 10 ** Math.floor(r() * 40 - 20);
      texts.push(String(v), v.toExponential(16), v.toExponential(17), v.toPrecision(16), v.toFixed(6), v.toPrecision(15));
    }
    // 16-digit mantissas around 2^53 = 9007199254740992, on both sides of the fast path's edge.
    texts.push("9007199254740992", "9007199254740993", "9.007199254740993e-5", "9007199254740991.5", "0.9007199254740993");
    let mismatches = 0;
    for (const t of texts) if (!Object.is(parse(t), Number(t))) mismatches++;
    expect(mismatches).toBe(0);
  });

  it("when a cell is blank, nan, inf or text, then it reads as NaN, infinity or not-a-number", () => {
    expect(parse("  ")).toBeNaN();
    expect(parse("nan")).toBeNaN();
    expect(parse("-inf")).toBe(-Infinity);
    expect(parse("ten")).toBe(NOT_A_NUMBER);
    expect(parse("\"1.5e3\"")).toBe(1500);
  });
});
