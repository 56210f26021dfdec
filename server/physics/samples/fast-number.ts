/**
 * Decimal text to double straight from bytes, for large sample files. The fast path is exact:
 * a mantissa below 2^53 (every 15-digit one, most 16-digit ones) is an exact double, and so is 10^e for |e| <= 22,
 * so one multiplication or division is correctly rounded (Clinger 1990, "How to read floating
 * point numbers accurately", PLDI, the fast path). Anything else (more digits, a larger exponent,
 * "nan", "inf") falls back to Number() on the text, which is correctly rounded too.
 */

const MAX_EXACT = 2 ** 53;
const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);

/** What a cell that is not a number parses to: the caller reports it as text. */
export const NOT_A_NUMBER = Symbol("not a number");

const NONFINITE = new Map<string, number>([
  ["nan", Number.NaN],
  ["+nan", Number.NaN],
  ["-nan", Number.NaN],
  ["inf", Infinity],
  ["+inf", Infinity],
  ["-inf", -Infinity],
  ["infinity", Infinity],
  ["+infinity", Infinity],
  ["-infinity", -Infinity],
]);

/**
 * Parses buf[start, end) (surrounding blanks and quotes allowed). Returns NaN for an empty cell or
 * "nan", +-Infinity for "inf", and NOT_A_NUMBER for text.
 */
export function parseNumberBytes(buf: Uint8Array, start: number, end: number): number | typeof NOT_A_NUMBER {
  let s = start;
  let e = end;
  while (s < e && (buf[s] === 32 || buf[s] === 9 || buf[s] === 34)) s++;
  while (e > s && (buf[e - 1] === 32 || buf[e - 1] === 9 || buf[e - 1] === 13 || buf[e - 1] === 34)) e--;
  if (s === e) return Number.NaN;
  let i = s;
  let neg = false;
  if (buf[i] === 45) {
    neg = true;
    i++;
  } else if (buf[i] === 43) i++;
  let mant = 0;
  let digits = 0;
  let exp10 = 0;
  let any = false;
  let c = 0;
  for (; i < e; i++) {
    c = buf[i]!;
    if (c < 48 || c > 57) break;
    any = true;
    if (digits > 0 || c !== 48) {
      mant = mant * 10 + (c - 48);
      digits++;
    }
  }
  if (i < e && c === 46) {
    for (i++; i < e; i++) {
      c = buf[i]!;
      if (c < 48 || c > 57) break;
      any = true;
      if (digits > 0 || c !== 48) {
        mant = mant * 10 + (c - 48);
        digits++;
      }
      exp10--;
    }
  }
  if (any && i < e && (buf[i] === 101 || buf[i] === 69)) {
    i++;
    let eneg = false;
    if (buf[i] === 45) {
      eneg = true;
      i++;
    } else if (buf[i] === 43) i++;
    let ev = 0;
    let edigits = 0;
    for (; i < e; i++) {
      c = buf[i]!;
      if (c < 48 || c > 57) break;
      ev = ev * 10 + (c - 48);
      edigits++;
      if (ev > 100000) ev = 100000;
    }
    if (edigits === 0) return slow(buf, s, e);
    exp10 += eneg ? -ev : ev;
  }
  // digits > 17: the accumulated mantissa may have rounded on the way, even if it ends below 2^53.
  if (!any || i !== e || digits > 17 || mant >= MAX_EXACT) return slow(buf, s, e);
  let v: number;
  if (mant === 0) v = 0;
  else if (exp10 === 0) v = mant;
  else if (exp10 > 0 && exp10 <= 22) v = mant * POW10[exp10]!;
  else if (exp10 < 0 && exp10 >= -22) v = mant / POW10[-exp10]!;
  else return slow(buf, s, e);
  return neg ? -v : v;
}

function slow(buf: Uint8Array, s: number, e: number): number | typeof NOT_A_NUMBER {
  const text = Buffer.isBuffer(buf) ? (buf as Buffer & { latin1Slice(s: number, e: number): string }).latin1Slice(s, e) : Buffer.from(buf.buffer, buf.byteOffset + s, e - s).toString("latin1");
  const v = Number(text);
  if (!Number.isNaN(v)) return v;
  const special = NONFINITE.get(text.toLowerCase());
  return special !== undefined ? special : NOT_A_NUMBER;
}
