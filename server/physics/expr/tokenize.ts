import { ExpressionError, showToken } from "./errors.ts";

export type TokenKind = "number" | "ident" | "op" | "lparen" | "rparen" | "comma";

export interface Token {
  readonly kind: TokenKind;
  readonly text: string;
  /** 0-based index of the first character in the source string. */
  readonly pos: number;
}

export const MAX_EXPRESSION_LENGTH = 2000;

const isDigit = (c: string | undefined): boolean => c !== undefined && c >= "0" && c <= "9";
const isLetter = (c: string | undefined): boolean =>
  c !== undefined && ((c >= "a" && c <= "z") || (c >= "A" && c <= "Z"));
const isIdentChar = (c: string | undefined): boolean => isLetter(c) || isDigit(c) || c === "_";
const isSpace = (c: string): boolean => c === " " || c === "\t" || c === "\n" || c === "\r";

/**
 * Splits ordinary infix math into tokens. Everything outside the small alphabet is rejected here,
 * before any parser or CAS sees it: there is no way to spell a string, a property access or an
 * assignment in this alphabet.
 */
export function tokenize(source: string, maxLength = MAX_EXPRESSION_LENGTH): Token[] {
  if (typeof source !== "string") {
    throw new ExpressionError("bad_input", "expression must be a string");
  }
  if (source.length > maxLength) {
    throw new ExpressionError(
      "too_long",
      `expression is ${source.length} characters long; the limit is ${maxLength}`,
      "",
      maxLength,
    );
  }
  const tokens: Token[] = [];
  let i = 0;
  while (i < source.length) {
    const c = source[i] as string;
    if (isSpace(c)) {
      i += 1;
      continue;
    }
    if (isDigit(c) || (c === "." && isDigit(source[i + 1]))) {
      i = readNumber(source, i, tokens);
      continue;
    }
    if (isLetter(c) || c === "_") {
      let j = i + 1;
      while (isIdentChar(source[j])) j += 1;
      tokens.push({ kind: "ident", text: source.slice(i, j), pos: i });
      i = j;
      continue;
    }
    if (c === "+" || c === "-" || c === "*" || c === "/" || c === "^") {
      tokens.push({ kind: "op", text: c, pos: i });
      i += 1;
      continue;
    }
    if (c === "(" || c === ")" || c === ",") {
      tokens.push({ kind: c === "(" ? "lparen" : c === ")" ? "rparen" : "comma", text: c, pos: i });
      i += 1;
      continue;
    }
    throw rejectCharacter(source, i);
  }
  return tokens;
}

function readNumber(source: string, start: number, tokens: Token[]): number {
  let j = start;
  while (isDigit(source[j])) j += 1;
  if (source[j] === ".") {
    j += 1;
    while (isDigit(source[j])) j += 1;
  }
  if (source[j] === "e" || source[j] === "E") {
    const sign = source[j + 1] === "+" || source[j + 1] === "-" ? 1 : 0;
    if (isDigit(source[j + 1 + sign])) {
      j += 1 + sign;
      while (isDigit(source[j])) j += 1;
    } else if (sign === 1) {
      throw new ExpressionError(
        "syntax",
        `malformed number "${source.slice(start, j + 2)}" at position ${start}: the exponent has no digits`,
        source.slice(start, j + 2),
        start,
      );
    }
  }
  tokens.push({ kind: "number", text: source.slice(start, j), pos: start });
  return j;
}

function rejectCharacter(source: string, i: number): ExpressionError {
  const c = source[i] as string;
  if (c === ":" && source[i + 1] === "=") {
    return new ExpressionError(
      "forbidden_syntax",
      `definitions ":=" are not allowed in an expression (position ${i}); declare named combinations as definitions instead`,
      ":=",
      i,
    );
  }
  if (c === "=") {
    return new ExpressionError(
      "forbidden_syntax",
      `"=" is not allowed at position ${i}: write the expression only, without an equation`,
      "=",
      i,
    );
  }
  if (c === ";") {
    return new ExpressionError(
      "forbidden_syntax",
      `";" is not allowed at position ${i}: one expression only`,
      ";",
      i,
    );
  }
  const cp = source.codePointAt(i) ?? 0;
  const ch = String.fromCodePoint(cp);
  const hex = `U+${cp.toString(16).toUpperCase().padStart(4, "0")}`;
  const shown = showToken(ch) === ch ? `"${ch}" (${hex})` : `${hex} (invisible or control character)`;
  return new ExpressionError(
    "bad_character",
    `character ${shown} at position ${i} is not allowed; use numbers, names, + - * / ^ ( ) and ","`,
    ch,
    i,
  );
}
